// Dielectric entries of a polymorph (scalar, tensor, refractive index, Clausius–Mossotti estimate) and the
// polymorph's epsilon in use. Every number is computed by src/lib/science/dielectric; this file validates,
// stores, and logs.
import {
	analyseTensor,
	clausiusMossottiEpsilon,
	DielectricError,
	epsilonFromRefractiveIndex,
	polarizabilityVolumeA3,
	type Matrix3
} from '$lib/science/dielectric';
import { TensorParseError, parseDielectricTensor } from '$lib/formats/tensor';
import type { DielectricEntryInput, EpsilonChoiceInput } from '$lib/schemas/dielectric';
import type { Executor } from '../db';
import type { DielectricEntryRow, DielectricFrequency, DielectricKind } from '../db/schema-dielectric';
import { DependentsError, NotFoundError, StaleVersionError, ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import type { Actor } from './actor';
import { getPolymorph } from './polymorphs';
import { inTransaction } from '../db/transaction';
import { moveToTrash } from './trash';

/** Shown wherever a static constant is entered or chosen. */
export const STATIC_EPSILON_NOTE =
	'This is a static (low-frequency) constant: it includes the ions’ and molecules’ vibrational response. The ' +
	'screened range-separated hybrid needs the electronic (high-frequency, clamped-ion) constant ε∞, which ' +
	'screens a charge on the time scale of electronic polarization. Engines print both, under names that are easy ' +
	'to confuse (e.g. "epsilon infinity", "ion-clamped", "without local fields" versus "static", "including ionic ' +
	'contributions"). For molecular crystals the two are often close, but not always (polar groups, hydrogen bonds).';

/** Polarizability volumes below this (Å^3) are refused: smaller than a helium atom (about 0.2 Å^3). */
const MIN_POLARIZABILITY_A3 = 0.1;

export interface DielectricEntry {
	id: string;
	polymorphId: string;
	kind: DielectricKind;
	frequency: DielectricFrequency;
	/** What was entered and what was derived from it; shape depends on kind. */
	input: Record<string, unknown>;
	epsilon: number;
	epsilonUncertainty: number | null;
	source: { method: string; engine: string; reference: string; note: string };
	warnings: string[];
	version: number;
	createdAt: Date;
	createdBy: string | null;
}

export interface EpsilonInUse {
	entryId: string;
	reason: string;
	version: number;
	chosenAt: Date;
	chosenBy: string | null;
	entry: DielectricEntry;
}

function toEntry(r: DielectricEntryRow, createdBy: string | null): DielectricEntry {
	const input = (typeof r.input === 'string' ? JSON.parse(r.input) : r.input) as Record<string, unknown>;
	return {
		id: r.id,
		polymorphId: r.polymorph_id,
		kind: r.kind,
		frequency: r.frequency,
		input,
		epsilon: r.epsilon,
		epsilonUncertainty: r.epsilon_uncertainty,
		source: { method: r.method, engine: r.engine, reference: r.reference, note: r.note },
		warnings: Array.isArray(input.warnings) ? (input.warnings as string[]) : [],
		version: r.version,
		createdAt: r.created_at,
		createdBy
	};
}

/** Science and format errors become validation errors naming the field (and line). */
function asValidation(e: unknown, field: string): never {
	if (e instanceof TensorParseError) throw new ValidationError(e.message, field, e.line ?? undefined);
	if (e instanceof DielectricError) throw new ValidationError(e.message, e.field === 'tensor' ? field : e.field);
	if (e instanceof RangeError) throw new ValidationError(e.message, field);
	throw e;
}

function parseMatrix(value: string | number[][], field: string): { matrix: Matrix3; format: string } {
	if (typeof value !== 'string') return { matrix: value.map((r) => [...r]), format: 'json-array' };
	try {
		const p = parseDielectricTensor(value);
		return { matrix: p.matrix, format: p.format };
	} catch (e) {
		return asValidation(e, field);
	}
}

const round = (v: number) => Number(v.toPrecision(6));

export interface EvaluatedEntry {
	epsilon: number;
	epsilonUncertainty: number | null;
	input: Record<string, unknown> & { warnings: string[] };
}

/**
 * Computes the scalar epsilon of an entry and what to store with it. Pure apart from the polymorph's
 * V/Z (needed by Clausius–Mossotti). Throws ValidationError with the field (and line) for bad input.
 */
export function evaluateEntry(input: DielectricEntryInput, cell: { volumeA3: number; z: number; volumePerMoleculeA3: number }): EvaluatedEntry {
	const warnings: string[] = [];
	let out: EvaluatedEntry;
	switch (input.kind) {
		case 'scalar': {
			if (input.epsilon < 1) warnings.push(`epsilon = ${input.epsilon} is below 1: the dielectric constant of an insulator is >= 1; check that it is eps (not chi = eps - 1)`);
			out = { epsilon: input.epsilon, epsilonUncertainty: input.epsilonUncertainty ?? null, input: { epsilon: input.epsilon, warnings } };
			break;
		}
		case 'tensor': {
			const { matrix, format } = parseMatrix(input.tensor, 'tensor');
			let a;
			try {
				a = analyseTensor(matrix);
			} catch (e) {
				return asValidation(e, 'tensor');
			}
			warnings.push(...a.warnings);
			const epsilon = input.scalar === 'harmonic' ? a.harmonicMean : input.scalar === 'geometric' ? a.geometricMean : a.traceMean;
			out = {
				epsilon,
				epsilonUncertainty: null,
				input: {
					matrix,
					format,
					symmetric: a.symmetric,
					symmetrised: a.symmetrised,
					asymmetryRel: a.asymmetryRel,
					principalValues: a.principalValues,
					principalAxes: a.principalAxes,
					traceMean: a.traceMean,
					harmonicMean: a.harmonicMean,
					geometricMean: a.geometricMean,
					anisotropyRatio: a.anisotropyRatio,
					scalar: input.scalar,
					warnings
				}
			};
			break;
		}
		case 'refractive_index': {
			let r;
			try {
				r = epsilonFromRefractiveIndex({ refractiveIndex: input.refractiveIndex, wavelengthNm: input.wavelengthNm ?? null, refractiveIndexUncertainty: input.refractiveIndexUncertainty ?? null });
			} catch (e) {
				return asValidation(e, 'refractiveIndex');
			}
			out = {
				epsilon: r.epsilon,
				epsilonUncertainty: r.epsilonUncertainty,
				input: { refractiveIndex: r.refractiveIndex, wavelengthNm: r.wavelengthNm, refractiveIndexUncertainty: input.refractiveIndexUncertainty ?? null, note: r.note, warnings }
			};
			break;
		}
		case 'clausius_mossotti': {
			let polarizability: number | Matrix3;
			let polarizabilityFormat: string | null = null;
			if (typeof input.polarizability === 'string') {
				const text = input.polarizability.trim();
				const asNumber = Number(text.replace(/^([+-]?[\d.]+)[dD]/, '$1e'));
				if (/^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/.test(text) && Number.isFinite(asNumber)) polarizability = asNumber;
				else {
					const p = parseMatrix(text, 'polarizability');
					polarizability = p.matrix;
					polarizabilityFormat = p.format;
				}
			} else polarizability = input.polarizability;
			let alphaA3: number;
			try {
				alphaA3 = polarizabilityVolumeA3({ polarizability, unit: input.unit });
			} catch (e) {
				return asValidation(e, 'polarizability');
			}
			if (alphaA3 < MIN_POLARIZABILITY_A3) {
				const hint = input.unit === 'A3' && alphaA3 < 1e-20 ? ' It looks like a value in C·m²/V (SI) or cm³: choose that unit.' : ' Check the unit.';
				throw new ValidationError(
					`a polarizability of ${Number(alphaA3.toPrecision(4))} Å³ (from ${typeof polarizability === 'number' ? polarizability : 'the tensor'} ${input.unit}) is smaller than a helium atom’s (about 0.2 Å³), so it cannot be a molecule’s.${hint}`,
					'unit'
				);
			}
			let r;
			try {
				r = clausiusMossottiEpsilon({ polarizability, unit: input.unit, volumePerMoleculeA3: cell.volumePerMoleculeA3, polarizabilityUncertainty: input.polarizabilityUncertainty ?? null });
			} catch (e) {
				return asValidation(e, 'polarizability');
			}
			warnings.push(...r.warnings);
			out = {
				epsilon: r.epsilon,
				epsilonUncertainty: r.epsilonUncertainty,
				input: {
					polarizability,
					polarizabilityFormat,
					unit: input.unit,
					polarizabilityUncertainty: input.polarizabilityUncertainty ?? null,
					polarizabilityVolumeA3: r.polarizabilityVolumeA3,
					cellVolumeA3: cell.volumeA3,
					z: cell.z,
					volumePerMoleculeA3: r.volumePerMoleculeA3,
					x: r.x,
					formula: `x = 4π·${round(r.polarizabilityVolumeA3)} Å³ / (3·${round(r.volumePerMoleculeA3)} Å³) = ${round(r.x)}; ε = (1 + 2x)/(1 − x) = ${round(r.epsilon)}`,
					warnings
				}
			};
			break;
		}
	}
	if (input.frequency === 'static') warnings.push('static constant entered: the screened functional needs the electronic (high-frequency) one');
	return out;
}

async function lockPolymorph(db: Executor, workspaceId: string, polymorphId: string) {
	const p = await db.selectFrom('polymorph').select(['id', 'label']).where('workspace_id', '=', workspaceId).where('id', '=', polymorphId).forUpdate().executeTakeFirst();
	if (!p) throw new NotFoundError('polymorph');
	return p;
}

function entryQuery(db: Executor, workspaceId: string) {
	return db
		.selectFrom('dielectric_entry as e')
		.leftJoin('User as u', 'u.id', 'e.created_by')
		.selectAll('e')
		.select(['u.email as creator_email', 'u.name as creator_name'])
		.where('e.workspace_id', '=', workspaceId);
}

export async function listDielectricEntries(db: Executor, workspaceId: string, polymorphId: string): Promise<DielectricEntry[]> {
	const rows = await entryQuery(db, workspaceId).where('e.polymorph_id', '=', polymorphId).orderBy('e.created_at').orderBy('e.id').execute();
	return rows.map((r) => toEntry(r, r.creator_name || r.creator_email));
}

export async function getDielectricEntry(db: Executor, workspaceId: string, polymorphId: string, entryId: string): Promise<DielectricEntry> {
	const r = await entryQuery(db, workspaceId).where('e.polymorph_id', '=', polymorphId).where('e.id', '=', entryId).executeTakeFirst();
	if (!r) throw new NotFoundError('dielectric entry');
	return toEntry(r, r.creator_name || r.creator_email);
}

const KIND_LABEL: Record<DielectricKind, string> = { scalar: 'scalar', tensor: 'tensor', refractive_index: 'refractive-index', clausius_mossotti: 'Clausius–Mossotti' };

/** Adds an entry; nothing is stored when the input is refused. */
export async function addDielectricEntry(db: Executor, actor: Actor, polymorphId: string, input: DielectricEntryInput): Promise<DielectricEntry> {
	const polymorph = await getPolymorph(db, actor.workspaceId, polymorphId);
	const ev = evaluateEntry(input, { volumeA3: polymorph.derived.volumeA3, z: polymorph.z, volumePerMoleculeA3: polymorph.derived.volumePerMoleculeA3 });
	return inTransaction(db, async (tx) => {
		await lockPolymorph(tx, actor.workspaceId, polymorphId);
		const r = await tx
			.insertInto('dielectric_entry')
			.values({
				workspace_id: actor.workspaceId,
				polymorph_id: polymorphId,
				kind: input.kind,
				frequency: input.frequency,
				input: JSON.stringify(ev.input),
				epsilon: ev.epsilon,
				epsilon_uncertainty: ev.epsilonUncertainty,
				method: input.method,
				engine: input.engine,
				reference: input.reference,
				note: input.note,
				created_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'polymorph',
			entityId: polymorphId,
			action: 'dielectric_add',
			summary: `added a ${KIND_LABEL[input.kind]} dielectric entry (${input.frequency}, ε = ${round(ev.epsilon)}) to ${polymorph.label}`,
			after: { entryId: r.id, kind: input.kind, frequency: input.frequency, epsilon: ev.epsilon }
		});
		return toEntry(r, null);
	});
}

/** Deletes an entry; refused while it is the epsilon in use, or when the caller's version is stale. */
export async function deleteDielectricEntry(db: Executor, actor: Actor, polymorphId: string, entryId: string, expectedVersion?: number): Promise<void> {
	await inTransaction(db, async (tx) => {
		const p = await lockPolymorph(tx, actor.workspaceId, polymorphId);
		const e = await tx.selectFrom('dielectric_entry').selectAll().where('workspace_id', '=', actor.workspaceId).where('polymorph_id', '=', polymorphId).where('id', '=', entryId).executeTakeFirst();
		if (!e) throw new NotFoundError('dielectric entry');
		if (expectedVersion !== undefined && e.version !== expectedVersion) throw new StaleVersionError('dielectric entry');
		const inUse = await tx.selectFrom('polymorph_epsilon').select('entry_id').where('polymorph_id', '=', polymorphId).where('entry_id', '=', entryId).executeTakeFirst();
		if (inUse) throw new DependentsError('this entry is the polymorph’s epsilon in use; choose another entry first, then delete it', ['epsilon in use']);
		await moveToTrash(tx, actor, { entity: 'dielectric entry', table: 'dielectric_entry', id: entryId, label: `${KIND_LABEL[e.kind]} ε = ${round(e.epsilon)} (${e.frequency}) of ${p.label}`, parentHref: `/w/${actor.workspaceId}/polymorphs/${polymorphId}` });
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'polymorph',
			entityId: polymorphId,
			action: 'dielectric_delete',
			summary: `deleted a ${KIND_LABEL[e.kind]} dielectric entry (ε = ${round(e.epsilon)}) of ${p.label}`,
			before: { entryId, kind: e.kind, frequency: e.frequency, epsilon: e.epsilon }
		});
	});
}

