import { createHash } from 'node:crypto';
import { sql } from 'kysely';
import { tuningAnalysis, type TuningAnalysis } from '$lib/science/tuning/tuning-analysis';
import { TuningInputError } from '$lib/science/tuning/tuning-input-error';
import { validatedScanPoints } from '$lib/science/tuning/validated-scan-points';
import { SCAN_ENERGY_FIELDS, type ScanPoint, type TuningObjective } from '$lib/science/tuning/types';
import type { PointPatch, ScanPointInput, StudyInput, StudyPatch } from '$lib/schemas/tuning';
import type { Executor } from '../db';
import type { ScanPointRow, TuningStudyRow } from '../db/schema-tuning';
import { logActivity } from '../repo/activity';
import { NotFoundError, StaleVersionError, ValidationError } from '../errors';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';
import { moveToTrash } from './trash';

/** A stored analysis: exactly what tuningAnalysis returned when the result was saved. */
export type StoredTuningResult = TuningAnalysis;

export interface TuningStudy {
	id: string;
	workspaceId: string;
	moleculeId: string;
	moleculeName: string;
	name: string;
	engine: string;
	engineVersion: string;
	semilocalBase: string;
	basisSet: string;
	alpha: number;
	geometryXyz: string;
	objective: TuningObjective;
	notes: string;
	isCurrent: boolean;
	result: StoredTuningResult | null;
	resultAnalysisVersion: string | null;
	resultInputHash: string | null;
	resultSavedAt: Date | null;
	version: number;
	createdAt: Date;
	updatedAt: Date;
}

export interface StoredScanPoint extends ScanPoint {
	id: string;
	excluded: boolean;
	excludedReason: string;
	version: number;
}

/** Summary of a study for lists and the molecule page: the stored optimum, in eV and bohr^-1. */
export interface TuningStudySummary {
	id: string;
	name: string;
	alpha: number;
	basisSet: string;
	engine: string;
	objective: TuningObjective;
	isCurrent: boolean;
	pointCount: number;
	gammaStarBohrInv: number | null;
	ipEv: number | null;
	eaEv: number | null;
	gapEv: number | null;
	resultSavedAt: Date | null;
	version: number;
}

/** Scan-point energy fields and their columns. */
export const ENERGY_COLUMNS = {
	eNeutralHartree: 'e_neutral_ha',
	eCationHartree: 'e_cation_ha',
	eAnionHartree: 'e_anion_ha',
	homoNeutralHartree: 'homo_neutral_ha',
	lumoNeutralHartree: 'lumo_neutral_ha',
	homoAnionHartree: 'homo_anion_ha'
} as const;

export function toStudy(r: TuningStudyRow, moleculeName: string): TuningStudy {
	return {
		id: r.id,
		workspaceId: r.workspace_id,
		moleculeId: r.molecule_id,
		moleculeName,
		name: r.name,
		engine: r.engine,
		engineVersion: r.engine_version,
		semilocalBase: r.semilocal_base,
		basisSet: r.basis_set,
		alpha: r.alpha,
		geometryXyz: r.geometry_xyz,
		objective: r.objective as TuningObjective,
		notes: r.notes,
		isCurrent: r.is_current,
		result: (r.result as StoredTuningResult | null) ?? null,
		resultAnalysisVersion: r.result_analysis_version,
		resultInputHash: r.result_input_hash,
		resultSavedAt: r.result_saved_at,
		version: r.version,
		createdAt: r.created_at,
		updatedAt: r.updated_at
	};
}

export function toPoint(r: ScanPointRow): StoredScanPoint {
	return {
		id: r.id,
		gammaBohrInv: r.gamma_bohr_inv,
		eNeutralHartree: r.e_neutral_ha,
		eCationHartree: r.e_cation_ha,
		eAnionHartree: r.e_anion_ha,
		homoNeutralHartree: r.homo_neutral_ha,
		lumoNeutralHartree: r.lumo_neutral_ha,
		homoAnionHartree: r.homo_anion_ha,
		excluded: r.excluded,
		excludedReason: r.excluded_reason,
		version: r.version
	};
}

