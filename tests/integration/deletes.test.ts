// Deletes of records with dependants, against the real PostgreSQL: a molecule with polymorphs or studies is
// refused with the list; everything else goes to the trash with what it took along, and an owner restores it
// exactly (row for row). Nothing is lost silently.
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { DependentsError, ValidationError } from '../../src/lib/server/errors';
import { addDielectricEntry, chooseEpsilon, deleteDielectricEntry } from '../../src/lib/server/services/dielectric';
import { addMeasurement, deleteMeasurement } from '../../src/lib/server/services/measurements';
import { createMolecule, deleteMolecule } from '../../src/lib/server/services/molecules';
import { createPolymorph, deletePolymorph } from '../../src/lib/server/services/polymorphs';
import { addReruns, deleteRerun } from '../../src/lib/server/services/reruns';
import { listTrash, restoreFromTrash } from '../../src/lib/server/services/trash';
import { createStudy, deleteStudy, importPoints } from '../../src/lib/server/services/tuning';
import { deleteWorkspace } from '../../src/lib/server/services/workspaces';
import { createWorkspace } from '../../src/lib/server/repo/workspaces';
import { dielectricEntryInput, epsilonChoiceInput } from '../../src/lib/schemas/dielectric';
import { measurementInput } from '../../src/lib/schemas/measurement';
import { scanPointInput, studyInput } from '../../src/lib/schemas/tuning';
import { appDb, PASSWORD, teamFixture, WATER_XYZ } from './fixtures';
import { probe, signInCookie } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
type A = { userId: string; workspaceId: string; role: 'owner' | 'editor' | 'viewer' };
let owner: A;
let editor: A;

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	owner = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' };
	editor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' };
});
afterAll(async () => db?.destroy());

/** Every row of the given tables that belongs to the workspace, as text, for before/after comparison. */
async function dump(tables: string[]): Promise<Record<string, string[]>> {
	const out: Record<string, string[]> = {};
	for (const t of tables) {
		const r = await sql<{ x: string }>`select x::text as x from ${sql.table(t)} x where x.workspace_id = ${fx.ws} order by 1`.execute(db);
		out[t] = r.rows.map((row) => row.x);
	}
	return out;
}
const POLYMORPH_TABLES = ['polymorph', 'dielectric_entry', 'polymorph_epsilon', 'measurement', 'rerun_result', 'solid_estimate', 'bundle'];

async function trashEntry(entityId: string) {
	return db.selectFrom('deleted_record').selectAll().where('entity_id', '=', entityId).orderBy('deleted_at', 'desc').executeTakeFirstOrThrow();
}

const study = (name: string) => studyInput.parse({ name, engine: 'NWChem', basisSet: 'def2-SVP', alpha: 0.2 });
const scalar = (epsilon: number) => dielectricEntryInput.parse({ kind: 'scalar', frequency: 'electronic', epsilon, method: 'test', engine: '', reference: '', note: '' });

async function polymorphWithEverything(label: string) {
	const p = await createPolymorph(db, editor, fx.molecule.id, { label, spaceGroup: 'P1', a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, structureSource: 'test', notes: '' });
	const e1 = await addDielectricEntry(db, editor, p.id, scalar(3.2));
	await addDielectricEntry(db, editor, p.id, scalar(3.6));
	await chooseEpsilon(db, editor, p.id, epsilonChoiceInput.parse({ entryId: e1.id, reason: 'test choice' }));
	await addMeasurement(db, editor, p.id, measurementInput.parse({ ipEv: 5.1, uncertaintyEv: 0.1, method: 'UPS' }));
	await addReruns(db, editor, p.id, [{ epsilon: 3.2, alpha: 0.2, gammaBohrInv: 0.2, homoHartree: -0.2, lumoHartree: -0.1 }], 'typed');
	return p;
}