export async function getEpsilonInUse(db: Executor, workspaceId: string, polymorphId: string): Promise<EpsilonInUse | null> {
	const c = await db
		.selectFrom('polymorph_epsilon as c')
		.leftJoin('User as u', 'u.id', 'c.chosen_by')
		.selectAll('c')
		.select(['u.email', 'u.name'])
		.where('c.workspace_id', '=', workspaceId)
		.where('c.polymorph_id', '=', polymorphId)
		.executeTakeFirst();
	if (!c) return null;
	const entry = await getDielectricEntry(db, workspaceId, polymorphId, c.entry_id);
	return { entryId: c.entry_id, reason: c.reason, version: c.version, chosenAt: c.chosen_at, chosenBy: c.name || c.email, entry };
}

/** Epsilon in use for several polymorphs at once (the comparison table). */
export async function epsilonInUseByPolymorph(db: Executor, workspaceId: string, polymorphIds: string[]): Promise<Record<string, { entry: DielectricEntry; reason: string }>> {
	if (polymorphIds.length === 0) return {};
	const rows = await entryQuery(db, workspaceId)
		.innerJoin('polymorph_epsilon as c', (j) => j.onRef('c.entry_id', '=', 'e.id').onRef('c.polymorph_id', '=', 'e.polymorph_id'))
		.select('c.reason')
		.where('e.polymorph_id', 'in', polymorphIds)
		.execute();
	return Object.fromEntries(rows.map((r) => [r.polymorph_id, { entry: toEntry(r, r.creator_name || r.creator_email), reason: r.reason }]));
}