/** The points as the analysis sees them (no ids), in stored order. */
export const analysisPoints = (points: readonly StoredScanPoint[]): ScanPoint[] =>
	points.map((p) => ({
		gammaBohrInv: p.gammaBohrInv,
		...Object.fromEntries(SCAN_ENERGY_FIELDS.map((f) => [f, p[f] ?? null])),
		...(p.excluded ? { excluded: true } : {})
	}));

function studySnapshot(s: TuningStudy) {
	return { name: s.name, engine: s.engine, engineVersion: s.engineVersion, semilocalBase: s.semilocalBase, basisSet: s.basisSet, alpha: s.alpha, objective: s.objective, notes: s.notes };
}
function pointSnapshot(p: StoredScanPoint) {
	return { gammaBohrInv: p.gammaBohrInv, ...Object.fromEntries(SCAN_ENERGY_FIELDS.map((f) => [f, p[f] ?? null])), excluded: p.excluded, excludedReason: p.excludedReason };
}

async function studyRow(db: Executor, workspaceId: string, id: string, lock = false) {
	const r = await db
		.selectFrom('tuning_study as s')
		.innerJoin('molecule as m', 'm.id', 's.molecule_id')
		.selectAll('s')
		.select('m.name as molecule_name')
		.where('s.workspace_id', '=', workspaceId)
		.where('s.id', '=', id)
		.$if(lock, (q) => q.forUpdate('s'))
		.executeTakeFirst();
	if (!r) throw new NotFoundError('tuning study');
	return r;
}

export async function listPoints(db: Executor, studyId: string): Promise<StoredScanPoint[]> {
	const rows = await db.selectFrom('scan_point').selectAll().where('study_id', '=', studyId).orderBy('gamma_bohr_inv').orderBy('created_at').orderBy('id').execute();
	return rows.map(toPoint);
}

export async function getStudy(db: Executor, workspaceId: string, id: string): Promise<TuningStudy & { points: StoredScanPoint[] }> {
	const r = await studyRow(db, workspaceId, id);
	return { ...toStudy(r, r.molecule_name), points: await listPoints(db, id) };
}

export async function listStudies(db: Executor, workspaceId: string, opts: { moleculeId?: string; limit?: number; after?: { name: string; id: string } } = {}): Promise<TuningStudySummary[]> {
	const rows = await db
		.selectFrom('tuning_study as s')
		.select([
			's.id',
			's.name',
			's.alpha',
			's.basis_set',
			's.engine',
			's.objective',
			's.is_current',
			's.result_saved_at',
			's.version',
			sql<number | null>`(s.result->'result'->'optimum'->>'gammaBohrInv')::float8`.as('gamma_star'),
			sql<number | null>`(s.result->'result'->'optimum'->>'ipEv')::float8`.as('ip_ev'),
			sql<number | null>`(s.result->'result'->'optimum'->>'eaEv')::float8`.as('ea_ev'),
			sql<number | null>`(s.result->'result'->'optimum'->>'gapEv')::float8`.as('gap_ev'),
			(eb) => eb.selectFrom('scan_point').select((e2) => e2.fn.countAll<number>().as('c')).whereRef('scan_point.study_id', '=', 's.id').as('point_count')
		])
		.where('s.workspace_id', '=', workspaceId)
		.$if(!!opts.moleculeId, (q) => q.where('s.molecule_id', '=', opts.moleculeId!))
		.$if(!!opts.after, (q) => q.where((eb) => eb.or([eb('s.name', '>', opts.after!.name), eb.and([eb('s.name', '=', opts.after!.name), eb('s.id', '>', opts.after!.id)])])))
		.orderBy('s.name')
		.orderBy('s.id')
		.limit(opts.limit ?? 100)
		.execute();
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		alpha: r.alpha,
		basisSet: r.basis_set,
		engine: r.engine,
		objective: r.objective as TuningObjective,
		isCurrent: r.is_current,
		pointCount: Number(r.point_count ?? 0),
		gammaStarBohrInv: r.gamma_star,
		ipEv: r.ip_ev,
		eaEv: r.ea_ev,
		gapEv: r.gap_ev,
		resultSavedAt: r.result_saved_at,
		version: r.version
	}));
}

