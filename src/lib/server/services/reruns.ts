import type { RerunValues } from '$lib/formats/bundle/ingest-plan';
import { HARTREE_EV } from '$lib/science/units';
import type { Executor } from '../db';
import { NotFoundError, ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';
import { moveToTrash } from './trash';

export interface RerunResult {
	id: string;
	epsilon: number;
	alpha: number;
	gammaBohrInv: number;
	homoHartree: number;
	lumoHartree: number | null;
	/** The method's own solid-state levels: IP_s = -eps_HOMO, EA_s = -eps_LUMO (eV). */
	ipEv: number;
	eaEv: number | null;
	source: 'typed' | 'engine-output';
	fileName: string | null;
	createdAt: Date;
}

export type RerunInput = RerunValues;

type Row = { id: string; epsilon: number; alpha: number; gamma_bohr_inv: number; homo_hartree: number; lumo_hartree: number | null; source: 'typed' | 'engine-output'; file_name: string | null; created_at: Date };

const toRerun = (r: Row): RerunResult => ({
	id: r.id,
	epsilon: r.epsilon,
	alpha: r.alpha,
	gammaBohrInv: r.gamma_bohr_inv,
	homoHartree: r.homo_hartree,
	lumoHartree: r.lumo_hartree,
	ipEv: -r.homo_hartree * HARTREE_EV,
	eaEv: r.lumo_hartree === null ? null : -r.lumo_hartree * HARTREE_EV,
	source: r.source,
	fileName: r.file_name,
	createdAt: r.created_at
});

export async function listReruns(db: Executor, workspaceId: string, polymorphId: string): Promise<RerunResult[]> {
	const rows = await db.selectFrom('rerun_result').selectAll().where('workspace_id', '=', workspaceId).where('polymorph_id', '=', polymorphId).orderBy('epsilon').orderBy('created_at').execute();
	return rows.map(toRerun);
}

function check(r: RerunInput) {
	if (!(r.epsilon >= 1)) throw new ValidationError(`epsilon must be >= 1, got ${r.epsilon}`, 'epsilon');
	if (!(r.alpha >= 0 && r.alpha <= 1)) throw new ValidationError(`alpha must be between 0 and 1, got ${r.alpha}`, 'alpha');
	if (!(r.gammaBohrInv > 0)) throw new ValidationError(`gamma must be > 0 bohr^-1, got ${r.gammaBohrInv}`, 'gammaBohrInv');
	if (!Number.isFinite(r.homoHartree) || r.homoHartree >= 0 || r.homoHartree < -5) throw new ValidationError(`eps_HOMO must be a negative energy in hartree (between -5 and 0), got ${r.homoHartree}: was it given in eV?`, 'homoHartree');
	if (r.lumoHartree !== null && (!Number.isFinite(r.lumoHartree) || r.lumoHartree <= r.homoHartree || r.lumoHartree > 2)) throw new ValidationError(`eps_LUMO must lie above eps_HOMO and below 2 hartree, got ${r.lumoHartree}`, 'lumoHartree');
}

export async function addReruns(db: Executor, actor: Actor, polymorphId: string, reruns: RerunInput[], source: 'typed' | 'engine-output', fileName: string | null = null): Promise<RerunResult[]> {
	reruns.forEach(check);
	return inTransaction(db, async (tx) => {
		const p = await tx.selectFrom('polymorph').select('label').where('workspace_id', '=', actor.workspaceId).where('id', '=', polymorphId).executeTakeFirst();
		if (!p) throw new NotFoundError('polymorph');
		const rows = await tx
			.insertInto('rerun_result')
			.values(reruns.map((r) => ({ workspace_id: actor.workspaceId, polymorph_id: polymorphId, epsilon: r.epsilon, alpha: r.alpha, gamma_bohr_inv: r.gammaBohrInv, homo_hartree: r.homoHartree, lumo_hartree: r.lumoHartree, source, file_name: fileName, created_by: actor.userId })))
			.returningAll()
			.execute();
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: polymorphId, action: 'update', summary: `added ${rows.length} screened rerun result(s) to ${p.label} (${source === 'typed' ? 'typed' : `from ${fileName ?? 'engine output'}`})` });
		return rows.map(toRerun);
	});
}

export async function deleteRerun(db: Executor, actor: Actor, polymorphId: string, id: string): Promise<void> {
	await inTransaction(db, async (tx) => {
		const r = await tx.selectFrom('rerun_result as r').innerJoin('polymorph as p', 'p.id', 'r.polymorph_id').select(['r.epsilon', 'r.gamma_bohr_inv', 'p.label']).where('r.workspace_id', '=', actor.workspaceId).where('r.polymorph_id', '=', polymorphId).where('r.id', '=', id).forUpdate().executeTakeFirst();
		if (!r) throw new NotFoundError('rerun result');
		const label = `screened rerun ε = ${r.epsilon}, γ = ${r.gamma_bohr_inv} bohr⁻¹ of ${r.label}`;
		await moveToTrash(tx, actor, { entity: 'rerun result', table: 'rerun_result', id, label, parentHref: `/w/${actor.workspaceId}/polymorphs/${polymorphId}/levels` });
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: polymorphId, action: 'update', summary: `removed a ${label} (to the trash)` });
	});
}
