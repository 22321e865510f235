import { createHash } from 'node:crypto';
import { sql } from 'kysely';
import { ArchiveError, ingestOutputs, ManifestError, type IngestedFile, type IngestFileInput, type IngestProblem, type IngestResult } from '$lib/formats/bundle';
import { ENERGY_TOLERANCE_HARTREE, planReruns, planScanPoints, type PlannedRerun, type PlannedScanPoint } from '$lib/formats/bundle/ingest-plan';
import type { BundleStateLabel } from '$lib/formats/bundle/manifest';
import { parseFormula } from '$lib/science/elements';
import { MAX_UPLOAD_BYTES } from '$lib/upload-limits';
import type { Executor } from '../db';
import { inTransaction } from '../db/transaction';
import { NotFoundError, UploadStateError, ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import type { Actor } from './actor';
import { addReruns, listReruns } from './reruns';
import { ENERGY_COLUMNS, importPoints, listPoints } from './tuning';

/**
 * Engine outputs in two steps: an upload is read and kept as a pending upload with its preview (which
 * scan points or rerun results each file fills, what is missing, what failed, what conflicts with stored
 * values); nothing reaches the study or polymorph until the user confirms, and then everything in one
 * transaction. A pending upload expires after {@link UPLOAD_TTL_MINUTES} minutes and is confirmed once.
 */
export type UploadTargetKind = 'study' | 'polymorph';
export interface UploadTarget {
	kind: UploadTargetKind;
	id: string;
}

export const UPLOAD_TTL_MINUTES = 60;
/** Expired, confirmed and discarded uploads are deleted this long after they stop being usable. */
const CLEANUP_AFTER_HOURS = 24;

export interface UploadedFile {
	name: string;
	bytes: Uint8Array;
}

/** What one uploaded output fills. */
export interface OutputFileFill {
	file: string;
	deck: string | null;
	kind: 'tuning' | 'screened' | null;
	/** Scan points (gamma, state) or rerun results (epsilon) this file's values go to. */
	fills: ({ gammaBohrInv: number; state: BundleStateLabel } | { epsilon: number })[];
}

export interface UploadPreview {
	id: string;
	target: UploadTarget;
	files: { name: string; sizeBytes: number; sha256: string }[];
	sizeBytes: number;
	sha256: string;
	createdAt: Date;
	expiresAt: Date;
	confirmedAt: Date | null;
	/** Energies closer than this (hartree) count as the stored value. */
	toleranceHartree: number;
	outputs: OutputFileFill[];
	/** Study uploads: one entry per gamma. */
	scanPoints: PlannedScanPoint[];
	/** Polymorph uploads: one entry per epsilon. */
	reruns: PlannedRerun[];
	/** Decks of the bundle without an output. */
	missing: IngestProblem[];
	/** Failed, unconverged or unreadable outputs (their values are not used), with the engine's reason. */
	failed: IngestProblem[];
	warnings: IngestProblem[];
	summary: { new: number; fills: number; alreadyStored: number; conflicts: number; toStore: number };
}

/** What is kept with a pending upload: the parsed records, planned again against the stored values on confirm. */
interface StoredPlan {
	tuning: IngestResult['tuning'];
	screened: IngestResult['screened'];
	files: IngestedFile[];
	problems: IngestProblem[];
	/** Status per gamma or epsilon at preview time, to tell the user what changed since. */
	previewed: Record<string, string>;
}

/** Reads uploaded engine outputs (zips, single outputs, a folder's files); archive and manifest refusals become field errors. */
export async function readOutputs(files: readonly UploadedFile[]): Promise<IngestResult> {
	try {
		return await ingestOutputs(files.map((f): IngestFileInput => ({ name: f.name, bytes: f.bytes })));
	} catch (e) {
		if (e instanceof ArchiveError || e instanceof ManifestError) throw new ValidationError(e.message, 'file');
		throw e;
	}
}

const sha256 = (b: Uint8Array | string) => createHash('sha256').update(b).digest('hex');
const key = (x: number) => x.toFixed(6);

/** The target's molecule formula and, for a study, its alpha; 404 when it is not in the workspace. */
async function targetRow(db: Executor, workspaceId: string, target: UploadTarget, lock: boolean): Promise<{ formula: string; alpha: number | null }> {
	const row =
		target.kind === 'study'
			? await db
					.selectFrom('tuning_study as t')
					.innerJoin('molecule as m', 'm.id', 't.molecule_id')
					.select(['m.formula', 't.alpha'])
					.where('t.workspace_id', '=', workspaceId)
					.where('t.id', '=', target.id)
					.$if(lock, (q) => q.forUpdate('t'))
					.executeTakeFirst()
			: await db
					.selectFrom('polymorph as p')
					.innerJoin('molecule as m', 'm.id', 'p.molecule_id')
					.select(['m.formula', sql<null>`null`.as('alpha')])
					.where('p.workspace_id', '=', workspaceId)
					.where('p.id', '=', target.id)
					.$if(lock, (q) => q.forUpdate('p'))
					.executeTakeFirst();
	if (!row) throw new NotFoundError(target.kind === 'study' ? 'tuning study' : 'polymorph');
	return row;
}

/** Same element counts (SO2 and O2S are the same); unreadable formulas are not compared. */
function sameFormula(a: string, b: string): boolean {
	try {
		const [x, y] = [parseFormula(a), parseFormula(b)];
		return Object.keys(x).length === Object.keys(y).length && Object.entries(x).every(([el, n]) => y[el] === n);
	} catch {
		return true;
	}
}

/** A bundle made for another molecule, or a scan at another alpha than the study's, is refused with both values named. */
function checkManifest(read: IngestResult, target: UploadTarget, t: { formula: string; alpha: number | null }): void {
	const m = read.manifest;
	if (!m) return;
	if (t.formula && m.molecule.formula && !sameFormula(m.molecule.formula, t.formula)) {
		throw new ValidationError(`the bundle's manifest is for ${m.molecule.name} (${m.molecule.formula}), but this ${target.kind === 'study' ? 'study' : 'polymorph'} belongs to a molecule with formula ${t.formula}; nothing was read`, 'outputs');
	}
	if (target.kind === 'study' && t.alpha !== null && m.tuning && Math.abs(m.tuning.alpha - t.alpha) > 1e-9) {
		throw new ValidationError(`the bundle's scan decks use alpha ${m.tuning.alpha}, but this study uses alpha ${t.alpha}; upload them into a study with alpha ${m.tuning.alpha}`, 'outputs');
	}
}

/** Plans the parsed records against what the target holds now. */
async function plan(db: Executor, workspaceId: string, target: UploadTarget, p: StoredPlan) {
	if (target.kind === 'study') {
		const stored = await listPoints(db, target.id);
		return { scanPoints: planScanPoints(p.tuning, stored), reruns: [] as PlannedRerun[] };
	}
	const stored = await listReruns(db, workspaceId, target.id);
	return { scanPoints: [] as PlannedScanPoint[], reruns: planReruns(p.screened, stored) };
}

function describe(row: { id: string; target_kind: UploadTargetKind; target_id: string; files: UploadPreview['files']; size_bytes: string | number; sha256: string; created_at: Date; expires_at: Date; confirmed_at: Date | null }, p: StoredPlan, planned: { scanPoints: PlannedScanPoint[]; reruns: PlannedRerun[] }): UploadPreview {
	const outputs: OutputFileFill[] = p.files.map((f) => ({
		file: f.file,
		deck: f.deck,
		kind: f.kind,
		fills: [
			...planned.scanPoints.flatMap((s) => (Object.entries(s.sources) as [BundleStateLabel, string][]).filter(([, file]) => file === f.file).map(([state]) => ({ gammaBohrInv: s.point.gammaBohrInv, state }))),
			...planned.reruns.filter((r) => r.file === f.file).map((r) => ({ epsilon: r.epsilon }))
		]
	}));
	const statuses = [...planned.scanPoints.map((s) => s.status), ...planned.reruns.map((r) => r.status)];
	const count = (s: string) => statuses.filter((x) => x === s).length;
	return {
		id: row.id,
		target: { kind: row.target_kind, id: row.target_id },
		files: row.files,
		sizeBytes: Number(row.size_bytes),
		sha256: row.sha256,
		createdAt: row.created_at,
		expiresAt: row.expires_at,
		confirmedAt: row.confirmed_at,
		toleranceHartree: ENERGY_TOLERANCE_HARTREE,
		outputs,
		scanPoints: planned.scanPoints,
		reruns: planned.reruns,
		missing: p.problems.filter((x) => x.code === 'missing-output'),
		failed: p.problems.filter((x) => x.severity === 'error'),
		warnings: p.problems.filter((x) => x.severity === 'warning' && x.code !== 'missing-output'),
		summary: { new: count('new'), fills: count('fills'), alreadyStored: count('already-stored'), conflicts: count('conflict'), toStore: count('new') + count('fills') }
	};
}

/** Removes uploads that stopped being usable more than a day ago (expired, confirmed or discarded). */
export async function cleanUpUploads(db: Executor): Promise<number> {
	const cutoff = sql<Date>`now() - ${`${CLEANUP_AFTER_HOURS} hours`}::interval`;
	const r = await db
		.deleteFrom('output_upload')
		.where((eb) => eb.or([eb('expires_at', '<', cutoff), eb('confirmed_at', '<', cutoff), eb('discarded_at', '<', cutoff)]))
		.executeTakeFirst();
	return Number(r.numDeletedRows);
}

/**
 * Reads uploaded outputs and keeps them as a pending upload of the study (scan points) or polymorph
 * (screened rerun results); returns the preview. Stores nothing in the target.
 */
export async function previewUpload(db: Executor, actor: Actor, target: UploadTarget, files: readonly UploadedFile[]): Promise<UploadPreview> {
	if (files.length === 0 || files.every((f) => f.bytes.length === 0)) throw new ValidationError('choose NWChem outputs (.out) or the bundle zip with the outputs beside the decks', 'outputs');
	const sizeBytes = files.reduce((s, f) => s + f.bytes.length, 0);
	if (sizeBytes > MAX_UPLOAD_BYTES) throw new ValidationError(`the upload is ${(sizeBytes / 1e6).toFixed(1)} MB, over the limit of ${MAX_UPLOAD_BYTES / 1e6} MB`, 'outputs');
	const t = await targetRow(db, actor.workspaceId, target, false);
	const read = await readOutputs(files);
	checkManifest(read, target, t);
	const label = files.length === 1 ? files[0].name : `${files.length} files`;
	const useful = target.kind === 'study' ? read.tuning.length : read.screened.length;
	if (!useful) {
		const why = read.problems.filter((p) => p.code !== 'missing-output').map((p) => `${p.file}: ${p.message}`).slice(0, 5).join('; ');
		const other = target.kind === 'study' && read.screened.length ? ' (it holds screened rerun results: upload those on the levels page of a polymorph)' : target.kind === 'polymorph' && read.tuning.length ? ' (it holds tuning-scan results: upload those on the tuning study page)' : '';
		throw new ValidationError(`no ${target.kind === 'study' ? 'tuning-scan' : 'screened rerun'} result found in ${label}${other}${why ? `: ${why}` : ''}`, 'outputs');
	}
	const stored: StoredPlan = {
		tuning: target.kind === 'study' ? read.tuning : [],
		screened: target.kind === 'polymorph' ? read.screened : [],
		files: read.files,
		problems: read.problems,
		previewed: {}
	};
	const planned = await plan(db, actor.workspaceId, target, stored);
	for (const s of planned.scanPoints) stored.previewed[key(s.point.gammaBohrInv)] = s.status;
	for (const r of planned.reruns) stored.previewed[key(r.epsilon)] = r.status;
	const fileList = files.map((f) => ({ name: f.name, sizeBytes: f.bytes.length, sha256: sha256(f.bytes) }));
	await cleanUpUploads(db);
	const row = await db
		.insertInto('output_upload')
		.values({
			workspace_id: actor.workspaceId,
			target_kind: target.kind,
			target_id: target.id,
			created_by: actor.userId,
			files: JSON.stringify(fileList),
			size_bytes: sizeBytes,
			sha256: fileList.length === 1 ? fileList[0].sha256 : sha256(fileList.map((f) => `${f.sha256}  ${f.name}\n`).join('')),
			plan: JSON.stringify(stored),
			expires_at: sql<Date>`now() + ${`${UPLOAD_TTL_MINUTES} minutes`}::interval`
		})
		.returningAll()
		.executeTakeFirstOrThrow();
	return describe(row, stored, planned);
}

async function findUpload(db: Executor, actor: Actor, target: UploadTarget, uploadId: string, lock: boolean) {
	const row = await db
		.selectFrom('output_upload')
		.selectAll()
		.select(sql<boolean>`expires_at < now()`.as('expired'))
		.where('workspace_id', '=', actor.workspaceId)
		.where('target_kind', '=', target.kind)
		.where('target_id', '=', target.id)
		.where('id', '=', uploadId)
		.$if(lock, (q) => q.forUpdate())
		.executeTakeFirst();
	if (!row) throw new NotFoundError(`pending upload (uploads are kept for ${UPLOAD_TTL_MINUTES} minutes, then removed)`);
	return row;
}

const when = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

function usable(row: { confirmed_at: Date | null; discarded_at: Date | null; expired: boolean; expires_at: Date }): void {
	if (row.confirmed_at) throw new UploadStateError(`this upload was already confirmed at ${when(row.confirmed_at)}; its values are stored, nothing was stored twice`, 409);
	if (row.discarded_at) throw new UploadStateError(`this upload was discarded at ${when(row.discarded_at)}; upload the outputs again to store them`, 409);
	if (row.expired) throw new UploadStateError(`this upload expired at ${when(row.expires_at)} (pending uploads are kept for ${UPLOAD_TTL_MINUTES} minutes); nothing was stored: upload the outputs again`, 410);
}

/** The preview of a pending upload, planned against the values stored now. */
export async function getUpload(db: Executor, actor: Actor, target: UploadTarget, uploadId: string): Promise<UploadPreview> {
	const row = await findUpload(db, actor, target, uploadId, false);
	usable(row);
	const p = row.plan as StoredPlan;
	return describe(row, p, await plan(db, actor.workspaceId, target, p));
}

/** The caller's newest usable pending upload for a study or polymorph, or null (the page shows it again after a reload). */
export async function latestPendingUpload(db: Executor, actor: Actor, target: UploadTarget): Promise<UploadPreview | null> {
	const row = await db
		.selectFrom('output_upload')
		.select('id')
		.where('workspace_id', '=', actor.workspaceId)
		.where('target_kind', '=', target.kind)
		.where('target_id', '=', target.id)
		.where('created_by', '=', actor.userId)
		.where('confirmed_at', 'is', null)
		.where('discarded_at', 'is', null)
		.where('expires_at', '>', sql<Date>`now()`)
		.orderBy('created_at', 'desc')
		.executeTakeFirst();
	return row ? getUpload(db, actor, target, row.id) : null;
}

export interface ConfirmResult {
	upload: UploadPreview;
	inserted: number;
	filled: number;
	skipped: number;
}

/**
 * Stores a pending upload in one transaction: new scan points (or rerun results) inserted, empty
 * states of stored points filled; values already stored are skipped. Conflicts are planned again
 * against the values stored now: a gamma or epsilon that conflicts now but did not in the preview
 * refuses the whole confirmation (nothing stored). Confirms once.
 */
export async function confirmUpload(db: Executor, actor: Actor, target: UploadTarget, uploadId: string): Promise<ConfirmResult> {
	return inTransaction(db, async (tx) => {
		const row = await findUpload(tx, actor, target, uploadId, true);
		usable(row);
		await targetRow(tx, actor.workspaceId, target, true);
		const p = row.plan as StoredPlan;
		const planned = await plan(tx, actor.workspaceId, target, p);
		const changed = [
			...planned.scanPoints.filter((s) => s.status === 'conflict' && p.previewed[key(s.point.gammaBohrInv)] !== 'conflict').map((s) => `gamma ${s.point.gammaBohrInv} bohr^-1`),
			...planned.reruns.filter((r) => r.status === 'conflict' && p.previewed[key(r.epsilon)] !== 'conflict').map((r) => `epsilon ${r.epsilon}`)
		];
		if (changed.length) {
			throw new UploadStateError(`since the preview, values were stored that conflict with this upload at ${changed.join(', ')}; nothing was stored: discard this upload and upload it again to see the new preview`, 409);
		}
		const files = row.files.map((f) => f.name).join(', ');
		let inserted = 0;
		let filled = 0;
		if (target.kind === 'study') {
			for (const s of planned.scanPoints.filter((x) => x.status === 'fills')) {
				const set = Object.fromEntries(s.fills.map((f) => [ENERGY_COLUMNS[f], s.point[f] ?? null]));
				await tx
					.updateTable('scan_point')
					.set({ ...set, version: sql`version + 1`, updated_at: new Date() })
					.where('id', '=', s.storedPointId as string)
					.execute();
				filled++;
			}
			const news = planned.scanPoints.filter((x) => x.status === 'new').map((x) => ({ ...x.point, excluded: false }));
			if (news.length) inserted = (await importPoints(tx, actor, target.id, news, { source: `engine outputs (${files})` })).inserted;
			else if (filled) await tx.updateTable('tuning_study').set({ version: sql`version + 1`, updated_at: new Date(), updated_by: actor.userId }).where('id', '=', target.id).execute();
		} else {
			const news = planned.reruns.filter((x) => x.status === 'new');
			if (news.length) {
				const name = row.files.length === 1 ? row.files[0].name : files.slice(0, 200);
				inserted = (await addReruns(tx, actor, target.id, news.map((r) => ({ epsilon: r.epsilon, alpha: r.alpha, gammaBohrInv: r.gammaBohrInv, homoHartree: r.homoHartree, lumoHartree: r.lumoHartree })), 'engine-output', name)).length;
			}
		}
		const skipped = [...planned.scanPoints, ...planned.reruns].length - inserted - filled;
		if (inserted + filled === 0) {
			throw new ValidationError('this upload has nothing new to store: every value is already stored or conflicts with a stored one; discard it', 'upload');
		}
		const done = await tx.updateTable('output_upload').set({ confirmed_at: sql`now()` }).where('id', '=', row.id).returningAll().executeTakeFirstOrThrow();
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: target.kind === 'study' ? 'tuning_study' : 'polymorph',
			entityId: target.id,
			action: 'import',
			summary: `confirmed the upload of ${files}: ${inserted} added, ${filled} completed, ${skipped} skipped (already stored or conflicting)`,
			after: { upload: row.id, sha256: row.sha256, inserted, filled, skipped }
		});
		return { upload: describe(done, p, planned), inserted, filled, skipped };
	});
}

/** Discards a pending upload: its parsed values are dropped and it can no longer be confirmed. Repeating it is harmless. */
export async function discardUpload(db: Executor, actor: Actor, target: UploadTarget, uploadId: string): Promise<void> {
	await inTransaction(db, async (tx) => {
		const row = await findUpload(tx, actor, target, uploadId, true);
		if (row.discarded_at) return;
		if (row.confirmed_at) throw new UploadStateError(`this upload was confirmed at ${when(row.confirmed_at)}; its values are stored and can be excluded or deleted where they are shown`, 409);
		const empty: StoredPlan = { tuning: [], screened: [], files: [], problems: [], previewed: {} };
		await tx.updateTable('output_upload').set({ discarded_at: sql`now()`, plan: JSON.stringify(empty) }).where('id', '=', row.id).execute();
	});
}
