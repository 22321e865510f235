// No lost writes: concurrent edits and bulk imports through the built server against the real
// PostgreSQL. Each case fires its requests at once (Promise.all over fetch) and then reads the database:
// exactly one of several edits of the same version wins and the others are told their copy is stale;
// parallel imports add every point once; a retried import with the same Idempotency-Key adds nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { syntheticScan } from '../../src/lib/science/tuning/synthetic-scan.testdata';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { createStudy } from '../../src/lib/server/services/tuning';
import { appDb, teamFixture, WATER_XYZ } from './fixtures';
import { probe } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
let headers: Record<string, string>;
const N = 12;

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	const t = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'concurrency', role: 'editor', expiresInDays: 1 });
	headers = { authorization: `Bearer ${t.token}`, 'content-type': 'application/json' };
});
afterAll(async () => db?.destroy());

const api = (path: string, method: string, body?: unknown, extra: Record<string, string> = {}) =>
	probe(`/api/v1/workspaces/${fx.ws}${path}`, { method, headers: { ...headers, ...extra }, body: body === undefined ? undefined : JSON.stringify(body) });

async function newStudy(name: string) {
	return createStudy(db, { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' }, fx.molecule.id, { name, engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'def2-SVP', alpha: 0.2, objective: 'abs-sum', notes: '' });
}

const statusCounts = (rs: { status: number }[]) => rs.reduce<Record<number, number>>((m, r) => ({ ...m, [r.status]: (m[r.status] ?? 0) + 1 }), {});

describe('concurrent edits of one record', () => {
	it.each([
		['molecule', () => `/molecules/${fx.molecule.id}`, (i: number) => ({ notes: `edit ${i}` }), 'molecule', 'notes'],
		['polymorph', () => `/polymorphs/${fx.polymorph.id}`, (i: number) => ({ notes: `edit ${i}` }), 'polymorph', 'notes']
	] as const)(`%s: ${N} editors send the same version at once; one wins, the rest get 412, nothing is overwritten`, async (_label, path, body, table, column) => {
		const before = await db.selectFrom(table).select(['version', column]).where('id', '=', path().split('/')[2]).executeTakeFirstOrThrow();
		const rs = await Promise.all(Array.from({ length: N }, (_, i) => api(path(), 'PATCH', body(i), { 'if-match': `"${before.version}"` })));
		expect(statusCounts(rs)).toEqual({ 200: 1, 412: N - 1 });
		const winner = rs.findIndex((r) => r.status === 200);
		const after = await db.selectFrom(table).select(['version', column]).where('id', '=', path().split('/')[2]).executeTakeFirstOrThrow();
		expect(after.version).toBe(before.version + 1);
		expect(after[column]).toBe(`edit ${winner}`);
		for (const r of rs.filter((x) => x.status === 412)) expect(JSON.parse(r.body).error.type).toBe('stale_version');
	});

	it('an edit and a delete of the same version at once: one of them wins, the other is refused', async () => {
		const m = JSON.parse((await api('/molecules', 'POST', { name: `Race ${fx.tag}`, geometryXyz: WATER_XYZ })).body);
		const [edit, del] = await Promise.all([api(`/molecules/${m.id}`, 'PATCH', { notes: 'late edit' }, { 'if-match': `"${m.version}"` }), api(`/molecules/${m.id}`, 'DELETE', undefined, { 'if-match': `"${m.version}"` })]);
		const row = await db.selectFrom('molecule').select(['version', 'notes']).where('id', '=', m.id).executeTakeFirst();
		if (edit.status === 200) {
			expect([409, 412]).toContain(del.status);
			expect(row?.notes).toBe('late edit');
		} else {
			expect([del.status, edit.status]).toEqual([204, expect.any(Number)]);
			expect([404, 412]).toContain(edit.status);
			expect(row).toBeUndefined();
		}
	});
});

describe('concurrent bulk imports into one study', () => {
	it(`${N} imports of different gammas at once: every point stored once, the study version moves once per import`, async () => {
		const s = await newStudy(`parallel ${fx.tag}`);
		const batches = Array.from({ length: N }, (_, i) => syntheticScan(Array.from({ length: 10 }, (_, k) => Number((0.05 + 0.001 * (i * 10 + k)).toFixed(4)))));
		const rs = await Promise.all(batches.map((points) => api(`/studies/${s.id}/points`, 'POST', { points })));
		expect(statusCounts(rs)).toEqual({ 201: N });
		const stored = await db.selectFrom('scan_point').select('gamma_bohr_inv').where('study_id', '=', s.id).execute();
		expect(stored).toHaveLength(N * 10);
		expect(new Set(stored.map((p) => p.gamma_bohr_inv)).size).toBe(N * 10);
		const v = await db.selectFrom('tuning_study').select('version').where('id', '=', s.id).executeTakeFirstOrThrow();
		expect(v.version).toBe(s.version + N);
	});

	it(`${N} imports of the same gammas at once: exactly one is stored, the others are refused as duplicates`, async () => {
		const s = await newStudy(`overlap ${fx.tag}`);
		const points = syntheticScan([0.1, 0.2, 0.3, 0.4]);
		const rs = await Promise.all(Array.from({ length: N }, () => api(`/studies/${s.id}/points`, 'POST', { points })));
		expect(statusCounts(rs)).toEqual({ 201: 1, 400: N - 1 });
		for (const r of rs.filter((x) => x.status === 400)) expect(JSON.parse(r.body).error.message).toMatch(/already has a point at gamma/);
		expect(await db.selectFrom('scan_point').select('id').where('study_id', '=', s.id).execute()).toHaveLength(4);
	});

	it(`a job retried ${N} times at once with one Idempotency-Key stores its points once; every answer is the first one`, async () => {
		const s = await newStudy(`retry ${fx.tag}`);
		const points = syntheticScan([0.15, 0.25, 0.35]);
		const rs = await Promise.all(Array.from({ length: N }, () => api(`/studies/${s.id}/points`, 'POST', { points }, { 'idempotency-key': `job-${fx.tag}` })));
		expect(statusCounts(rs)).toEqual({ 201: 1, 200: N - 1 });
		const bodies = rs.map((r) => JSON.parse(r.body));
		const first = bodies.find((b) => !b.replayed);
		for (const b of bodies.filter((x) => x.replayed)) expect(b.pointIds).toEqual(first.pointIds);
		expect(await db.selectFrom('scan_point').select('id').where('study_id', '=', s.id).execute()).toHaveLength(3);
	});

	it(`${N} molecules created at once are all stored, each once`, async () => {
		const names = Array.from({ length: N }, (_, i) => `Parallel ${fx.tag} ${i}`);
		const rs = await Promise.all(names.map((name) => api('/molecules', 'POST', { name, geometryXyz: WATER_XYZ })));
		expect(statusCounts(rs)).toEqual({ 201: N });
		const rows = await db.selectFrom('molecule').select('name').where('workspace_id', '=', fx.ws).where('name', 'like', `Parallel ${fx.tag} %`).execute();
		expect(rows.map((r) => r.name).sort()).toEqual([...names].sort());
	});
});
