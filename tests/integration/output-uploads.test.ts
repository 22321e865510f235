// Engine outputs in two steps over the API: upload -> preview (nothing stored) -> confirm (one
// transaction) or discard. Outputs are the real NWChem 7.0.2 SO2 runs in
// src/lib/formats/decks/fixtures (alpha 0.2, aug-cc-pVDZ; see the README there), placed beside the decks
// of a scan bundle built by the API, as a user would after running it.
import JSZip from 'jszip';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import so2G02 from '../../src/lib/formats/decks/fixtures/so2_g0p2000.out?raw';
import so2G03 from '../../src/lib/formats/decks/fixtures/so2_g0p3000.out?raw';
import so2G04 from '../../src/lib/formats/decks/fixtures/so2_g0p4000.out?raw';
import screenedOut from '../../src/lib/formats/decks/fixtures/so2_g0p3000_e3p0000.out?raw';
import { scanPointFromOutput } from '../../src/lib/formats/bundle/so2.testdata';
import type { Db } from '../../src/lib/server/db/create-db';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { importPoints, createStudy, listPoints } from '../../src/lib/server/services/tuning';
import { listReruns } from '../../src/lib/server/services/reruns';
import { createMolecule } from '../../src/lib/server/services/molecules';
import { appDb, teamFixture } from './fixtures';
import { requireEnv } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
let editor: string;
let viewer: string;
let bundleZip: Uint8Array;
let so2Id: string;
// SO2 at the fixtures' geometry (r(S-O) = 1.4308 Å, O-S-O 119.33°; decks/fixtures/README.md).
const SO2_XYZ = '3\nsulfur dioxide\nS 0.0000000000 0.0000000000 0.0000000000\nO 1.2349051531 0.0000000000 -0.7226326196\nO -1.2349051531 0.0000000000 -0.7226326196\n';
const OUTPUTS: Record<string, string> = { '0.2': so2G02, '0.3': so2G03, '0.4': so2G04 };

const base = () => requireEnv('APP_URL');
const call = (token: string, method: string, path: string, body?: Uint8Array, type = 'application/zip') =>
	fetch(`${base()}/api/v1/workspaces/${path}`, { method, headers: { authorization: `Bearer ${token}`, ...(body ? { 'content-type': type } : {}) }, body: body ? Buffer.from(body) : undefined });

/** The energies the tuning module needs, read from a fixture with the project's output reader. */
function fixturePoint(text: string) {
	const { gammaBohrInv: _g, ...energies } = scanPointFromOutput(text, 0);
	return energies;
}

