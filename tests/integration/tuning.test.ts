// Tuning studies against the real PostgreSQL and the built server: imports are all or nothing, the
// API's bulk add is idempotent, exclusions and edits are logged, stale edits are refused.
// Scan data here are synthetic (smooth model functions with known roots), not engine output.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { DependentsError, StaleVersionError, ValidationError } from '../../src/lib/server/errors';
import { listActivity } from '../../src/lib/server/repo/activity';
import { deleteMolecule, getMolecule } from '../../src/lib/server/services/molecules';
import {
	analysisPoints,
	createStudy,
	getStudy,
	importPoints,
	listPoints,
	markCurrent,
	saveAnalysis,
	setPointExclusion,
	updatePoint,
	updateStudy
} from '../../src/lib/server/services/tuning';
import { tuningAnalysis } from '../../src/lib/science/tuning/tuning-analysis';
import { GRID, syntheticScan } from '../../src/lib/science/tuning/synthetic-scan.testdata';
import { appDb, PASSWORD, teamFixture } from './fixtures';
import { probe, signInCookie } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
let editorCookie: string;
let viewerCookie: string;
const actor = () => ({ userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const });
const studyInput = { name: 'alpha 0.2', engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'aug-cc-pVDZ', alpha: 0.2, objective: 'abs-sum' as const, notes: '' };

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	editorCookie = await signInCookie(fx.editor.email, PASSWORD);
	viewerCookie = await signInCookie(fx.viewer.email, PASSWORD);
});
afterAll(async () => db?.destroy());

describe('tuning studies: records', () => {
	it('freezes a copy of the molecule geometry and logs the creation', async () => {
		const s = await createStudy(db, actor(), fx.molecule.id, studyInput);
		const m = await getMolecule(db, fx.ws, fx.molecule.id);
		expect(s.geometryXyz).toBe(m.geometryXyz);
		expect(s.version).toBe(1);
		const log = await listActivity(db, fx.ws, { entityIds: [s.id] });
		expect(log[0].summary).toContain('added tuning study alpha 0.2');
	});

	it('imports all points or none: a duplicated gamma in row 3 stores nothing and names the row', async () => {
		const s = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'all or nothing' });
		const pts = syntheticScan(GRID);
		const bad = [pts[0], pts[1], { ...pts[2], gammaBohrInv: pts[0].gammaBohrInv }, ...pts.slice(3)];
		await expect(importPoints(db, actor(), s.id, bad)).rejects.toThrow(/^point 3, gammaBohrInv: gamma 0.05 bohr\^-1 duplicates point 1/);
		const nonFinite = [pts[0], { ...pts[1], eCationHartree: Number.NaN }];
		await expect(importPoints(db, actor(), s.id, nonFinite)).rejects.toBeInstanceOf(ValidationError);
		expect(await listPoints(db, s.id)).toHaveLength(0);
		expect((await getStudy(db, fx.ws, s.id)).version).toBe(1);
		const ok = await importPoints(db, actor(), s.id, pts);
		expect(ok.inserted).toBe(GRID.length);
		expect((await listPoints(db, s.id)).map((p) => p.gammaBohrInv)).toEqual(GRID);
		// A second import may not repeat a gamma the study already has.
		await expect(importPoints(db, actor(), s.id, [pts[4]])).rejects.toThrow(/already has a point at gamma 0.25/);
		expect(await listPoints(db, s.id)).toHaveLength(GRID.length);
	});

	it('logs an exclusion with before and after, and refuses a stale point edit', async () => {
		const s = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'exclusion log' });
		await importPoints(db, actor(), s.id, syntheticScan(GRID));
		const [p] = await listPoints(db, s.id);
		const ex = await setPointExclusion(db, actor(), p.id, p.version, true, 'SCF converged to an excited state');
		expect(ex.excluded).toBe(true);
		expect(ex.version).toBe(p.version + 1);
		const log = await listActivity(db, fx.ws, { entityIds: [p.id] });
		expect(log[0].summary).toContain('excluded the scan point at gamma 0.05');
		expect(log[0].before).toMatchObject({ excluded: false, excludedReason: '' });
		expect(log[0].after).toMatchObject({ excluded: true, excludedReason: 'SCF converged to an excited state' });
		// An edit from a page that read the old version is refused; nothing is overwritten.
		await expect(updatePoint(db, actor(), p.id, p.version, { eNeutralHartree: -1 })).rejects.toBeInstanceOf(StaleVersionError);
		const after = (await listPoints(db, s.id)).find((q) => q.id === p.id)!;
		expect(after.eNeutralHartree).toBe(p.eNeutralHartree);
		expect(after.excluded).toBe(true);
		await expect(updateStudy(db, actor(), s.id, 1, { notes: 'old page' })).rejects.toBeInstanceOf(StaleVersionError);
	});

	it('saves a result the stored input reproduces, and keeps one current study per molecule', async () => {
		const a = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'current A' });
		const b = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'current B', objective: 'square-sum' });
		const ia = await importPoints(db, actor(), a.id, syntheticScan(GRID));
		const ib = await importPoints(db, actor(), b.id, syntheticScan(GRID));
		await expect(markCurrent(db, actor(), a.id, ia.study.version)).rejects.toThrow(/save an analysis/);
		const pts = await listPoints(db, a.id);
		const saved = await saveAnalysis(db, actor(), a.id, ia.study.version, {
			objective: 'abs-sum',
			exclusions: [{ pointId: pts[9].id, version: pts[9].version, excluded: true, reason: 'test exclusion' }]
		});
		const again = tuningAnalysis(analysisPoints(await listPoints(db, a.id)), { objective: 'abs-sum', basisSet: 'aug-cc-pVDZ' });
		expect(saved.resultInputHash).toBe(again.inputHash);
		expect(saved.result!.result.optimum!.gammaBohrInv).toBe(again.result.optimum!.gammaBohrInv);
		expect(Math.abs(saved.result!.result.optimum!.gammaBohrInv - 0.213)).toBeLessThan(1e-4); // model root (synthetic data)
		expect(saved.result!.input.points[9].excluded).toBe(true);
		const ca = await markCurrent(db, actor(), a.id, saved.version);
		expect(ca.isCurrent).toBe(true);
		const sb = await saveAnalysis(db, actor(), b.id, ib.study.version, { objective: 'square-sum' });
		await markCurrent(db, actor(), b.id, sb.version);
		expect((await getStudy(db, fx.ws, a.id)).isCurrent).toBe(false);
		expect((await getStudy(db, fx.ws, b.id)).isCurrent).toBe(true);
		// The partial unique index refuses a second current study even if a bug tried.
		await expect(db.updateTable('tuning_study').set({ is_current: true }).where('id', '=', a.id).execute()).rejects.toThrow(/tuning_study_one_current/);
	});

	it('refuses to delete a molecule that still has tuning studies', async () => {
		const m = await getMolecule(db, fx.ws, fx.molecule.id);
		await expect(deleteMolecule(db, actor(), m.id, m.version)).rejects.toBeInstanceOf(DependentsError);
	});
});

