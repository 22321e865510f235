import { molarMassGPerMol, parseFormula } from '$lib/science/elements';
import { bornRadiusA, cellVolumeA3, densityGPerCm3, volumePerMoleculeA3 } from '$lib/science/lattice';
import type { PolymorphInput, PolymorphPatch } from '$lib/schemas/polymorph';
import type { Executor } from '../db';
import type { PolymorphRow } from '../db/schema';
import { logActivity } from '../repo/activity';
import { NotFoundError, StaleVersionError, ValidationError } from '../errors';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';
import { moveToTrash } from './trash';

export interface Polymorph {
	id: string;
	workspaceId: string;
	moleculeId: string;
	label: string;
	spaceGroup: string;
	cell: { a: number; b: number; c: number; alphaDeg: number; betaDeg: number; gammaDeg: number };
	z: number;
	temperatureK: number | null;
	structureSource: string;
	notes: string;
	version: number;
	createdAt: Date;
	updatedAt: Date;
	/** Computed from the cell, Z and the molecule's formula; never typed in. */
	derived: { volumeA3: number; volumePerMoleculeA3: number; densityGPerCm3: number | null; bornRadiusA: number };
}

export function derivedQuantities(cell: Polymorph['cell'], z: number, formula: string | null): Polymorph['derived'] {
	const volumeA3 = cellVolumeA3(cell);
	const vm = volumePerMoleculeA3(volumeA3, z);
	let density: number | null = null;
	if (formula) {
		try {
			density = densityGPerCm3(molarMassGPerMol(parseFormula(formula)), z, volumeA3);
		} catch {
			density = null;
		}
	}
	return { volumeA3, volumePerMoleculeA3: vm, densityGPerCm3: density, bornRadiusA: bornRadiusA(vm) };
}

export function toPolymorph(r: PolymorphRow, formula: string | null): Polymorph {
	const cell = { a: r.a_a, b: r.b_a, c: r.c_a, alphaDeg: r.alpha_deg, betaDeg: r.beta_deg, gammaDeg: r.gamma_deg };
	return {
		id: r.id,
		workspaceId: r.workspace_id,
		moleculeId: r.molecule_id,
		label: r.label,
		spaceGroup: r.space_group,
		cell,
		z: r.z,
		temperatureK: r.temperature_k,
		structureSource: r.structure_source,
		notes: r.notes,
		version: r.version,
		createdAt: r.created_at,
		updatedAt: r.updated_at,
		derived: derivedQuantities(cell, r.z, formula)
	};
}

/** Cell, Z and structure fields as polymorph columns (shared by the form, API and CIF import paths). */
export function cellColumns(f: {
	spaceGroup: string;
	a: number;
	b: number;
	c: number;
	alphaDeg: number;
	betaDeg: number;
	gammaDeg: number;
	z: number;
	temperatureK?: number | null;
	structureSource: string;
}) {
	return {
		space_group: f.spaceGroup,
		a_a: f.a,
		b_a: f.b,
		c_a: f.c,
		alpha_deg: f.alphaDeg,
		beta_deg: f.betaDeg,
		gamma_deg: f.gammaDeg,
		z: f.z,
		temperature_k: f.temperatureK ?? null,
		structure_source: f.structureSource
	};
}

/** The cell must describe a real parallelepiped before anything is stored. */
function checkCell(input: Pick<PolymorphInput, 'a' | 'b' | 'c' | 'alphaDeg' | 'betaDeg' | 'gammaDeg'>) {
	try {
		cellVolumeA3(input);
	} catch (e) {
		throw new ValidationError((e as Error).message, 'alphaDeg');
	}
}

function snapshot(p: Polymorph) {
	return { label: p.label, spaceGroup: p.spaceGroup, ...p.cell, z: p.z, temperatureK: p.temperatureK, structureSource: p.structureSource, notes: p.notes };
}

async function moleculeFormula(db: Executor, workspaceId: string, moleculeId: string) {
	const m = await db.selectFrom('molecule').select(['formula', 'name']).where('workspace_id', '=', workspaceId).where('id', '=', moleculeId).executeTakeFirst();
	if (!m) throw new NotFoundError('molecule');
	return m;
}