export async function createStudy(db: Executor, actor: Actor, moleculeId: string, input: StudyInput): Promise<TuningStudy> {
	return inTransaction(db, async (tx) => {
		const m = await tx.selectFrom('molecule').select(['name', 'geometry_xyz']).where('workspace_id', '=', actor.workspaceId).where('id', '=', moleculeId).executeTakeFirst();
		if (!m) throw new NotFoundError('molecule');
		const r = await tx
			.insertInto('tuning_study')
			.values({
				workspace_id: actor.workspaceId,
				molecule_id: moleculeId,
				name: input.name,
				engine: input.engine,
				engine_version: input.engineVersion,
				semilocal_base: input.semilocalBase,
				basis_set: input.basisSet,
				alpha: input.alpha,
				geometry_xyz: m.geometry_xyz, // frozen copy: later edits of the molecule do not change the study
				objective: input.objective,
				notes: input.notes,
				created_by: actor.userId,
				updated_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		const s = toStudy(r, m.name);
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'tuning_study', entityId: s.id, action: 'create', summary: `added tuning study ${s.name} for ${m.name}`, after: studySnapshot(s) });
		return s;
	});
}

export async function updateStudy(db: Executor, actor: Actor, id: string, expectedVersion: number, patch: StudyPatch): Promise<TuningStudy> {
	return inTransaction(db, async (tx) => {
		const current = await studyRow(tx, actor.workspaceId, id, true);
		if (current.version !== expectedVersion) throw new StaleVersionError('tuning study');
		const before = toStudy(current, current.molecule_name);
		const next = { ...studySnapshot(before), ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) } as ReturnType<typeof studySnapshot>;
		const r = await tx
			.updateTable('tuning_study')
			.set({
				name: next.name,
				engine: next.engine,
				engine_version: next.engineVersion,
				semilocal_base: next.semilocalBase,
				basis_set: next.basisSet,
				alpha: next.alpha,
				objective: next.objective,
				notes: next.notes,
				version: current.version + 1,
				updated_at: new Date(),
				updated_by: actor.userId
			})
			.where('id', '=', id)
			.returningAll()
			.executeTakeFirstOrThrow();
		const after = toStudy(r, current.molecule_name);
		const b = studySnapshot(before);
		const a = studySnapshot(after);
		const changed = (Object.keys(a) as (keyof typeof a)[]).filter((k) => a[k] !== b[k]);
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'tuning_study', entityId: id, action: 'update', summary: `edited tuning study ${after.name}${changed.length ? ` (${changed.join(', ')})` : ''}`, before: b, after: a });
		return after;
	});
}

export async function deleteStudy(db: Executor, actor: Actor, id: string, expectedVersion?: number): Promise<void> {
	await inTransaction(db, async (tx) => {
		const current = await studyRow(tx, actor.workspaceId, id, true);
		if (expectedVersion !== undefined && current.version !== expectedVersion) throw new StaleVersionError('tuning study');
		const { contents } = await moveToTrash(tx, actor, { entity: 'tuning study', table: 'tuning_study', id, label: `${current.name} (${current.molecule_name})`, parentHref: `/w/${actor.workspaceId}/molecules/${current.molecule_id}` });
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'tuning_study', entityId: id, action: 'delete', summary: `deleted tuning study ${current.name} of ${current.molecule_name} to the trash with ${contents}`, before: studySnapshot(toStudy(current, current.molecule_name)) });
	});
}