/**
 * Chooses the polymorph's epsilon in use, with a reason; the change is logged with before and after.
 * When a choice exists, the caller must send the version of it they read.
 */
export async function chooseEpsilon(db: Executor, actor: Actor, polymorphId: string, input: EpsilonChoiceInput): Promise<EpsilonInUse> {
	await inTransaction(db, async (tx) => {
		const p = await lockPolymorph(tx, actor.workspaceId, polymorphId);
		const entry = await tx.selectFrom('dielectric_entry').selectAll().where('workspace_id', '=', actor.workspaceId).where('polymorph_id', '=', polymorphId).where('id', '=', input.entryId).executeTakeFirst();
		if (!entry) throw new ValidationError('that dielectric entry does not belong to this polymorph', 'entryId');
		const current = await tx.selectFrom('polymorph_epsilon').selectAll().where('polymorph_id', '=', polymorphId).executeTakeFirst();
		const before = current
			? await tx.selectFrom('dielectric_entry').select(['epsilon', 'kind', 'frequency']).where('id', '=', current.entry_id).executeTakeFirst()
			: undefined;
		if (current) {
			if (input.version === undefined || input.version === 0) {
				throw new ValidationError('an epsilon is already in use: send the version of the choice you read ("version") so a stale change cannot overwrite a newer one', 'version');
			}
			if (current.version !== input.version) throw new StaleVersionError('epsilon choice');
			await tx
				.updateTable('polymorph_epsilon')
				.set({ entry_id: input.entryId, reason: input.reason, version: current.version + 1, chosen_at: new Date(), chosen_by: actor.userId })
				.where('polymorph_id', '=', polymorphId)
				.execute();
		} else {
			if (input.version !== undefined && input.version !== 0) throw new StaleVersionError('epsilon choice');
			await tx
				.insertInto('polymorph_epsilon')
				.values({ polymorph_id: polymorphId, workspace_id: actor.workspaceId, entry_id: input.entryId, reason: input.reason, chosen_by: actor.userId })
				.execute();
		}
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'polymorph',
			entityId: polymorphId,
			action: 'choose_epsilon',
			summary: `set the epsilon in use of ${p.label} to ${round(entry.epsilon)} (${KIND_LABEL[entry.kind]}, ${entry.frequency}): ${input.reason}`,
			before: current && before ? { epsilonEntry: current.entry_id, epsilon: round(before.epsilon), reason: current.reason } : { epsilonEntry: null, epsilon: null, reason: null },
			after: { epsilonEntry: input.entryId, epsilon: round(entry.epsilon), reason: input.reason }
		});
	});
	return (await getEpsilonInUse(db, actor.workspaceId, polymorphId)) as EpsilonInUse;
}
