import { BundleInputError, buildBundle, planBundle, sha256Hex, type BundleInput } from '$lib/formats/bundle';
import { DeckInputError } from '$lib/formats/decks';
import { parseXyz } from '$lib/formats/xyz';
import type { BundleRequest } from '$lib/schemas/bundle';
import pkg from '../../../../package.json' with { type: 'json' };
import type { Executor } from '../db';
import { NotFoundError, ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';

export interface BundleRecord {
	id: string;
	kind: string;
	fileName: string;
	sha256: string;
	sizeBytes: number;
	fileCount: number;
	createdAt: Date;
	createdBy: string | null;
	polymorphId: string | null;
	studyId: string | null;
	summary: string;
}

async function bundleInput(db: Executor, workspaceId: string, req: BundleRequest, createdAt: string): Promise<{ input: BundleInput; moleculeName: string; polymorphLabel: string | null }> {
	const m = await db.selectFrom('molecule').select(['name', 'geometry_xyz', 'net_charge', 'multiplicity']).where('workspace_id', '=', workspaceId).where('id', '=', req.moleculeId).executeTakeFirst();
	if (!m) throw new NotFoundError('molecule');
	let polymorphLabel: string | null = null;
	if (req.polymorphId) {
		const p = await db.selectFrom('polymorph').select('label').where('workspace_id', '=', workspaceId).where('id', '=', req.polymorphId).where('molecule_id', '=', req.moleculeId).executeTakeFirst();
		if (!p) throw new NotFoundError('polymorph');
		polymorphLabel = p.label;
	}
	// A study's decks use the geometry frozen with the study, not the molecule's current one.
	let geometry = m.geometry_xyz;
	if (req.studyId) {
		const st = await db.selectFrom('tuning_study').select('geometry_xyz').where('workspace_id', '=', workspaceId).where('id', '=', req.studyId).where('molecule_id', '=', req.moleculeId).executeTakeFirst();
		if (!st) throw new NotFoundError('tuning study');
		geometry = st.geometry_xyz;
	}
	const atoms = parseXyz(geometry).atoms.map((a) => ({ element: a.element, x: a.x, y: a.y, z: a.z }));
	return {
		moleculeName: m.name,
		polymorphLabel,
		input: {
			// Requests recorded before the engine choice have none: NWChem, as they were built.
			engine: req.engine ?? 'nwchem',
			molecule: { name: m.name, atoms, charge: m.net_charge, multiplicity: m.multiplicity },
			alpha: req.alpha,
			tuning: req.tuningGammas?.length ? { gammasBohrInv: req.tuningGammas, layout: req.tuningLayout } : null,
			screened: req.screened ? { gammaBohrInv: req.screened.gammaBohrInv, epsilons: req.screened.epsilons, epsilonSource: req.screened.epsilonSource ?? null } : null,
			settings: { basis: req.basis, memoryMb: req.memoryMb },
			scripts: { cores: req.cores },
			appVersion: pkg.version,
			createdAt,
			polymorph: polymorphLabel,
			study: req.studyId ?? null
		}
	};
}

const kindOf = (req: BundleRequest) => (req.tuningGammas?.length && req.screened ? 'tuning+screened' : req.screened ? 'screened' : 'tuning');

/** Builds the zip, records who made it from what, and returns the bytes. Deck-writer refusals become field errors. */
export async function createBundle(db: Executor, actor: Actor, req: BundleRequest): Promise<{ record: BundleRecord; bytes: Uint8Array }> {
	const createdAt = new Date().toISOString();
	const { input, moleculeName } = await bundleInput(db, actor.workspaceId, req, createdAt);
	let bytes: Uint8Array;
	let fileCount: number;
	try {
		const plan = await planBundle(input);
		fileCount = plan.files.length;
		bytes = await buildBundle(input);
	} catch (e) {
		if (e instanceof DeckInputError || e instanceof BundleInputError) throw new ValidationError(e.message, (e as { field?: string }).field);
		throw e;
	}
	const sha256 = await sha256Hex(bytes);
	const stamp = createdAt.slice(0, 16).replace(/[-:T]/g, '');
	const fileName = `kappaline-${moleculeName.replace(/[^\w-]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'molecule'}-${kindOf(req).replace('+', '-')}${req.engine === 'psi4' ? '-psi4' : ''}-${stamp}.zip`;
	const row = await inTransaction(db, async (tx) => {
		const r = await tx
			.insertInto('bundle')
			.values({
				workspace_id: actor.workspaceId,
				molecule_id: req.moleculeId,
				polymorph_id: req.polymorphId ?? null,
				study_id: req.studyId ?? null,
				kind: kindOf(req),
				request: JSON.stringify({ ...req, createdAt }),
				file_name: fileName,
				sha256,
				size_bytes: bytes.length,
				file_count: fileCount,
				created_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'molecule', entityId: req.moleculeId, action: 'update', summary: `made a rerun bundle (${kindOf(req)}${req.engine === 'psi4' ? ', Psi4' : ''}, ${fileCount} files) for ${moleculeName}` });
		return r;
	});
	return { record: toRecord(row, null), bytes };
}

function toRecord(r: { id: string; kind: string; file_name: string; sha256: string; size_bytes: number; file_count: number; created_at: Date; polymorph_id: string | null; study_id: string | null; request: unknown }, email: string | null): BundleRecord {
	const req = r.request as BundleRequest;
	const parts = [req.tuningGammas?.length ? `${req.tuningGammas.length} gamma values` : '', req.screened ? `ε ${req.screened.epsilons.join(', ')} at γ ${req.screened.gammaBohrInv}` : ''].filter(Boolean);
	return { id: r.id, kind: r.kind, fileName: r.file_name, sha256: r.sha256, sizeBytes: r.size_bytes, fileCount: r.file_count, createdAt: r.created_at, createdBy: email, polymorphId: r.polymorph_id, studyId: r.study_id, summary: `${req.engine === 'psi4' ? 'Psi4 · ' : ''}${parts.join('; ')} · α ${req.alpha} · ${req.basis}` };
}

export async function listBundles(db: Executor, workspaceId: string, filter: { moleculeId?: string; polymorphId?: string } = {}): Promise<BundleRecord[]> {
	const rows = await db
		.selectFrom('bundle as b')
		.leftJoin('User as u', 'u.id', 'b.created_by')
		.selectAll('b')
		.select('u.email')
		.where('b.workspace_id', '=', workspaceId)
		.$if(!!filter.moleculeId, (q) => q.where('b.molecule_id', '=', filter.moleculeId!))
		.$if(!!filter.polymorphId, (q) => q.where('b.polymorph_id', '=', filter.polymorphId!))
		.orderBy('b.created_at', 'desc')
		.limit(50)
		.execute();
	return rows.map((r) => toRecord(r, r.email));
}

/** Rebuilds a recorded bundle byte for byte; refuses if the rebuild differs from what was handed out. */
export async function downloadBundle(db: Executor, workspaceId: string, id: string): Promise<{ fileName: string; bytes: Uint8Array }> {
	const r = await db.selectFrom('bundle').selectAll().where('workspace_id', '=', workspaceId).where('id', '=', id).executeTakeFirst();
	if (!r) throw new NotFoundError('bundle');
	const { createdAt, ...req } = r.request as BundleRequest & { createdAt: string };
	const { input } = await bundleInput(db, workspaceId, req as BundleRequest, createdAt);
	const bytes = await buildBundle(input);
	if ((await sha256Hex(bytes)) !== r.sha256)
		throw new ValidationError('this bundle can no longer be rebuilt identically (the molecule’s geometry or the app changed since); make a new one');
	return { fileName: r.file_name, bytes };
}

/** The files a bundle would hold (path, purpose, size, SHA-256, text), for a preview before download. Stores nothing. */
export async function previewBundle(db: Executor, workspaceId: string, req: BundleRequest) {
	const { input } = await bundleInput(db, workspaceId, req, new Date().toISOString());
	try {
		const plan = await planBundle(input);
		return plan.files.map((f) => ({ path: f.path, role: f.role, purpose: f.purpose, bytes: f.bytes, sha256: f.sha256, text: f.text }));
	} catch (e) {
		if (e instanceof DeckInputError || e instanceof BundleInputError) throw new ValidationError(e.message, (e as { field?: string }).field);
		throw e;
	}
}