/** Makes this study the molecule's current tuned parameters (and no other). Needs a saved result with an optimum. */
export async function markCurrent(db: Executor, actor: Actor, id: string, expectedVersion: number): Promise<TuningStudy> {
	return inTransaction(db, async (tx) => {
		const current = await studyRow(tx, actor.workspaceId, id, true);
		if (current.version !== expectedVersion) throw new StaleVersionError('tuning study');
		const s = toStudy(current, current.molecule_name);
		if (!s.result?.result.optimum)
			throw new ValidationError('save an analysis with an optimum (gamma*) before marking this study current', 'result');
		const previous = await tx
			.updateTable('tuning_study')
			.set({ is_current: false, version: sql`version + 1`, updated_at: new Date(), updated_by: actor.userId })
			.where('molecule_id', '=', current.molecule_id)
			.where('is_current', '=', true)
			.where('id', '!=', id)
			.returning(['id', 'name'])
			.execute();
		const r = await tx
			.updateTable('tuning_study')
			.set({ is_current: true, version: current.version + 1, updated_at: new Date(), updated_by: actor.userId })
			.where('id', '=', id)
			.returningAll()
			.executeTakeFirstOrThrow();
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'tuning_study',
			entityId: id,
			action: 'mark-current',
			summary: `made tuning study ${s.name} the current tuned parameters of ${current.molecule_name}${previous.length ? ` (instead of ${previous.map((p) => p.name).join(', ')})` : ''}`,
			before: { isCurrent: current.is_current },
			after: { isCurrent: true }
		});
		return toStudy(r, current.molecule_name);
	});
}

/** Checks imported points as a whole; every problem names the row (1-based) and the field. */
function checkImport(points: readonly ScanPointInput[], existing: readonly StoredScanPoint[]): void {
	const asScan = points.map((p) => {
		const { excludedReason: _r, ...rest } = p;
		return rest;
	});
	try {
		validatedScanPoints(asScan);
	} catch (e) {
		if (e instanceof TuningInputError) throw new ValidationError(e.row !== undefined ? `point ${e.row + 1}, ${e.field}: ${e.message}` : e.message, e.field);
		throw e;
	}
	const tol = 1e-6;
	points.forEach((p, i) => {
		const j = points.findIndex((q, k) => k < i && Math.abs(q.gammaBohrInv - p.gammaBohrInv) <= tol);
		if (j >= 0) throw new ValidationError(`point ${i + 1}, gammaBohrInv: gamma ${p.gammaBohrInv} bohr^-1 duplicates point ${j + 1}`, 'gammaBohrInv');
		const old = existing.find((q) => !q.excluded && Math.abs(q.gammaBohrInv - p.gammaBohrInv) <= tol);
		if (old) throw new ValidationError(`point ${i + 1}, gammaBohrInv: the study already has a point at gamma ${old.gammaBohrInv} bohr^-1 (exclude or edit it instead)`, 'gammaBohrInv');
	});
}

export interface ImportResult {
	study: { id: string; version: number };
	inserted: number;
	pointIds: string[];
	/** True when this answer was replayed for a repeated Idempotency-Key (nothing was inserted again). */
	replayed: boolean;
}

/**
 * Adds points to a study in one transaction: all of them or none. With an idempotency key, a repeated
 * request with the same key and body returns the first answer without inserting again; the same key with
 * a different body is refused. `expectedVersion`, when given, must match the study's version.
 */
export async function importPoints(
	db: Executor,
	actor: Actor,
	studyId: string,
	points: readonly ScanPointInput[],
	opts: { expectedVersion?: number; idempotencyKey?: string; source?: string } = {}
): Promise<ImportResult> {
	const key = opts.idempotencyKey?.trim();
	if (key !== undefined && (key.length === 0 || key.length > 200)) throw new ValidationError('Idempotency-Key must be 1-200 characters', 'Idempotency-Key');
	const requestHash = createHash('sha256').update(JSON.stringify(points)).digest('hex');
	return inTransaction(db, async (tx) => {
		const current = await studyRow(tx, actor.workspaceId, studyId, true);
		if (key) {
			const seen = await tx.selectFrom('tuning_idempotency_key').selectAll().where('study_id', '=', studyId).where('key', '=', key).executeTakeFirst();
			if (seen) {
				if (seen.request_hash !== requestHash) throw new ValidationError('this Idempotency-Key was already used with a different body; use a new key for a new request', 'Idempotency-Key');
				return { ...(seen.response as ImportResult), replayed: true };
			}
		}
		if (opts.expectedVersion !== undefined && current.version !== opts.expectedVersion) throw new StaleVersionError('tuning study');
		const existing = await listPoints(tx, studyId);
		checkImport(points, existing);
		const rows = await tx
			.insertInto('scan_point')
			.values(
				points.map((p) => ({
					study_id: studyId,
					gamma_bohr_inv: p.gammaBohrInv,
					...Object.fromEntries(SCAN_ENERGY_FIELDS.map((f) => [ENERGY_COLUMNS[f], p[f] ?? null])),
					excluded: p.excluded === true,
					excluded_reason: p.excluded ? (p.excludedReason ?? '').trim() : ''
				}))
			)
			.returning('id')
			.execute();
		const r = await tx.updateTable('tuning_study').set({ version: current.version + 1, updated_at: new Date(), updated_by: actor.userId }).where('id', '=', studyId).returning('version').executeTakeFirstOrThrow();
		const gammas = points.map((p) => p.gammaBohrInv);
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'tuning_study',
			entityId: studyId,
			action: 'import',
			summary: `imported ${points.length} scan point(s) into ${current.name}${opts.source ? ` from ${opts.source}` : ''} (gamma ${Math.min(...gammas)}–${Math.max(...gammas)} bohr^-1)`,
			after: { points: points.length, idempotencyKey: key ?? null }
		});
		const result: ImportResult = { study: { id: studyId, version: r.version }, inserted: rows.length, pointIds: rows.map((x) => x.id), replayed: false };
		if (key) await tx.insertInto('tuning_idempotency_key').values({ study_id: studyId, key, request_hash: requestHash, response: JSON.stringify(result) }).execute();
		return result;
	});
}

