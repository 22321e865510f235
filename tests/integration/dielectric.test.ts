// Dielectric feature against the real PostgreSQL and the built server: CIF import is all or nothing,
// bad tensors store nothing, the epsilon in use is versioned and its changes are logged.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { DependentsError, StaleVersionError, ValidationError } from '../../src/lib/server/errors';
import { listActivity } from '../../src/lib/server/repo/activity';
import { getStoredCif, importPolymorphFromCif } from '../../src/lib/server/services/cif-import';
import { addDielectricEntry, chooseEpsilon, deleteDielectricEntry, getEpsilonInUse, listDielectricEntries } from '../../src/lib/server/services/dielectric';
import { deletePolymorph, getPolymorph } from '../../src/lib/server/services/polymorphs';
import { dielectricEntryInput } from '../../src/lib/schemas/dielectric';
import { appDb, PASSWORD, teamFixture } from './fixtures';
import { probe, signInCookie } from './http-helpers';

const fixture = (name: string) => readFileSync(new URL(`../../src/lib/formats/fixtures/${name}`, import.meta.url), 'utf8');
// Triclinic published structure: Stewart, McDonald & West, Org. Lett. 13 (2011) 720 (COD 1501936).
const TRICLINIC = fixture('cod-1501936.cif');

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
let editor: { userId: string; workspaceId: string; role: 'editor' };

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	editor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' };
});
afterAll(async () => db?.destroy());

/** Rows in the workspace that a refused write must not have added. */
async function counts() {
	const n = async (t: 'polymorph' | 'polymorph_cif' | 'dielectric_entry' | 'polymorph_epsilon' | 'activity') =>
		Number((await db.selectFrom(t).select((eb) => eb.fn.countAll().as('n')).where('workspace_id', '=', fx.ws).executeTakeFirstOrThrow()).n);
	return { polymorph: await n('polymorph'), cif: await n('polymorph_cif'), entries: await n('dielectric_entry'), choice: await n('polymorph_epsilon'), activity: await n('activity') };
}

async function refused(fn: () => Promise<unknown>): Promise<ValidationError> {
	const before = await counts();
	let caught: unknown;
	try {
		await fn();
	} catch (e) {
		caught = e;
	}
	expect(caught).toBeInstanceOf(ValidationError);
	expect(await counts()).toEqual(before);
	return caught as ValidationError;
}