async function newStudy(ws = fx.ws, userId = fx.owner.id, moleculeId = so2Id, alpha = 0.2) {
	const actor = { userId, workspaceId: ws, role: 'owner' as const };
	return createStudy(db, actor, moleculeId, { name: `uploads ${Math.random().toString(36).slice(2, 7)}`, engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'aug-cc-pVDZ', alpha, objective: 'abs-sum', notes: '' });
}
const studyVersion = async (id: string) => (await db.selectFrom('tuning_study').select('version').where('id', '=', id).executeTakeFirstOrThrow()).version;
const preview = async (studyId: string, token = editor) => {
	const r = await call(token, 'POST', `${fx.ws}/studies/${studyId}/outputs?name=so2-scan.zip`, bundleZip);
	return { status: r.status, body: await r.json() };
};

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	editor = (await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'uploads', role: 'editor', expiresInDays: 1 })).token;
	viewer = (await createApiToken(db, fx.viewer.id, { workspaceId: fx.ws, name: 'read', role: 'viewer', expiresInDays: 1 })).token;
	so2Id = (await createMolecule(db, { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' }, { name: 'SO2', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: SO2_XYZ, smiles: '', notes: '' })).id;
	// The scan bundle as the API builds it (one deck per gamma with the three states, like the fixtures)...
	const r = await fetch(`${base()}/api/v1/workspaces/${fx.ws}/bundles`, {
		method: 'POST',
		headers: { authorization: `Bearer ${editor}`, 'content-type': 'application/json' },
		body: JSON.stringify({ moleculeId: so2Id, alpha: 0.2, tuningGammas: [0.2, 0.3, 0.4], tuningLayout: 'combined', basis: 'aug-cc-pvdz' })
	});
	expect(r.status, await r.clone().text()).toBe(201);
	const zip = await JSZip.loadAsync(new Uint8Array(await r.arrayBuffer()));
	// ... with each output put beside its deck, under the name the manifest expects.
	const manifestPath = Object.keys(zip.files).find((n) => n.endsWith('manifest.json'))!;
	const root = manifestPath.slice(0, -'manifest.json'.length);
	const manifest = JSON.parse(await zip.file(manifestPath)!.async('string'));
	for (const f of manifest.files.filter((x: { role: string }) => x.role === 'deck')) zip.file(`${root}${f.deck.output}`, OUTPUTS[String(f.deck.gammaBohrInv)]);
	bundleZip = await zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE' });
});
afterAll(async () => db?.destroy());

describe('output uploads: preview, then confirm', () => {
	it('the preview lists what each file fills and stores nothing; confirm stores the three gammas', async () => {
		const s = await newStudy();
		const v0 = await studyVersion(s.id);
		const p = await preview(s.id);
		expect(p.status, JSON.stringify(p.body)).toBe(201);
		expect(p.body.scanPoints.map((x: { point: { gammaBohrInv: number }; status: string }) => [x.point.gammaBohrInv, x.status])).toEqual([[0.2, 'new'], [0.3, 'new'], [0.4, 'new']]);
		expect(p.body.outputs.find((o: { file: string }) => o.file.endsWith('g0p3000/neutral-cation-anion.out')).fills).toEqual([
			{ gammaBohrInv: 0.3, state: 'neutral' },
			{ gammaBohrInv: 0.3, state: 'cation' },
			{ gammaBohrInv: 0.3, state: 'anion' }
		]);
		expect(p.body.missing).toEqual([]);
		expect(p.body.failed).toEqual([]);
		expect(p.body.summary).toMatchObject({ new: 3, toStore: 3, conflicts: 0 });
		expect(p.body.sha256).toMatch(/^[0-9a-f]{64}$/);
		expect(await listPoints(db, s.id)).toEqual([]);
		expect(await studyVersion(s.id)).toBe(v0);

		const c = await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`);
		const body = await c.json();
		expect(c.status, JSON.stringify(body)).toBe(200);
		expect(body).toMatchObject({ inserted: 3, filled: 0, skipped: 0 });
		const stored = await listPoints(db, s.id);
		expect(stored.map((x) => x.gammaBohrInv)).toEqual([0.2, 0.3, 0.4]);
		expect(stored[1]).toMatchObject(fixturePoint(so2G03));
	});

	it('a second confirm is refused and stores nothing twice; the same upload again is "already stored"', async () => {
		const s = await newStudy();
		const p = await preview(s.id);
		expect((await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`)).status).toBe(200);
		const again = await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`);
		expect(again.status).toBe(409);
		expect((await again.json()).error.message).toMatch(/already confirmed at .* UTC; its values are stored, nothing was stored twice/);
		expect(await listPoints(db, s.id)).toHaveLength(3);
		const second = await preview(s.id);
		expect(second.body.scanPoints.map((x: { status: string }) => x.status)).toEqual(['already-stored', 'already-stored', 'already-stored']);
		expect(second.body.summary.toStore).toBe(0);
		const c = await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${second.body.id}/confirm`);
		expect(c.status).toBe(400);
		expect((await c.json()).error.message).toMatch(/nothing new to store/);
		expect(await listPoints(db, s.id)).toHaveLength(3);
	});

	it('a stored point with a different energy is a conflict (named, kept); the other gammas are stored', async () => {
		const s = await newStudy();
		const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
		const mine = { gammaBohrInv: 0.3, ...fixturePoint(so2G03), eCationHartree: (fixturePoint(so2G03).eCationHartree as number) + 2e-4 };
		await importPoints(db, actor, s.id, [mine]);
		const p = await preview(s.id);
		const g3 = p.body.scanPoints.find((x: { point: { gammaBohrInv: number } }) => x.point.gammaBohrInv === 0.3);
		expect(g3.status).toBe('conflict');
		expect(g3.conflicts).toEqual([{ field: 'eCationHartree', storedHartree: mine.eCationHartree, uploadedHartree: fixturePoint(so2G03).eCationHartree }]);
		expect(p.body.summary).toMatchObject({ new: 2, conflicts: 1, toStore: 2 });
		const c = await (await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`)).json();
		expect(c).toMatchObject({ inserted: 2, skipped: 1 });
		const stored = await listPoints(db, s.id);
		expect(stored.map((x) => x.gammaBohrInv)).toEqual([0.2, 0.3, 0.4]);
		expect(stored[1].eCationHartree).toBe(mine.eCationHartree);
	});

	it('a stored point lacking states is completed with the uploaded ones', async () => {
		const s = await newStudy();
		const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
		const f = fixturePoint(so2G02);
		await importPoints(db, actor, s.id, [{ gammaBohrInv: 0.2, eNeutralHartree: f.eNeutralHartree, homoNeutralHartree: f.homoNeutralHartree, lumoNeutralHartree: f.lumoNeutralHartree }]);
		const p = await preview(s.id);
		expect(p.body.scanPoints[0]).toMatchObject({ status: 'fills', fills: ['eCationHartree', 'eAnionHartree', 'homoAnionHartree'] });
		const c = await (await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`)).json();
		expect(c).toMatchObject({ inserted: 2, filled: 1 });
		expect((await listPoints(db, s.id))[0]).toMatchObject(f);
	});

	it('a conflict stored after the preview refuses the confirmation and nothing of the upload is stored (one transaction)', async () => {
		const s = await newStudy();
		const p = await preview(s.id);
		const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
		await importPoints(db, actor, s.id, [{ gammaBohrInv: 0.4, ...fixturePoint(so2G04), eNeutralHartree: -548.0 }]);
		const c = await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`);
		expect(c.status).toBe(409);
		expect((await c.json()).error.message).toMatch(/since the preview, values were stored that conflict with this upload at gamma 0\.4 bohr\^-1; nothing was stored/);
		expect((await listPoints(db, s.id)).map((x) => x.gammaBohrInv)).toEqual([0.4]);
	});

	it('a viewer cannot upload, confirm or discard', async () => {
		const s = await newStudy();
		expect((await preview(s.id, viewer)).status).toBe(403);
		const p = await preview(s.id);
		expect((await call(viewer, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`)).status).toBe(403);
		expect((await call(viewer, 'DELETE', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}`)).status).toBe(403);
		expect(await listPoints(db, s.id)).toEqual([]);
	});

	it("another workspace's upload id gives 404, and so does another study's", async () => {
		const mine = await newStudy();
		const other = await newStudy();
		const p = await preview(other.id);
		expect((await call(editor, 'POST', `${fx.ws}/studies/${mine.id}/outputs/${p.body.id}/confirm`)).status).toBe(404);
		// An upload in the outsider's own workspace, confirmed through the team's URL.
		const outsiderToken = (await createApiToken(db, fx.outsider.id, { workspaceId: fx.outsider.personal, name: 'own', role: 'owner', expiresInDays: 1 })).token;
		const mol = await createMolecule(db, { userId: fx.outsider.id, workspaceId: fx.outsider.personal, role: 'owner' }, { name: 'SO2 elsewhere', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: SO2_XYZ, smiles: '', notes: '' });
		const theirs = await newStudy(fx.outsider.personal, fx.outsider.id, mol.id);
		const r = await call(outsiderToken, 'POST', `${fx.outsider.personal}/studies/${theirs.id}/outputs?name=so2-scan.zip`, bundleZip);
		expect(r.status).toBe(201);
		const foreign = (await r.json()).id;
		const c = await call(editor, 'POST', `${fx.ws}/studies/${mine.id}/outputs/${foreign}/confirm`);
		expect(c.status).toBe(404);
		expect((await c.json()).error.message).toMatch(/pending upload .*not found/);
		expect(await listPoints(db, mine.id)).toEqual([]);
		expect((await call(outsiderToken, 'POST', `${fx.ws}/studies/${mine.id}/outputs/${p.body.id}/confirm`)).status).toBe(404);
	});

	it('an expired upload is refused with a clear message and nothing is stored', async () => {
		const s = await newStudy();
		const p = await preview(s.id);
		await db.updateTable('output_upload').set({ expires_at: new Date(Date.now() - 60_000) }).where('id', '=', p.body.id).execute();
		const c = await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`);
		expect(c.status).toBe(410);
		expect((await c.json()).error.message).toMatch(/^this upload expired at \d{4}-\d\d-\d\d \d\d:\d\d UTC \(pending uploads are kept for 60 minutes\); nothing was stored: upload the outputs again$/);
		expect(await listPoints(db, s.id)).toEqual([]);
	});

	it('a discarded upload cannot be confirmed; discarding twice is harmless', async () => {
		const s = await newStudy();
		const p = await preview(s.id);
		expect((await call(editor, 'DELETE', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}`)).status).toBe(204);
		expect((await call(editor, 'DELETE', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}`)).status).toBe(204);
		const c = await call(editor, 'POST', `${fx.ws}/studies/${s.id}/outputs/${p.body.id}/confirm`);
		expect(c.status).toBe(409);
		expect((await c.json()).error.message).toMatch(/was discarded/);
		const row = await db.selectFrom('output_upload').select(['plan', 'discarded_at']).where('id', '=', p.body.id).executeTakeFirstOrThrow();
		expect(row.discarded_at).not.toBeNull();
		expect((row.plan as { tuning: unknown[] }).tuning).toEqual([]);
		expect(await listPoints(db, s.id)).toEqual([]);
	});

	it('a bundle for another molecule, or a scan at another alpha, is refused naming both values', async () => {
		const water = await newStudy(fx.ws, fx.owner.id, fx.molecule.id);
		const w = await preview(water.id);
		expect(w.status).toBe(400);
		expect(w.body.error.message).toBe(`the bundle's manifest is for SO2 (O2S), but this study belongs to a molecule with formula H2O; nothing was read`);
		const other = await newStudy(fx.ws, fx.owner.id, so2Id, 0.25);
		const a = await preview(other.id);
		expect(a.status).toBe(400);
		expect(a.body.error.message).toBe('the bundle\'s scan decks use alpha 0.2, but this study uses alpha 0.25; upload them into a study with alpha 0.2');
		expect(await listPoints(db, water.id)).toEqual([]);
		expect(await listPoints(db, other.id)).toEqual([]);
	});

	it('several outputs as multipart/form-data are read together', async () => {
		const s = await newStudy();
		const form = new FormData();
		form.append('outputs', new Blob([so2G02]), 'neutral-cation-anion.out');
		// SvelteKit's cross-site check applies to form bodies: a script sends the server's own origin.
		const r = await fetch(`${base()}/api/v1/workspaces/${fx.ws}/studies/${s.id}/outputs`, { method: 'POST', headers: { authorization: `Bearer ${editor}`, origin: base() }, body: form });
		const body = await r.json();
		expect(r.status, JSON.stringify(body)).toBe(201);
		expect(body.scanPoints.map((x: { point: { gammaBohrInv: number } }) => x.point.gammaBohrInv)).toEqual([0.2]);
		expect(body.files).toHaveLength(1);
	});

	it('screened reruns of a polymorph: preview, confirm, then the same output is "already stored"', async () => {
		const before = (await listReruns(db, fx.ws, fx.polymorph.id)).length;
		const path = `${fx.ws}/polymorphs/${fx.polymorph.id}/reruns/outputs`;
		const r = await call(editor, 'POST', `${path}?name=neutral.out`, new TextEncoder().encode(screenedOut), 'application/octet-stream');
		const p = await r.json();
		expect(r.status, JSON.stringify(p)).toBe(201);
		expect(p.reruns).toHaveLength(1);
		expect(p.reruns[0]).toMatchObject({ status: 'new', alpha: 0.2, gammaBohrInv: 0.3 });
		expect(p.reruns[0].epsilon).toBeCloseTo(3, 6);
		expect(p.outputs[0].fills).toHaveLength(1);
		expect((await listReruns(db, fx.ws, fx.polymorph.id)).length).toBe(before);
		const c = await call(editor, 'POST', `${path}/${p.id}/confirm`);
		expect(c.status).toBe(200);
		expect((await listReruns(db, fx.ws, fx.polymorph.id)).length).toBe(before + 1);
		const again = await (await call(editor, 'POST', `${path}?name=neutral.out`, new TextEncoder().encode(screenedOut), 'application/octet-stream')).json();
		expect(again.reruns[0].status).toBe('already-stored');
		// A tuning output on the levels page says where it belongs.
		const wrong = await call(editor, 'POST', `${path}?name=g.out`, new TextEncoder().encode(so2G02), 'application/octet-stream');
		expect(wrong.status).toBe(400);
		expect((await wrong.json()).error.message).toMatch(/no screened rerun result found in g\.out \(it holds tuning-scan results: upload those on the tuning study page\)/);
	});
});
