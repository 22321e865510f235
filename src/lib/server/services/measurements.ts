import type { MeasurementInput } from '$lib/schemas/measurement';
import type { Executor } from '../db';
import { logActivity } from '../repo/activity';
import { NotFoundError } from '../errors';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';
import { moveToTrash } from './trash';

export interface Measurement {
	id: string;
	polymorphId: string;
	ipEv: number | null;
	eaEv: number | null;
	transportGapEv: number | null;
	opticalGapEv: number | null;
	/** Transport gap: typed, or IP - EA when both were measured. */
	transportGapDerivedEv: number | null;
	/** Exciton binding energy = transport gap - optical gap, when both exist. */
	excitonBindingEv: number | null;
	uncertaintyEv: number | null;
	method: string;
	sampleNotes: string;
	reference: string;
	createdAt: Date;
	createdBy: string | null;
}

type Row = { id: string; polymorph_id: string; ip_ev: number | null; ea_ev: number | null; transport_gap_ev: number | null; optical_gap_ev: number | null; uncertainty_ev: number | null; method: string; sample_notes: string; reference: string; created_at: Date; email?: string | null };

export function toMeasurement(r: Row): Measurement {
	const transport = r.transport_gap_ev ?? (r.ip_ev !== null && r.ea_ev !== null ? r.ip_ev - r.ea_ev : null);
	return {
		id: r.id,
		polymorphId: r.polymorph_id,
		ipEv: r.ip_ev,
		eaEv: r.ea_ev,
		transportGapEv: r.transport_gap_ev,
		opticalGapEv: r.optical_gap_ev,
		transportGapDerivedEv: transport,
		excitonBindingEv: transport !== null && r.optical_gap_ev !== null ? transport - r.optical_gap_ev : null,
		uncertaintyEv: r.uncertainty_ev,
		method: r.method,
		sampleNotes: r.sample_notes,
		reference: r.reference,
		createdAt: r.created_at,
		createdBy: r.email ?? null
	};
}

export async function listMeasurements(db: Executor, workspaceId: string, polymorphId: string): Promise<Measurement[]> {
	const rows = await db
		.selectFrom('measurement as m')
		.leftJoin('User as u', 'u.id', 'm.created_by')
		.selectAll('m')
		.select('u.email')
		.where('m.workspace_id', '=', workspaceId)
		.where('m.polymorph_id', '=', polymorphId)
		.orderBy('m.created_at')
		.execute();
	return rows.map(toMeasurement);
}

export async function addMeasurement(db: Executor, actor: Actor, polymorphId: string, input: MeasurementInput): Promise<Measurement> {
	return inTransaction(db, async (tx) => {
		const p = await tx.selectFrom('polymorph').select(['label']).where('workspace_id', '=', actor.workspaceId).where('id', '=', polymorphId).executeTakeFirst();
		if (!p) throw new NotFoundError('polymorph');
		const r = await tx
			.insertInto('measurement')
			.values({
				workspace_id: actor.workspaceId,
				polymorph_id: polymorphId,
				ip_ev: input.ipEv ?? null,
				ea_ev: input.eaEv ?? null,
				transport_gap_ev: input.transportGapEv ?? null,
				optical_gap_ev: input.opticalGapEv ?? null,
				uncertainty_ev: input.uncertaintyEv ?? null,
				method: input.method,
				sample_notes: input.sampleNotes,
				reference: input.reference,
				created_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: polymorphId, action: 'update', summary: `added a ${input.method} measurement to polymorph ${p.label}`, after: input });
		return toMeasurement(r);
	});
}

export async function deleteMeasurement(db: Executor, actor: Actor, polymorphId: string, id: string): Promise<void> {
	await inTransaction(db, async (tx) => {
		const r = await tx.selectFrom('measurement as m').innerJoin('polymorph as p', 'p.id', 'm.polymorph_id').select(['m.method', 'p.label']).where('m.workspace_id', '=', actor.workspaceId).where('m.polymorph_id', '=', polymorphId).where('m.id', '=', id).forUpdate().executeTakeFirst();
		if (!r) throw new NotFoundError('measurement');
		await moveToTrash(tx, actor, { entity: 'measurement', table: 'measurement', id, label: `${r.method} measurement of ${r.label}`, parentHref: `/w/${actor.workspaceId}/polymorphs/${polymorphId}/levels` });
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: polymorphId, action: 'update', summary: `removed a ${r.method} measurement of ${r.label} (to the trash)` });
	});
}