async function pointInWorkspace(db: Executor, workspaceId: string, pointId: string) {
	const r = await db
		.selectFrom('scan_point as p')
		.innerJoin('tuning_study as s', 's.id', 'p.study_id')
		.selectAll('p')
		.select(['s.name as study_name'])
		.where('s.workspace_id', '=', workspaceId)
		.where('p.id', '=', pointId)
		.forUpdate('p')
		.executeTakeFirst();
	if (!r) throw new NotFoundError('scan point');
	return r;
}

async function bumpStudy(tx: Executor, actor: Actor, studyId: string) {
	await tx.updateTable('tuning_study').set({ version: sql`version + 1`, updated_at: new Date(), updated_by: actor.userId }).where('id', '=', studyId).execute();
}

/** Edits a point's gamma or energies (hartree); logged with before and after. */
export function updatePoint(db: Executor, actor: Actor, pointId: string, expectedVersion: number, patch: PointPatch): Promise<StoredScanPoint> {
	return inTransaction(db, (tx) => updatePointIn(tx, actor, pointId, expectedVersion, patch));
}

async function updatePointIn(tx: Executor, actor: Actor, pointId: string, expectedVersion: number, patch: PointPatch): Promise<StoredScanPoint> {
	{
		const cur = await pointInWorkspace(tx, actor.workspaceId, pointId);
		if (cur.version !== expectedVersion) throw new StaleVersionError('scan point');
		const before = toPoint(cur);
		const next: StoredScanPoint = { ...before };
		if (patch.gammaBohrInv !== undefined) next.gammaBohrInv = patch.gammaBohrInv;
		for (const f of SCAN_ENERGY_FIELDS) if (patch[f] !== undefined) next[f] = patch[f];
		if (patch.excluded !== undefined) next.excluded = patch.excluded;
		if (patch.excludedReason !== undefined) next.excludedReason = patch.excludedReason.trim();
		if (!next.excluded) next.excludedReason = '';
		try {
			validatedScanPoints([analysisPoints([next])[0]]);
		} catch (e) {
			if (e instanceof TuningInputError) throw new ValidationError(e.message, e.field);
			throw e;
		}
		const r = await tx
			.updateTable('scan_point')
			.set({
				gamma_bohr_inv: next.gammaBohrInv,
				...Object.fromEntries(SCAN_ENERGY_FIELDS.map((f) => [ENERGY_COLUMNS[f], next[f] ?? null])),
				excluded: next.excluded,
				excluded_reason: next.excludedReason,
				version: cur.version + 1,
				updated_at: new Date()
			})
			.where('id', '=', pointId)
			.returningAll()
			.executeTakeFirstOrThrow();
		const after = toPoint(r);
		await bumpStudy(tx, actor, cur.study_id);
		const b = pointSnapshot(before);
		const a = pointSnapshot(after);
		const changed = (Object.keys(a) as (keyof typeof a)[]).filter((k) => a[k] !== b[k]);
		const action = before.excluded !== after.excluded ? (after.excluded ? 'exclude' : 'include') : 'update';
		const verb = action === 'exclude' ? `excluded the scan point` : action === 'include' ? 'included again the scan point' : 'edited the scan point';
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'scan_point',
			entityId: pointId,
			action,
			summary: `${verb} at gamma ${before.gammaBohrInv} bohr^-1 of ${cur.study_name}${action === 'exclude' && after.excludedReason ? ` (${after.excludedReason})` : ''}${action === 'update' && changed.length ? ` (${changed.join(', ')})` : ''}`,
			before: b,
			after: a
		});
		return after;
	}
}

