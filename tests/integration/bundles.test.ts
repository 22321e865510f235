// Rerun bundles over the API: build, record, download again byte for byte; refusals name the field.
import JSZip from 'jszip';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { appDb, teamFixture } from './fixtures';
import { probe, requireEnv } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
let token: string;
let viewerToken: string;
const auth = (t: string) => ({ authorization: `Bearer ${t}`, 'content-type': 'application/json' });

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	token = (await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'bundles', role: 'editor', expiresInDays: 1 })).token;
	viewerToken = (await createApiToken(db, fx.viewer.id, { workspaceId: fx.ws, name: 'read', role: 'viewer', expiresInDays: 1 })).token;
});
afterAll(async () => db?.destroy());

describe('rerun bundles', () => {
	it('builds a zip with decks per gamma and per epsilon, a manifest, and records it; a later download is identical', async () => {
		const base = requireEnv('APP_URL');
		const body = { moleculeId: fx.molecule.id, polymorphId: fx.polymorph.id, alpha: 0.2, tuningGammas: [0.2, 0.3], screened: { gammaBohrInv: 0.25, epsilons: [3] }, basis: 'aug-cc-pvdz' };
		const r = await fetch(`${base}/api/v1/workspaces/${fx.ws}/bundles`, { method: 'POST', headers: auth(token), body: JSON.stringify(body) });
		expect(r.status, await r.clone().text()).toBe(201);
		const id = r.headers.get('x-kappaline-bundle')!;
		const bytes = new Uint8Array(await r.arrayBuffer());
		const zip = await JSZip.loadAsync(bytes);
		const names = Object.keys(zip.files);
		const manifestPath = names.find((n) => n.endsWith('manifest.json'))!;
		const manifest = JSON.parse(await zip.file(manifestPath)!.async('string'));
		expect(manifest.schemaVersion).toBe(1);
		expect(names.some((n) => /tuning\/g0p2000\//.test(n))).toBe(true);
		const screened = names.find((n) => /screened\/eps3p000\/.*\.nw$/.test(n))!;
		const deck = await zip.file(screened)!.async('string');
		// science notes section 7: beta = 1/3 - 0.2 and the cam line in the order cam, cam_alpha, cam_beta
		expect(deck).toMatch(/cam 0\.25\d* cam_alpha 0\.2\d* cam_beta 0\.1333/);
		expect(deck).toMatch(/hfexch 1\.0/);

		const list = JSON.parse((await probe(`/api/v1/workspaces/${fx.ws}/bundles?polymorphId=${fx.polymorph.id}`, { headers: auth(viewerToken) })).body);
		expect(list.items.map((b: { id: string }) => b.id)).toContain(id);
		const again = await fetch(`${base}/api/v1/workspaces/${fx.ws}/bundles/${id}`, { headers: auth(viewerToken) });
		expect(again.status).toBe(200);
		expect(Buffer.from(await again.arrayBuffer()).equals(Buffer.from(bytes))).toBe(true);
	});

	it('engine psi4: .in inputs in the same layout, manifest engine psi4, recorded, and downloaded again byte for byte', async () => {
		const base = requireEnv('APP_URL');
		const body = { moleculeId: fx.molecule.id, polymorphId: fx.polymorph.id, engine: 'psi4', alpha: 0.2, tuningGammas: [0.2], screened: { gammaBohrInv: 0.25, epsilons: [3] }, basis: 'def2-svpd' };
		const r = await fetch(`${base}/api/v1/workspaces/${fx.ws}/bundles`, { method: 'POST', headers: auth(token), body: JSON.stringify(body) });
		expect(r.status, await r.clone().text()).toBe(201);
		expect(r.headers.get('content-disposition')).toMatch(/-psi4-\d+\.zip"$/);
		const id = r.headers.get('x-kappaline-bundle')!;
		const bytes = new Uint8Array(await r.arrayBuffer());
		const zip = await JSZip.loadAsync(bytes);
		const names = Object.keys(zip.files);
		expect(names.filter((n) => n.endsWith('.nw'))).toEqual([]);
		const manifest = JSON.parse(await zip.file(names.find((n) => n.endsWith('manifest.json'))!)!.async('string'));
		expect(manifest.engine).toBe('psi4');
		expect(manifest.files.filter((f: { role: string }) => f.role === 'deck').map((f: { path: string }) => f.path)).toEqual([
			'tuning/g0p2000/neutral.in',
			'tuning/g0p2000/cation.in',
			'tuning/g0p2000/anion.in',
			'screened/eps3p000/neutral.in'
		]);
		const deck = await zip.file(names.find((n) => n.endsWith('screened/eps3p000/neutral.in'))!)!.async('string');
		// science notes section 7: beta = 1/3 - 0.2 on x_hf, omega = gamma
		expect(deck).toContain('"x_hf": {"alpha": 0.2, "beta": 0.133333333333, "omega": 0.25}');
		expect(deck).toContain('Needs Psi4 1.4 or newer');
		const list = JSON.parse((await probe(`/api/v1/workspaces/${fx.ws}/bundles?polymorphId=${fx.polymorph.id}`, { headers: auth(viewerToken) })).body);
		expect(list.items.find((b: { id: string }) => b.id === id).summary).toMatch(/^Psi4 · /);
		const again = await fetch(`${base}/api/v1/workspaces/${fx.ws}/bundles/${id}`, { headers: auth(viewerToken) });
		expect(Buffer.from(await again.arrayBuffer()).equals(Buffer.from(bytes))).toBe(true);
	});

	it('refuses an unknown engine with the field named', async () => {
		const bad = await probe(`/api/v1/workspaces/${fx.ws}/bundles`, { method: 'POST', headers: auth(token), body: JSON.stringify({ moleculeId: fx.molecule.id, engine: 'cp2k', alpha: 0.2, tuningGammas: [0.2] }) });
		expect(bad.status).toBe(400);
		expect(bad.body).toMatch(/engine must be nwchem or psi4/);
	});

	it('refuses an epsilon below 1 and an empty request with the field named, and a viewer cannot build', async () => {
		const bad = await probe(`/api/v1/workspaces/${fx.ws}/bundles`, { method: 'POST', headers: auth(token), body: JSON.stringify({ moleculeId: fx.molecule.id, alpha: 0.2, screened: { gammaBohrInv: 0.25, epsilons: [0.5] } }) });
		expect(bad.status).toBe(400);
		expect(JSON.parse(bad.body).error.message).toMatch(/epsilon must be >= 1/);
		const empty = await probe(`/api/v1/workspaces/${fx.ws}/bundles`, { method: 'POST', headers: auth(token), body: JSON.stringify({ moleculeId: fx.molecule.id, alpha: 0.2 }) });
		expect(empty.status).toBe(400);
		const viewer = await probe(`/api/v1/workspaces/${fx.ws}/bundles`, { method: 'POST', headers: auth(viewerToken), body: JSON.stringify({ moleculeId: fx.molecule.id, alpha: 0.2, tuningGammas: [0.2] }) });
		expect(viewer.status).toBe(403);
	});
});
