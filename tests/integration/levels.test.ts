// Solid-state levels over the API: from the molecule's current tuned study and the polymorph's epsilon
// in use, computed by the same pure routine the page uses; missing inputs get specific messages.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { GRID, syntheticScan } from '../../src/lib/science/tuning/synthetic-scan.testdata';
import { solidStateEstimate } from '../../src/lib/science/screening';
import { dielectricEntryInput } from '../../src/lib/schemas/dielectric';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { addDielectricEntry, chooseEpsilon } from '../../src/lib/server/services/dielectric';
import { createStudy, importPoints, markCurrent, saveAnalysis } from '../../src/lib/server/services/tuning';
import { listEstimates, saveEstimate } from '../../src/lib/server/services/estimates';
import { appDb, teamFixture } from './fixtures';
import { probe } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
let token: string;
const auth = () => ({ authorization: `Bearer ${token}`, 'content-type': 'application/json' });
const url = (path: string) => `/api/v1/workspaces/${fx.ws}/polymorphs/${fx.polymorph.id}${path}`;

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	token = (await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'levels', role: 'editor', expiresInDays: 1 })).token;
});
afterAll(async () => db?.destroy());

describe('levels API', () => {
	it('says what is missing: first the tuned study, then the epsilon in use', async () => {
		const r = await probe(url('/levels'), { headers: auth() });
		expect(r.status).toBe(400);
		expect(JSON.parse(r.body).error.message).toMatch(/no tuned gas-phase parameters .*no tuning study of this molecule is marked current/);

		const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
		const s = await createStudy(db, actor, fx.molecule.id, { name: 'levels test', engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'aug-cc-pVDZ', alpha: 0.2, objective: 'abs-sum', notes: '' });
		const i = await importPoints(db, actor, s.id, syntheticScan(GRID));
		const saved = await saveAnalysis(db, actor, s.id, i.study.version, { objective: 'abs-sum' });
		await markCurrent(db, actor, s.id, saved.version);
		const r2 = await probe(url('/levels'), { headers: auth() });
		expect(r2.status).toBe(400);
		expect(JSON.parse(r2.body).error.field).toBe('epsilon');
	});

	it('computes the estimate from the study and the epsilon in use, as the pure routine does', async () => {
		const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
		const entry = await addDielectricEntry(db, actor, fx.polymorph.id, dielectricEntryInput.parse({ kind: 'scalar', frequency: 'electronic', epsilon: 3.2, method: 'test' }));
		await chooseEpsilon(db, actor, fx.polymorph.id, { entryId: entry.id, reason: 'test', version: undefined });
		const r = await probe(url('/levels'), { headers: auth() });
		expect(r.status, r.body).toBe(200);
		const j = JSON.parse(r.body);
		expect(j.epsilonSource).toBe('epsilon in use');
		const expected = solidStateEstimate(j.input);
		expect(j.input.epsilon).toBe(3.2);
		expect(j.estimate.gapSolidEv).toBeCloseTo(expected.gapSolidEv, 12);
		expect(j.estimate.beta).toBeCloseTo(1 / 3.2 - 0.2, 12);
		expect(j.cautions).toMatch(/model estimates/);
		const override = JSON.parse((await probe(url('/levels?epsilon=4&radius=5'), { headers: auth() })).body);
		// Born, a = 5 Å, eps = 4: 14.399645478/10 × 0.75 = 1.07997 eV (hand arithmetic, CODATA 2018)
		expect(override.estimate.pPlusEv).toBeCloseTo(1.0799734, 6);
	});

	it('sweeps epsilon with the gap shrinking monotonically, and refuses epsilon < 1', async () => {
		const j = JSON.parse((await probe(url('/levels/sweep?from=1&to=4&step=0.5'), { headers: auth() })).body);
		expect(j.rows.map((x: { epsilon: number }) => x.epsilon)).toEqual([1, 1.5, 2, 2.5, 3, 3.5, 4]);
		for (let k = 1; k < j.rows.length; k++) expect(j.rows[k].gapSolidEv).toBeLessThan(j.rows[k - 1].gapSolidEv);
		const bad = await probe(url('/levels/sweep?epsilons=0.5,2'), { headers: auth() });
		expect(bad.status).toBe(400);
		expect(JSON.parse(bad.body).error.message).toMatch(/epsilon/);
	});

	it('stores measurements and typed rerun results', async () => {
		const m = await probe(url('/measurements'), { method: 'POST', headers: auth(), body: JSON.stringify({ ipEv: 5.2, eaEv: 3.0, opticalGapEv: 1.9, method: 'UPS / LEIPS' }) });
		expect(m.status, m.body).toBe(201);
		// transport gap = 5.2 - 3.0 = 2.2; exciton binding = 2.2 - 1.9 = 0.3 eV
		expect(JSON.parse(m.body).excitonBindingEv).toBeCloseTo(0.3, 12);
		const rr = await probe(url('/reruns'), { method: 'POST', headers: auth(), body: JSON.stringify({ results: [{ epsilon: 3.2, alpha: 0.2, gammaBohrInv: 0.21, homoHartree: -0.2, lumoHartree: -0.1 }] }) });
		expect(rr.status, rr.body).toBe(201);
		expect(JSON.parse(rr.body).items[0].ipEv).toBeCloseTo(0.2 * 27.211386245988, 9);
		const inEv = await probe(url('/reruns'), { method: 'POST', headers: auth(), body: JSON.stringify({ results: [{ epsilon: 3.2, alpha: 0.2, gammaBohrInv: 0.21, homoHartree: -5.4 }] }) });
		expect(inEv.status).toBe(400);
		expect(JSON.parse(inEv.body).error.message).toMatch(/was it given in eV/);
	});

	it('a saved estimate records its sources and turns stale when the epsilon in use changes', async () => {
		const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
		const saved = await saveEstimate(db, actor, fx.polymorph.id, 'bulk, eps in use', {});
		expect(saved.sources.epsilon).toBe(3.2);
		let [first] = await listEstimates(db, fx.ws, fx.polymorph.id);
		expect(first.id).toBe(saved.id);
		expect(first.staleReasons).toEqual([]);
		const other = await addDielectricEntry(db, actor, fx.polymorph.id, dielectricEntryInput.parse({ kind: 'scalar', frequency: 'electronic', epsilon: 3.6, method: 'remeasured' }));
		const current = await db.selectFrom('polymorph_epsilon').select('version').where('polymorph_id', '=', fx.polymorph.id).executeTakeFirstOrThrow();
		await chooseEpsilon(db, actor, fx.polymorph.id, { entryId: other.id, reason: 'newer value', version: current.version });
		[first] = await listEstimates(db, fx.ws, fx.polymorph.id);
		expect(first.staleReasons).toContain('another epsilon is now in use');
		expect(first.result.gapSolidEv).toBeCloseTo(saved.result.gapSolidEv, 12);
		expect(first.current!.gapSolidEv).toBeLessThan(saved.result.gapSolidEv);
	});
});