describe('tuning studies over HTTP', () => {
	const api = (path: string) => `/api/v1/workspaces/${fx.ws}${path}`;
	const jsonReq = (cookie: string, body: unknown, headers: Record<string, string> = {}) => ({ method: 'POST', cookie, body: JSON.stringify(body), headers: { 'content-type': 'application/json', ...headers } });

	it('bulk add with an Idempotency-Key adds the points once, however often the job retries', async () => {
		const created = await probe(api('/studies'), jsonReq(editorCookie, { ...studyInput, name: 'idempotent', moleculeId: fx.molecule.id }));
		expect(created.status).toBe(201);
		const id = JSON.parse(created.body).id as string;
		const body = { points: syntheticScan(GRID.slice(0, 6)) };
		const first = await probe(api(`/studies/${id}/points`), jsonReq(editorCookie, body, { 'idempotency-key': 'job-42-attempt' }));
		expect(first.status).toBe(201);
		const retry = await probe(api(`/studies/${id}/points`), jsonReq(editorCookie, body, { 'idempotency-key': 'job-42-attempt' }));
		expect(retry.status).toBe(200);
		expect(JSON.parse(retry.body)).toMatchObject({ inserted: 6, replayed: true, pointIds: JSON.parse(first.body).pointIds });
		expect(await listPoints(db, id)).toHaveLength(6);
		const reused = await probe(api(`/studies/${id}/points`), jsonReq(editorCookie, { points: syntheticScan([0.7]) }, { 'idempotency-key': 'job-42-attempt' }));
		expect(reused.status).toBe(400);
		expect(JSON.parse(reused.body).error).toMatchObject({ type: 'validation', field: 'Idempotency-Key' });
		expect(await listPoints(db, id)).toHaveLength(6);
		const viewer = await probe(api(`/studies/${id}/points`), jsonReq(viewerCookie, body, { 'idempotency-key': 'viewer-try' }));
		expect(viewer.status).toBe(403);
	});

	it('a bad point in a bulk add stores nothing and the error names the point and field', async () => {
		const s = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'bulk bad' });
		const pts = syntheticScan(GRID.slice(0, 4));
		const r = await probe(api(`/studies/${s.id}/points`), jsonReq(editorCookie, { points: [...pts, { ...pts[1] }] }));
		expect(r.status).toBe(400);
		expect(JSON.parse(r.body).error.message).toMatch(/^point 5, gammaBohrInv: .*duplicates point 2/);
		const typed = await probe(api(`/studies/${s.id}/points`), jsonReq(editorCookie, { points: [{ gammaBohrInv: 0.1, eNeutralHartree: 'minus one' }] }));
		expect(typed.status).toBe(400);
		expect(JSON.parse(typed.body).error.type).toBe('validation');
		expect(await listPoints(db, s.id)).toHaveLength(0);
	});

	it('the page import refuses a table in the wrong unit, naming line and column, and stores nothing', async () => {
		const s = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'page import' });
		const text = 'gamma_bohr_inv,E_N_Ha,E_cation_Ha,E_anion_Ha,eps_homo_N_Ha,eps_lumo_N_Ha,eps_homo_anion_Ha\n0.1,-100.0,-99.7,-100.04,-0.30,-0.01,-0.04\n0.2,-100.1,-99.8,-100.14,-0.31,-0.02,-0.05\n';
		const mapping = JSON.stringify({ gammaBohrInv: 0, eNeutralHartree: 1, eCationHartree: 2, eAnionHartree: 3, homoNeutralHartree: 4, lumoNeutralHartree: 5, homoAnionHartree: 6 });
		const post = (energyUnit: string) =>
			probe(`/w/${fx.ws}/studies/${s.id}?/import`, { method: 'POST', cookie: editorCookie, action: true, body: new URLSearchParams({ text, mapping, energyUnit, gammaUnit: 'bohr^-1', version: '1' }) });
		const wrong = await post('eV');
		expect(wrong.status).toBe(400);
		expect(wrong.body).toMatch(/"line 2, column .{0,12}eps_homo_N_Ha.{0,12}: neutral HOMO -0.300 eV lies above -1 eV/);
		expect(wrong.body).not.toContain('line 2: line 2');
		expect(await listPoints(db, s.id)).toHaveLength(0);
		const right = await post('hartree');
		expect(right.type).toBe('success');
		expect(await listPoints(db, s.id)).toHaveLength(2);
	});

	it('API: stale If-Match on a study is refused with 412; the saved result is served with its version and hash', async () => {
		const s = await createStudy(db, actor(), fx.molecule.id, { ...studyInput, name: 'api result' });
		const i = await importPoints(db, actor(), s.id, syntheticScan(GRID));
		const stale = await probe(api(`/studies/${s.id}`), { method: 'PATCH', cookie: editorCookie, body: JSON.stringify({ notes: 'x' }), headers: { 'content-type': 'application/json', 'if-match': '"1"' } });
		expect(stale.status).toBe(412);
		expect(JSON.parse(stale.body).error.type).toBe('stale_version');
		// Before a save, the result route answers a fresh analysis of the current points, marked unsaved.
		const unsaved = await probe(api(`/studies/${s.id}/result`), { cookie: viewerCookie });
		expect(unsaved.status).toBe(200);
		expect(JSON.parse(unsaved.body).saved).toBe(false);
		expect(Math.abs(JSON.parse(unsaved.body).result.optimum.gammaBohrInv - 0.213)).toBeLessThan(1e-4);
		await saveAnalysis(db, actor(), s.id, i.study.version, { objective: 'abs-sum' });
		const r = await probe(api(`/studies/${s.id}/result`), { cookie: viewerCookie });
		expect(r.status).toBe(200);
		const j = JSON.parse(r.body);
		expect(j.saved).toBe(true);
		expect(j.analysisVersion).toBe('tuning-analysis/1');
		expect(j.inputHash).toMatch(/^[0-9a-f]{16}$/);
		expect(Math.abs(j.result.optimum.gammaBohrInv - 0.213)).toBeLessThan(1e-4);
		const list = JSON.parse((await probe(api(`/studies?moleculeId=${fx.molecule.id}`), { cookie: viewerCookie })).body);
		expect(list.items.find((x: { id: string }) => x.id === s.id).gammaStarBohrInv).toBeCloseTo(j.result.optimum.gammaBohrInv, 12);
	});
});