describe('CIF import', () => {
	it('creates the polymorph and stores the file in one transaction', async () => {
		const r = await importPolymorphFromCif(db, editor, { moleculeId: fx.molecule.id, label: 'triclinic form', fileName: 'cod-1501936.cif', cif: TRICLINIC, notes: '' });
		expect(r.polymorph.label).toBe('triclinic form');
		expect(r.polymorph.spaceGroup).toBe('P -1 (No. 2)');
		expect(r.polymorph.z).toBe(2);
		expect(Math.abs(r.polymorph.derived.volumeA3 - 860.57)).toBeLessThan(0.05);
		const stored = await getStoredCif(db, fx.ws, r.polymorph.id);
		expect(stored).toMatchObject({ fileName: 'cod-1501936.cif', blockName: '1501936', atomSiteCount: 51 });
		expect(stored?.text).toBe(TRICLINIC);
		// The fixture's molecule is water: the formula mismatch is reported, not refused.
		expect(r.warnings.some((w) => w.includes('C21H26O4'))).toBe(true);
		const log = await listActivity(db, fx.ws, { entityIds: [r.polymorph.id] });
		expect(log[0].action).toBe('cif_import');
	});

	it('a broken loop is refused naming the line, and nothing is stored', async () => {
		const broken = TRICLINIC.replace('O2 O 0.25690(11) 0.06668(12) 0.48190(6) 0.0318(2) Uani 1 1 d .', 'O2 O 0.25690(11) 0.06668(12) 0.48190(6) 0.0318(2) Uani 1 1 d');
		const e = await refused(() => importPolymorphFromCif(db, editor, { moleculeId: fx.molecule.id, label: '', fileName: 'broken.cif', cif: broken, notes: '' }));
		// The loop_ opening the atom-site loop is the line before _atom_site_label.
		expect(e.line).toBe(TRICLINIC.split('\n').indexOf('_atom_site_label'));
		expect(e.message).toMatch(/^line \d+: loop_ has 11 tags but \d+ values .*not a multiple of 11 \(in broken\.cif\)$/);
	});

	it('a cell angle of 0 or 200 degrees is refused, and nothing is stored', async () => {
		for (const angle of ['0', '200']) {
			const bad = TRICLINIC.replace('_cell_angle_gamma                77.7988(4)', `_cell_angle_gamma                ${angle}`);
			const e = await refused(() => importPolymorphFromCif(db, editor, { moleculeId: fx.molecule.id, label: '', fileName: 'bad.cif', cif: bad, notes: '' }));
			expect(e.message).toMatch(/the cell is not physical: .*gamma/);
			expect(e.line).toBeGreaterThan(0);
		}
	});

	it('over HTTP: a viewer is refused, an editor posts the CIF as text and gets 201; errors carry the line', async () => {
		const path = `/api/v1/workspaces/${fx.ws}/polymorphs/from-cif?moleculeId=${fx.molecule.id}&fileName=t.cif&label=via%20API`;
		const viewer = await probe(path, { method: 'POST', cookie: await signInCookie(fx.viewer.email, PASSWORD), body: TRICLINIC, headers: { 'content-type': 'chemical/x-cif' } });
		expect(viewer.status).toBe(403);
		const cookie = await signInCookie(fx.editor.email, PASSWORD);
		const ok = await probe(path, { method: 'POST', cookie, body: TRICLINIC, headers: { 'content-type': 'chemical/x-cif' } });
		expect(ok.status).toBe(201);
		expect(JSON.parse(ok.body).polymorph.label).toBe('via API');
		const bad = await probe(`/api/v1/workspaces/${fx.ws}/polymorphs/from-cif`, {
			method: 'POST',
			cookie,
			body: JSON.stringify({ moleculeId: fx.molecule.id, cif: 'data_x\n_cell_length_a 5\nloop_\n_a\n_b\n1 2 3\n' }),
			headers: { 'content-type': 'application/json' }
		});
		expect(bad.status).toBe(400);
		expect(JSON.parse(bad.body).error).toMatchObject({ type: 'validation', field: 'cif', line: 3 });
	});
});