/** Excludes a point from the analysis (kept, with a reason) or includes it again. */
export function setPointExclusion(db: Executor, actor: Actor, pointId: string, expectedVersion: number, excluded: boolean, reason = ''): Promise<StoredScanPoint> {
	return updatePoint(db, actor, pointId, expectedVersion, { excluded, excludedReason: reason });
}

export interface SaveAnalysisInput {
	objective: TuningObjective;
	/** Exclusion changes made in the browser, applied (and logged) before the analysis. */
	exclusions?: { pointId: string; version: number; excluded: boolean; reason?: string }[];
}

/**
 * Applies the browser's exclusion changes and objective, recomputes the analysis on the server from the
 * stored points (the browser's numbers are not trusted) and stores it with its version and input hash.
 */
export async function saveAnalysis(db: Executor, actor: Actor, studyId: string, expectedVersion: number, input: SaveAnalysisInput): Promise<TuningStudy> {
	return inTransaction(db, async (tx) => {
		const current = await studyRow(tx, actor.workspaceId, studyId, true);
		if (current.version !== expectedVersion) throw new StaleVersionError('tuning study');
		for (const x of input.exclusions ?? []) {
			const p = await pointInWorkspace(tx, actor.workspaceId, x.pointId);
			if (p.study_id !== studyId) throw new NotFoundError('scan point');
			if (p.excluded === x.excluded && (!x.excluded || p.excluded_reason === (x.reason ?? '').trim())) continue;
			await updatePointIn(tx, actor, x.pointId, x.version, { excluded: x.excluded, excludedReason: x.reason ?? '' });
		}
		const points = await listPoints(tx, studyId);
		if (points.length === 0) throw new ValidationError('the study has no scan points yet: import a scan first', 'points');
		const analysis = tuningAnalysis(analysisPoints(points), { objective: input.objective, basisSet: current.basis_set });
		const r = await tx
			.updateTable('tuning_study')
			.set({
				objective: analysis.input.objective,
				result: JSON.stringify(analysis),
				result_analysis_version: analysis.analysisVersion,
				result_input_hash: analysis.inputHash,
				result_saved_at: new Date(),
				version: sql`version + 1`,
				updated_at: new Date(),
				updated_by: actor.userId
			})
			.where('id', '=', studyId)
			.returningAll()
			.executeTakeFirstOrThrow();
		const before = (current.result as StoredTuningResult | null)?.result.optimum?.gammaBohrInv ?? null;
		const after = analysis.result.optimum?.gammaBohrInv ?? null;
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'tuning_study',
			entityId: studyId,
			action: 'save-result',
			summary: `saved the analysis of ${current.name}: gamma* = ${after === null ? 'none' : after.toFixed(4)} bohr^-1 (${analysis.input.objective})`,
			before: { objective: current.objective, gammaStarBohrInv: before, inputHash: current.result_input_hash },
			after: { objective: analysis.input.objective, gammaStarBohrInv: after, inputHash: analysis.inputHash }
		});
		return toStudy(r, current.molecule_name);
	});
}

/** The current study of a molecule (its tuned parameters), or null. */
export async function currentStudyOf(db: Executor, workspaceId: string, moleculeId: string): Promise<TuningStudySummary | null> {
	const all = await listStudies(db, workspaceId, { moleculeId });
	return all.find((s) => s.isCurrent) ?? null;
}
