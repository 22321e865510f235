import { electronCount, parseXyz, XyzParseError } from '$lib/formats/xyz';
import { parseFormula } from '$lib/science/elements';
import type { MoleculeInput, MoleculePatch } from '$lib/schemas/molecule';
import type { Executor } from '../db';
import type { MoleculeRow } from '../db/schema';
import { logActivity } from '../repo/activity';
import { DependentsError, NotFoundError, StaleVersionError, ValidationError } from '../errors';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';
import { moveToTrash } from './trash';

export interface Molecule {
	id: string;
	workspaceId: string;
	name: string;
	formula: string;
	netCharge: number;
	multiplicity: number;
	geometryXyz: string;
	atomCount: number;
	smiles: string | null;
	notes: string;
	version: number;
	createdAt: Date;
	updatedAt: Date;
	createdBy: string | null;
	updatedBy: string | null;
}

export function toMolecule(r: MoleculeRow): Molecule {
	return {
		id: r.id,
		workspaceId: r.workspace_id,
		name: r.name,
		formula: r.formula,
		netCharge: r.net_charge,
		multiplicity: r.multiplicity,
		geometryXyz: r.geometry_xyz,
		atomCount: r.atom_count,
		smiles: r.smiles,
		notes: r.notes,
		version: r.version,
		createdAt: r.created_at,
		updatedAt: r.updated_at,
		createdBy: r.created_by,
		updatedBy: r.updated_by
	};
}

/** Parse and check the geometry; the formula is derived from it unless one is given, and must agree. */
function checkGeometry(input: Pick<MoleculeInput, 'geometryXyz' | 'formula' | 'netCharge' | 'multiplicity'>) {
	let parsed;
	try {
		parsed = parseXyz(input.geometryXyz);
	} catch (e) {
		if (e instanceof XyzParseError) throw new ValidationError(e.message, 'geometryXyz', e.line);
		throw e;
	}
	let formula = parsed.formula;
	if (input.formula) {
		let counts;
		try {
			counts = parseFormula(input.formula);
		} catch (e) {
			throw new ValidationError((e as Error).message, 'formula');
		}
		const same =
			Object.keys(counts).length === Object.keys(parsed.counts).length &&
			Object.entries(counts).every(([el, n]) => parsed.counts[el] === n);
		if (!same) throw new ValidationError(`formula ${input.formula} does not match the geometry (${parsed.formula})`, 'formula');
		formula = input.formula;
	}
	const electrons = electronCount(parsed.atoms, input.netCharge);
	if (electrons < 1) throw new ValidationError('the net charge leaves no electrons', 'netCharge');
	if ((electrons + input.multiplicity - 1) % 2 !== 0)
		throw new ValidationError(
			`multiplicity ${input.multiplicity} is impossible with ${electrons} electrons (an ${electrons % 2 ? 'odd' : 'even'} count needs an ${electrons % 2 ? 'even' : 'odd'} multiplicity)`,
			'multiplicity'
		);
	return { formula, atomCount: parsed.atoms.length };
}