export async function listPolymorphs(db: Executor, workspaceId: string, opts: { moleculeId?: string; q?: string; limit?: number; after?: { label: string; id: string } } = {}) {
	const rows = await db
		.selectFrom('polymorph as p')
		.innerJoin('molecule as m', 'm.id', 'p.molecule_id')
		.selectAll('p')
		.select(['m.formula as molecule_formula', 'm.name as molecule_name'])
		.where('p.workspace_id', '=', workspaceId)
		.$if(!!opts.moleculeId, (q) => q.where('p.molecule_id', '=', opts.moleculeId!))
		.$if(!!opts.q, (q) => q.where('p.label', 'ilike', `%${opts.q!.replace(/[\\%_]/g, (c) => `\\${c}`)}%`))
		.$if(!!opts.after, (q) =>
			q.where((eb) => eb.or([eb('p.label', '>', opts.after!.label), eb.and([eb('p.label', '=', opts.after!.label), eb('p.id', '>', opts.after!.id)])]))
		)
		.orderBy('p.label')
		.orderBy('p.id')
		.limit(opts.limit ?? 100)
		.execute();
	return rows.map((r) => ({ ...toPolymorph(r, r.molecule_formula), moleculeName: r.molecule_name }));
}

export async function getPolymorph(db: Executor, workspaceId: string, id: string) {
	const r = await db
		.selectFrom('polymorph as p')
		.innerJoin('molecule as m', 'm.id', 'p.molecule_id')
		.selectAll('p')
		.select(['m.formula as molecule_formula', 'm.name as molecule_name'])
		.where('p.workspace_id', '=', workspaceId)
		.where('p.id', '=', id)
		.executeTakeFirst();
	if (!r) throw new NotFoundError('polymorph');
	return { ...toPolymorph(r, r.molecule_formula), moleculeName: r.molecule_name };
}

export async function createPolymorph(db: Executor, actor: Actor, moleculeId: string, input: PolymorphInput): Promise<Polymorph> {
	checkCell(input);
	return inTransaction(db, async (tx) => {
		const m = await moleculeFormula(tx, actor.workspaceId, moleculeId);
		const r = await tx
			.insertInto('polymorph')
			.values({
				workspace_id: actor.workspaceId,
				molecule_id: moleculeId,
				label: input.label,
				...cellColumns(input),
				notes: input.notes,
				created_by: actor.userId,
				updated_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		const p = toPolymorph(r, m.formula);
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: p.id, action: 'create', summary: `added polymorph ${p.label} of ${m.name}`, after: snapshot(p) });
		return p;
	});
}

export async function updatePolymorph(db: Executor, actor: Actor, id: string, expectedVersion: number, patch: PolymorphPatch): Promise<Polymorph> {
	return inTransaction(db, async (tx) => {
		const current = await tx.selectFrom('polymorph').selectAll().where('workspace_id', '=', actor.workspaceId).where('id', '=', id).forUpdate().executeTakeFirst();
		if (!current) throw new NotFoundError('polymorph');
		if (current.version !== expectedVersion) throw new StaleVersionError('polymorph');
		const m = await moleculeFormula(tx, actor.workspaceId, current.molecule_id);
		const before = toPolymorph(current, m.formula);
		const next = { ...snapshot(before), ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) } as ReturnType<typeof snapshot>;
		checkCell(next);
		const r = await tx
			.updateTable('polymorph')
			.set({
				label: next.label,
				...cellColumns(next),
				notes: next.notes,
				version: current.version + 1,
				updated_at: new Date(),
				updated_by: actor.userId
			})
			.where('id', '=', id)
			.returningAll()
			.executeTakeFirstOrThrow();
		const after = toPolymorph(r, m.formula);
		const b = snapshot(before);
		const a = snapshot(after);
		const changed = (Object.keys(a) as (keyof typeof a)[]).filter((k) => a[k] !== b[k]);
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: id, action: 'update', summary: `edited polymorph ${after.label}${changed.length ? ` (${changed.join(', ')})` : ''}`, before: b, after: a });
		return after;
	});
}

export async function deletePolymorph(db: Executor, actor: Actor, id: string, expectedVersion?: number): Promise<void> {
	await inTransaction(db, async (tx) => {
		const current = await tx.selectFrom('polymorph').selectAll().where('workspace_id', '=', actor.workspaceId).where('id', '=', id).forUpdate().executeTakeFirst();
		if (!current) throw new NotFoundError('polymorph');
		if (expectedVersion !== undefined && current.version !== expectedVersion) throw new StaleVersionError('polymorph');
		const { contents } = await moveToTrash(tx, actor, { entity: 'polymorph', table: 'polymorph', id, label: current.label, parentHref: `/w/${actor.workspaceId}/molecules/${current.molecule_id}` });
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: id, action: 'delete', summary: `deleted polymorph ${current.label} to the trash with ${contents}`, before: snapshot(toPolymorph(current, null)) });
	});
}