describe('dielectric entries and the epsilon in use', () => {
	let polymorphId: string;
	beforeAll(async () => {
		polymorphId = (await importPolymorphFromCif(db, editor, { moleculeId: fx.molecule.id, label: 'for entries', fileName: 'x.cif', cif: TRICLINIC, notes: '' })).polymorph.id;
	});
	const add = (raw: Record<string, unknown>) => addDielectricEntry(db, editor, polymorphId, dielectricEntryInput.parse(raw));

	it('a tensor with 8 numbers, an asymmetric one and an indefinite one are refused; nothing is stored', async () => {
		expect((await refused(() => add({ kind: 'tensor', tensor: '3 0 0 3 0 0 3 0' }))).message).toMatch(/^line 1: found 8 values/);
		expect((await refused(() => add({ kind: 'tensor', tensor: '3 0.9 0\n0 3 0\n0 0 3' }))).message).toMatch(/^tensor is not symmetric/);
		expect((await refused(() => add({ kind: 'tensor', tensor: '1 2 0\n2 1 0\n0 0 3' }))).message).toMatch(/^tensor is not positive definite/);
		expect((await refused(() => add({ kind: 'clausius_mossotti', polarizability: '3e-39', unit: 'A3' }))).field).toBe('unit');
		expect((await refused(() => add({ kind: 'clausius_mossotti', polarizability: '200', unit: 'A3' }))).message).toMatch(/^Clausius–Mossotti has no solution/);
	});

	it('stores tensor, refractive index and CM entries with who added them; choosing is versioned and logged', async () => {
		const tensor = await add({ kind: 'tensor', tensor: '3.1,0.05,0\n0.05,2.8,0.1\n0,0.1,4.2', method: 'linear response', engine: 'invented run' });
		const n = await add({ kind: 'refractive_index', refractiveIndex: 1.75, wavelengthNm: 633 });
		const cm = await add({ kind: 'clausius_mossotti', polarizability: 40, unit: 'A3' });
		const list = await listDielectricEntries(db, fx.ws, polymorphId);
		expect(list.map((e) => e.kind)).toEqual(['tensor', 'refractive_index', 'clausius_mossotti']);
		expect(list[0].createdBy).toBe('editor');
		expect(tensor.epsilon).toBeCloseTo((3.1 + 2.8 + 4.2) / 3, 12);
		expect(n.epsilon).toBeCloseTo(1.75 ** 2, 12);
		expect(cm.input.volumePerMoleculeA3).toBeCloseTo((await getPolymorph(db, fx.ws, polymorphId)).derived.volumePerMoleculeA3, 10);

		const first = await chooseEpsilon(db, editor, polymorphId, { entryId: tensor.id, reason: 'linear-response tensor; trace/3' });
		expect(first.version).toBe(1);
		await expect(chooseEpsilon(db, editor, polymorphId, { entryId: n.id, reason: 'measured', version: undefined })).rejects.toThrow(ValidationError);
		await expect(chooseEpsilon(db, editor, polymorphId, { entryId: n.id, reason: 'measured', version: 7 })).rejects.toThrow(StaleVersionError);
		const second = await chooseEpsilon(db, editor, polymorphId, { entryId: n.id, reason: 'measured at 633 nm', version: 1 });
		expect(second).toMatchObject({ entryId: n.id, version: 2, reason: 'measured at 633 nm' });

		const log = (await listActivity(db, fx.ws, { entityIds: [polymorphId] })).filter((a) => a.action === 'choose_epsilon');
		expect(log).toHaveLength(2);
		expect(log[0].before).toMatchObject({ epsilonEntry: tensor.id, reason: 'linear-response tensor; trace/3' });
		expect(log[0].after).toMatchObject({ epsilonEntry: n.id, epsilon: 3.0625, reason: 'measured at 633 nm' });
		expect(log[1].before).toMatchObject({ epsilonEntry: null });

		// An entry of another polymorph cannot be chosen.
		const other = await addDielectricEntry(db, editor, fx.polymorph.id, dielectricEntryInput.parse({ kind: 'scalar', epsilon: 3 }));
		await expect(chooseEpsilon(db, editor, polymorphId, { entryId: other.id, reason: 'x', version: 2 })).rejects.toThrow('does not belong to this polymorph');

		// The entry in use cannot be deleted; another can, and a stale version is refused.
		await expect(deleteDielectricEntry(db, editor, polymorphId, n.id)).rejects.toThrow(DependentsError);
		await expect(deleteDielectricEntry(db, editor, polymorphId, cm.id, 5)).rejects.toThrow(StaleVersionError);
		await deleteDielectricEntry(db, editor, polymorphId, cm.id, 1);
		expect((await getEpsilonInUse(db, fx.ws, polymorphId))?.entry.epsilon).toBeCloseTo(3.0625, 12);
	});

	it('over HTTP: choosing the epsilon needs the editor role; a viewer reads it', async () => {
		const entries = await listDielectricEntries(db, fx.ws, polymorphId);
		const url = `/api/v1/workspaces/${fx.ws}/polymorphs/${polymorphId}/epsilon`;
		const viewerCookie = await signInCookie(fx.viewer.email, PASSWORD);
		const body = JSON.stringify({ entryId: entries[0].id, reason: 'back to the tensor', version: 2 });
		expect((await probe(url, { method: 'PUT', cookie: viewerCookie, body, headers: { 'content-type': 'application/json' } })).status).toBe(403);
		const put = await probe(url, { method: 'PUT', cookie: await signInCookie(fx.editor.email, PASSWORD), body, headers: { 'content-type': 'application/json' } });
		expect(put.status).toBe(200);
		const got = JSON.parse((await probe(url, { cookie: viewerCookie })).body);
		expect(got.epsilonInUse).toMatchObject({ entryId: entries[0].id, version: 3 });
	});

	it('deleting the polymorph removes its CIF, entries and choice', async () => {
		const p = await getPolymorph(db, fx.ws, polymorphId);
		await deletePolymorph(db, editor, polymorphId, p.version);
		for (const t of ['polymorph_cif', 'dielectric_entry', 'polymorph_epsilon'] as const) {
			const left = await db.selectFrom(t).select('polymorph_id').where('polymorph_id', '=', polymorphId).execute();
			expect(left).toEqual([]);
		}
	});
});