export async function listMolecules(
	db: Executor,
	workspaceId: string,
	opts: { q?: string; sort?: 'name' | 'formula' | 'updated_at'; dir?: 'asc' | 'desc'; limit?: number; offset?: number; after?: { name: string; id: string } } = {}
) {
	const sort = opts.sort ?? 'name';
	const dir = opts.dir ?? 'asc';
	let q = db
		.selectFrom('molecule')
		.where('workspace_id', '=', workspaceId)
		.$if(!!opts.q, (qb) => qb.where((eb) => eb.or([eb('name', 'ilike', `%${escapeLike(opts.q!)}%`), eb('formula', 'ilike', `%${escapeLike(opts.q!)}%`)])));
	const total = await q.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
	if (opts.after) {
		const { name, id } = opts.after;
		q = q.where((eb) => eb.or([eb('name', '>', name), eb.and([eb('name', '=', name), eb('id', '>', id)])]));
	}
	const rows = await q
		.selectAll()
		.select((eb) =>
			eb.selectFrom('polymorph').select((e2) => e2.fn.countAll<number>().as('c')).whereRef('polymorph.molecule_id', '=', 'molecule.id').as('polymorph_count')
		)
		.orderBy(sort, dir)
		.orderBy('id', 'asc')
		.limit(opts.limit ?? 25)
		.offset(opts.after ? 0 : (opts.offset ?? 0))
		.execute();
	return { total: Number(total.n), items: rows.map((r) => ({ ...toMolecule(r), polymorphCount: Number(r.polymorph_count ?? 0) })) };
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function getMolecule(db: Executor, workspaceId: string, id: string): Promise<Molecule> {
	const r = await db.selectFrom('molecule').selectAll().where('workspace_id', '=', workspaceId).where('id', '=', id).executeTakeFirst();
	if (!r) throw new NotFoundError('molecule');
	return toMolecule(r);
}

export async function createMolecule(db: Executor, actor: Actor, input: MoleculeInput): Promise<Molecule> {
	const { formula, atomCount } = checkGeometry(input);
	return inTransaction(db, async (tx) => {
		const r = await tx
			.insertInto('molecule')
			.values({
				workspace_id: actor.workspaceId,
				name: input.name,
				formula,
				net_charge: input.netCharge,
				multiplicity: input.multiplicity,
				geometry_xyz: input.geometryXyz,
				atom_count: atomCount,
				smiles: input.smiles || null,
				notes: input.notes,
				created_by: actor.userId,
				updated_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		const m = toMolecule(r);
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'molecule', entityId: m.id, action: 'create', summary: `created molecule ${m.name}`, after: snapshot(m) });
		return m;
	});
}

function snapshot(m: Molecule) {
	return { name: m.name, formula: m.formula, netCharge: m.netCharge, multiplicity: m.multiplicity, atomCount: m.atomCount, smiles: m.smiles, notes: m.notes };
}

export async function updateMolecule(db: Executor, actor: Actor, id: string, expectedVersion: number, patch: MoleculePatch): Promise<Molecule> {
	return inTransaction(db, async (tx) => {
		const current = await tx.selectFrom('molecule').selectAll().where('workspace_id', '=', actor.workspaceId).where('id', '=', id).forUpdate().executeTakeFirst();
		if (!current) throw new NotFoundError('molecule');
		if (current.version !== expectedVersion) throw new StaleVersionError('molecule');
		const before = toMolecule(current);
		const merged = { ...before, ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) } as Molecule & MoleculePatch;
		const geometryChanged = patch.geometryXyz !== undefined || patch.formula !== undefined || patch.netCharge !== undefined || patch.multiplicity !== undefined;
		const { formula, atomCount } = geometryChanged
			? checkGeometry({ geometryXyz: merged.geometryXyz, formula: patch.formula ?? '', netCharge: merged.netCharge, multiplicity: merged.multiplicity })
			: { formula: before.formula, atomCount: before.atomCount };
		const r = await tx
			.updateTable('molecule')
			.set({
				name: merged.name,
				formula,
				net_charge: merged.netCharge,
				multiplicity: merged.multiplicity,
				geometry_xyz: merged.geometryXyz,
				atom_count: atomCount,
				smiles: merged.smiles || null,
				notes: merged.notes,
				version: current.version + 1,
				updated_at: new Date(),
				updated_by: actor.userId
			})
			.where('id', '=', id)
			.returningAll()
			.executeTakeFirstOrThrow();
		const after = toMolecule(r);
		const b = snapshot(before);
		const a = snapshot(after);
		const changed = (Object.keys(a) as (keyof typeof a)[]).filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k]));
		if (before.geometryXyz !== after.geometryXyz) changed.push('geometry' as keyof typeof a);
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'molecule',
			entityId: id,
			action: 'update',
			summary: `edited molecule ${after.name}${changed.length ? ` (${changed.join(', ')})` : ''}`,
			before: b,
			after: a
		});
		return after;
	});
}

export async function deleteMolecule(db: Executor, actor: Actor, id: string, expectedVersion?: number): Promise<void> {
	await inTransaction(db, async (tx) => {
		const current = await tx.selectFrom('molecule').selectAll().where('workspace_id', '=', actor.workspaceId).where('id', '=', id).forUpdate().executeTakeFirst();
		if (!current) throw new NotFoundError('molecule');
		if (expectedVersion !== undefined && current.version !== expectedVersion) throw new StaleVersionError('molecule');
		// A molecule's polymorphs and studies are results in their own right: refuse, and list them with links,
		// rather than take them along. Once they are deleted (to the trash) the molecule can go too.
		const polymorphs = await tx.selectFrom('polymorph').select(['id', 'label']).where('molecule_id', '=', id).orderBy('label').execute();
		const studies = await tx.selectFrom('tuning_study').select(['id', 'name']).where('molecule_id', '=', id).orderBy('name').execute();
		if (polymorphs.length || studies.length) {
			const parts = [polymorphs.length ? `${polymorphs.length} ${polymorphs.length === 1 ? 'polymorph' : 'polymorphs'}` : '', studies.length ? `${studies.length} ${studies.length === 1 ? 'tuning study' : 'tuning studies'}` : ''].filter(Boolean);
			throw new DependentsError(
				`molecule ${current.name} still has ${parts.join(' and ')}: delete them first (they go to the trash, where an owner can restore them)`,
				[...polymorphs.map((p) => `polymorph ${p.label}`), ...studies.map((s) => `tuning study ${s.name}`)],
				[...polymorphs.map((p) => ({ label: `polymorph ${p.label}`, href: `/w/${actor.workspaceId}/polymorphs/${p.id}` })), ...studies.map((s) => ({ label: `tuning study ${s.name}`, href: `/w/${actor.workspaceId}/studies/${s.id}` }))]
			);
		}
		await moveToTrash(tx, actor, { entity: 'molecule', table: 'molecule', id, label: current.name, parentHref: `/w/${actor.workspaceId}/molecules` });
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'molecule', entityId: id, action: 'delete', summary: `deleted molecule ${current.name}`, before: snapshot(toMolecule(current)) });
	});
}