describe('molecule delete', () => {
	it('is refused while polymorphs or studies remain, listing them with counts and links, and stores nothing in the trash', async () => {
		const m = await createMolecule(db, editor, { name: `Blocked ${fx.tag}`, formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' });
		const p = await createPolymorph(db, editor, m.id, { label: 'form I', spaceGroup: 'P1', a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, structureSource: '', notes: '' });
		const s = await createStudy(db, editor, m.id, study('scan A'));
		let caught: unknown;
		try {
			await deleteMolecule(db, editor, m.id);
		} catch (e) {
			caught = e;
		}
		expect(caught).toBeInstanceOf(DependentsError);
		const d = caught as DependentsError;
		expect(d.message).toContain('1 polymorph and 1 tuning study');
		expect(d.dependents).toEqual(['polymorph form I', 'tuning study scan A']);
		expect(d.links).toEqual([
			{ label: 'polymorph form I', href: `/w/${fx.ws}/polymorphs/${p.id}` },
			{ label: 'tuning study scan A', href: `/w/${fx.ws}/studies/${s.id}` }
		]);
		expect(await db.selectFrom('deleted_record').select('id').where('entity_id', '=', m.id).execute()).toEqual([]);
		// Once its children are in the trash the molecule goes too; restoring a child first names the molecule.
		await deletePolymorph(db, editor, p.id);
		await deleteStudy(db, editor, s.id);
		await deleteMolecule(db, editor, m.id);
		const pt = await trashEntry(p.id);
		await expect(restoreFromTrash(db, owner, pt.id)).rejects.toThrow(`belongs to molecule Blocked ${fx.tag}, which is in the trash: restore that first`);
		await restoreFromTrash(db, owner, (await trashEntry(m.id)).id);
		await restoreFromTrash(db, owner, pt.id);
		await restoreFromTrash(db, owner, (await trashEntry(s.id)).id);
		expect(await db.selectFrom('polymorph').select('label').where('id', '=', p.id).executeTakeFirst()).toEqual({ label: 'form I' });
	});

	it('refuses through the API with 409 and the list of dependants', async () => {
		const cookie = await signInCookie(fx.editor.email, PASSWORD);
		const r = await probe(`/api/v1/workspaces/${fx.ws}/molecules/${fx.molecule.id}`, { method: 'DELETE', cookie });
		expect(r.status).toBe(409);
		const body = JSON.parse(r.body);
		expect(body.error.type).toBe('has_dependents');
		expect(body.error.dependents).toContain(`polymorph ${fx.polymorph.label}`);
	});
});

describe('polymorph delete', () => {
	it('moves the polymorph with its dielectric entries, epsilon choice, measurements, reruns and estimates to the trash; restore puts back every row', async () => {
		const p = await polymorphWithEverything(`trash-${fx.tag}`);
		const before = await dump(POLYMORPH_TABLES);
		await deletePolymorph(db, editor, p.id);
		const gone = await dump(POLYMORPH_TABLES);
		expect(gone.polymorph.length).toBe(before.polymorph.length - 1);
		expect(gone.dielectric_entry.length).toBe(before.dielectric_entry.length - 2);
		const t = await trashEntry(p.id);
		expect(t.contents).toContain('2 dielectric entries');
		expect(t.contents).toContain('1 epsilon-in-use choice');
		expect(t.contents).toContain('1 measurement');
		expect(t.contents).toContain('1 screened rerun result');
		expect(t.deleted_by).toBe(editor.userId);
		const listed = await listTrash(db, fx.ws);
		expect(listed.find((i) => i.id === t.id)).toMatchObject({ entity: 'polymorph', label: `trash-${fx.tag}`, parentHref: `/w/${fx.ws}/molecules/${fx.molecule.id}`, restoredAt: null });
		await restoreFromTrash(db, owner, t.id);
		expect(await dump(POLYMORPH_TABLES)).toEqual(before);
		await expect(restoreFromTrash(db, owner, t.id)).rejects.toThrow('already restored');
		const log = await db.selectFrom('activity').select(['action', 'summary']).where('entity_id', '=', p.id).orderBy('id').execute();
		expect(log.map((l) => l.action)).toEqual(expect.arrayContaining(['delete', 'restore']));
	});

	it('links bundle records back to the polymorph on restore (the delete had cleared them)', async () => {
		const p = await createPolymorph(db, editor, fx.molecule.id, { label: `bundled-${fx.tag}`, spaceGroup: 'P1', a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, structureSource: '', notes: '' });
		const bundles = await db.selectFrom('bundle').select('id').where('polymorph_id', '=', p.id).execute();
		const made = bundles.length
			? bundles
			: [
					{
						id: (
							await db
								.insertInto('bundle')
								.values({ workspace_id: fx.ws, molecule_id: fx.molecule.id, polymorph_id: p.id, kind: 'screened', request: JSON.stringify({}), file_name: 'b.zip', sha256: '0'.repeat(64), size_bytes: 1, file_count: 1 })
								.returning('id')
								.executeTakeFirstOrThrow()
						).id
					}
				];
		await deletePolymorph(db, editor, p.id);
		expect(await db.selectFrom('bundle').select('polymorph_id').where('id', '=', made[0].id).executeTakeFirstOrThrow()).toEqual({ polymorph_id: null });
		const t = await trashEntry(p.id);
		expect(t.contents).toContain('1 bundle record unlinked');
		await restoreFromTrash(db, owner, t.id);
		expect(await db.selectFrom('bundle').select('polymorph_id').where('id', '=', made[0].id).executeTakeFirstOrThrow()).toEqual({ polymorph_id: p.id });
	});

	it('only owners restore, through the trash page action', async () => {
		const p = await createPolymorph(db, editor, fx.molecule.id, { label: `page-${fx.tag}`, spaceGroup: 'P1', a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, structureSource: '', notes: '' });
		await deletePolymorph(db, editor, p.id);
		const t = await trashEntry(p.id);
		const body = () => new URLSearchParams({ id: t.id });
		const asEditor = await probe(`/w/${fx.ws}/trash?/restore`, { method: 'POST', action: true, cookie: await signInCookie(fx.editor.email, PASSWORD), body: body() });
		expect(asEditor.status).toBe(403);
		const page = await probe(`/w/${fx.ws}/trash`, { cookie: await signInCookie(fx.viewer.email, PASSWORD) });
		expect(page.status).toBe(200);
		expect(page.body).toContain(`page-${fx.tag}`);
		const asOwner = await probe(`/w/${fx.ws}/trash?/restore`, { method: 'POST', action: true, cookie: await signInCookie(fx.owner.email, PASSWORD), body: body() });
		expect(asOwner.type).toBe('success');
		expect(await db.selectFrom('polymorph').select('label').where('id', '=', p.id).executeTakeFirst()).toEqual({ label: `page-${fx.tag}` });
	});
});

describe('tuning study delete', () => {
	it('takes its scan points to the trash; a restored study stays non-current when another became current', async () => {
		const s = await createStudy(db, editor, fx.molecule.id, study(`study-${fx.tag}`));
		const points = [0.1, 0.2, 0.3, 0.4, 0.5].map((g) => scanPointInput.parse({ gammaBohrInv: g, eNeutralHartree: -76 - g, eCationHartree: -75.6 - g * 0.9, eAnionHartree: -75.9 - g * 1.1, homoNeutralHartree: -0.3 - g * 0.2, lumoNeutralHartree: 0.05, homoAnionHartree: -0.05 - g * 0.1 }));
		await importPoints(db, editor, s.id, points);
		const nPoints = (await db.selectFrom('scan_point').select('id').where('study_id', '=', s.id).execute()).length;
		expect(nPoints).toBe(5);
		// Make it current the direct way (saving an analysis is the tuning feature's business).
		await db.updateTable('tuning_study').set({ is_current: true }).where('id', '=', s.id).execute();
		await deleteStudy(db, editor, s.id);
		expect(await db.selectFrom('scan_point').select('id').where('study_id', '=', s.id).execute()).toEqual([]);
		const t = await trashEntry(s.id);
		expect(t.contents).toContain('5 scan points');
		const other = await createStudy(db, editor, fx.molecule.id, study(`other-${fx.tag}`));
		await db.updateTable('tuning_study').set({ is_current: true }).where('id', '=', other.id).execute();
		const r = await restoreFromTrash(db, owner, t.id);
		expect(r.notes[0]).toContain(`other-${fx.tag} is the molecule's current study now`);
		expect(await db.selectFrom('tuning_study').select('is_current').where('id', '=', s.id).executeTakeFirstOrThrow()).toEqual({ is_current: false });
		expect((await db.selectFrom('scan_point').select('id').where('study_id', '=', s.id).execute()).length).toBe(5);
	});
});

describe('leaf records (dielectric entries, measurements, rerun results)', () => {
	it('go to the trash one by one and come back; the epsilon in use is refused with its reason', async () => {
		const p = await polymorphWithEverything(`leaves-${fx.tag}`);
		const entries = await db.selectFrom('dielectric_entry').select('id').where('polymorph_id', '=', p.id).orderBy('epsilon').execute();
		await expect(deleteDielectricEntry(db, editor, p.id, entries[0].id)).rejects.toThrow('epsilon in use');
		const before = await dump(POLYMORPH_TABLES);
		await deleteDielectricEntry(db, editor, p.id, entries[1].id);
		const m = await db.selectFrom('measurement').select('id').where('polymorph_id', '=', p.id).executeTakeFirstOrThrow();
		await deleteMeasurement(db, editor, p.id, m.id);
		const rr = await db.selectFrom('rerun_result').select('id').where('polymorph_id', '=', p.id).executeTakeFirstOrThrow();
		await deleteRerun(db, editor, p.id, rr.id);
		const trashed = await Promise.all([entries[1].id, m.id, rr.id].map(trashEntry));
		expect(trashed.map((t) => t.entity_type)).toEqual(['dielectric entry', 'measurement', 'rerun result']);
		expect(trashed.map((t) => t.parent_href)).toEqual([`/w/${fx.ws}/polymorphs/${p.id}`, `/w/${fx.ws}/polymorphs/${p.id}/levels`, `/w/${fx.ws}/polymorphs/${p.id}/levels`]);
		const log = await db.selectFrom('activity').select('summary').where('entity_id', '=', p.id).execute();
		expect(log.map((l) => l.summary)).toEqual(expect.arrayContaining([expect.stringContaining('screened rerun'), expect.stringContaining('UPS measurement')]));
		for (const t of trashed) await restoreFromTrash(db, owner, t.id);
		expect(await dump(POLYMORPH_TABLES)).toEqual(before);
	});

	it('a leaf whose polymorph is in the trash names the polymorph to restore first', async () => {
		const p = await polymorphWithEverything(`orphan-${fx.tag}`);
		const m = await db.selectFrom('measurement').select('id').where('polymorph_id', '=', p.id).executeTakeFirstOrThrow();
		await deleteMeasurement(db, editor, p.id, m.id);
		await deletePolymorph(db, editor, p.id);
		const err = await restoreFromTrash(db, owner, (await trashEntry(m.id)).id).catch((e) => e);
		expect(err).toBeInstanceOf(ValidationError);
		expect(err.message).toBe(`measurement UPS measurement of orphan-${fx.tag} belongs to polymorph orphan-${fx.tag}, which is in the trash: restore that first`);
	});

	it('a record of another workspace is not found', async () => {
		const p = await createPolymorph(db, editor, fx.molecule.id, { label: `foreign-${fx.tag}`, spaceGroup: 'P1', a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, structureSource: '', notes: '' });
		await deletePolymorph(db, editor, p.id);
		const outsider = { userId: fx.outsider.id, workspaceId: fx.outsider.personal, role: 'owner' as const };
		await expect(restoreFromTrash(db, outsider, (await trashEntry(p.id)).id)).rejects.toThrow('not found');
	});
});

describe('workspace delete', () => {
	it('deletes a workspace with molecules, studies and polymorphs once its name is typed (the one delete without a trash)', async () => {
		const ws = await createWorkspace(db, `Doomed ${fx.tag}`, fx.owner.id);
		const a = { userId: fx.owner.id, workspaceId: ws, role: 'owner' as const };
		const m = await createMolecule(db, a, { name: 'M', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' });
		await createPolymorph(db, a, m.id, { label: 'P', spaceGroup: 'P1', a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, structureSource: '', notes: '' });
		await createStudy(db, a, m.id, study('S'));
		await expect(deleteWorkspace(db, a, 'wrong name')).rejects.toThrow('to confirm');
		await deleteWorkspace(db, a, `Doomed ${fx.tag}`);
		expect(await db.selectFrom('workspace').select('id').where('id', '=', ws).execute()).toEqual([]);
	});
});
