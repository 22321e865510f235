// API tokens, If-Match, rate limiting and the OpenAPI document, against the built server and the
// real PostgreSQL behind it.
import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { createApiToken, revokeApiToken } from '../../src/lib/server/services/api-tokens';
import { TOKEN_RATE_LIMIT } from '../../src/lib/server/rate-limit';
import { appDb, teamFixture, WATER_XYZ } from './fixtures';
import { probe } from './http-helpers';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
const bearer = (t: string) => ({ authorization: `Bearer ${t}`, 'content-type': 'application/json' });

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
});
afterAll(async () => db?.destroy());

describe('personal API tokens', () => {
	it('an editor token creates a molecule; a viewer token cannot write', async () => {
		const editor = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'job', role: 'editor', expiresInDays: 30 });
		const created = await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { method: 'POST', headers: bearer(editor.token), body: JSON.stringify({ name: 'From a job', geometryXyz: WATER_XYZ }) });
		expect(created.status, created.body).toBe(201);
		expect(JSON.parse(created.body).formula).toBe('H2O');
		const viewer = await createApiToken(db, fx.viewer.id, { workspaceId: fx.ws, name: 'read', role: 'viewer', expiresInDays: null });
		const refused = await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { method: 'POST', headers: bearer(viewer.token), body: JSON.stringify({ name: 'x', geometryXyz: WATER_XYZ }) });
		expect(refused.status).toBe(403);
		expect(JSON.parse(refused.body).error.type).toBe('forbidden');
		const read = await probe(`/api/v1/workspaces/${fx.ws}/molecules/${fx.molecule.id}`, { headers: bearer(viewer.token) });
		expect(read.status).toBe(200);
	});

	it('a token cannot exceed its owner’s role', async () => {
		await expect(createApiToken(db, fx.viewer.id, { workspaceId: fx.ws, name: 'x', role: 'editor', expiresInDays: 1 })).rejects.toThrow(/more rights than you/);
	});

	it('a token of another workspace gets 404 here', async () => {
		const other = await createApiToken(db, fx.outsider.id, { workspaceId: fx.outsider.personal, name: 'mine', role: 'owner', expiresInDays: 1 });
		const r = await probe(`/api/v1/workspaces/${fx.ws}/molecules/${fx.molecule.id}`, { headers: bearer(other.token) });
		expect(r.status).toBe(404);
		// …and the same token with the owner's own user in this workspace would still be limited to its own workspace
		const editorElsewhere = await createApiToken(db, fx.editor.id, { workspaceId: fx.editor.personal, name: 'personal', role: 'owner', expiresInDays: 1 });
		expect((await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer(editorElsewhere.token) })).status).toBe(404);
	});

	it('a revoked or expired token is refused at once', async () => {
		const t = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'short', role: 'viewer', expiresInDays: 1 });
		expect((await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer(t.token) })).status).toBe(200);
		await revokeApiToken(db, fx.editor.id, t.id);
		const revoked = await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer(t.token) });
		expect(revoked.status).toBe(401);
		const e = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'old', role: 'viewer', expiresInDays: 1 });
		await db.updateTable('api_token').set({ expires_at: new Date(Date.now() - 1000) }).where('id', '=', e.id).execute();
		expect((await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer(e.token) })).status).toBe(401);
		expect((await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer('kl_not-a-token') })).status).toBe(401);
	});

	it('a token loses rights when its owner is downgraded', async () => {
		const t = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'down', role: 'editor', expiresInDays: 1 });
		await db.updateTable('membership').set({ role: 'viewer' }).where('workspace_id', '=', fx.ws).where('user_id', '=', fx.editor.id).execute();
		try {
			const r = await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { method: 'POST', headers: bearer(t.token), body: JSON.stringify({ name: 'x', geometryXyz: WATER_XYZ }) });
			expect(r.status).toBe(403);
		} finally {
			await db.updateTable('membership').set({ role: 'editor' }).where('workspace_id', '=', fx.ws).where('user_id', '=', fx.editor.id).execute();
		}
	});

	it('rate limiting answers 429 with Retry-After', async () => {
		const t = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'busy', role: 'viewer', expiresInDays: 1 });
		// Fill the token's current window as if it had already made its allowance of requests.
		await db.insertInto('rate_limit').values({ key: `token:${t.id}`, window_start: new Date(), count: TOKEN_RATE_LIMIT.requests }).execute();
		const r = await probe(`/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer(t.token) });
		expect(r.status).toBe(429);
		expect(JSON.parse(r.body).error.type).toBe('rate_limited');
		const base = process.env.APP_URL!;
		const raw = await fetch(`${base}/api/v1/workspaces/${fx.ws}/molecules`, { headers: bearer(t.token) });
		expect(Number(raw.headers.get('retry-after'))).toBeGreaterThan(0);
	});
});

describe('optimistic concurrency over the API', () => {
	it('a stale If-Match gets 412 and nothing is overwritten; a fresh one updates', async () => {
		const t = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'edit', role: 'editor', expiresInDays: 1 });
		const url = `/api/v1/workspaces/${fx.ws}/polymorphs/${fx.polymorph.id}`;
		const got = await fetch(`${process.env.APP_URL}${url}`, { headers: bearer(t.token) });
		const etag = got.headers.get('etag')!;
		expect(etag).toMatch(/^"\d+"$/);
		const ok = await probe(url, { method: 'PATCH', headers: { ...bearer(t.token), 'if-match': etag }, body: JSON.stringify({ notes: 'first' }) });
		expect(ok.status, ok.body).toBe(200);
		const stale = await probe(url, { method: 'PATCH', headers: { ...bearer(t.token), 'if-match': etag }, body: JSON.stringify({ notes: 'second' }) });
		expect(stale.status).toBe(412);
		expect(JSON.parse(stale.body).error.type).toBe('stale_version');
		const now = JSON.parse((await probe(url, { headers: bearer(t.token) })).body);
		expect(now.notes).toBe('first');
	});

	it('a bad body names the field', async () => {
		const t = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'bad', role: 'editor', expiresInDays: 1 });
		const r = await probe(`/api/v1/workspaces/${fx.ws}/polymorphs`, { method: 'POST', headers: bearer(t.token), body: JSON.stringify({ moleculeId: fx.molecule.id, label: 'x', a: 5, b: 5, c: 5, alphaDeg: 200, betaDeg: 90, gammaDeg: 90, z: 1 }) });
		expect(r.status).toBe(400);
		expect(JSON.parse(r.body).error.field).toBe('alphaDeg');
	});
});

describe('OpenAPI document', () => {
	it('validates as OpenAPI 3.1', async () => {
		const r = await probe('/api/v1/openapi.json');
		const doc = JSON.parse(r.body);
		const res = await new Validator().validate(doc);
		expect(res.errors ?? [], JSON.stringify(res.errors, null, 1)?.slice(0, 2000)).toEqual([]);
		expect(res.valid).toBe(true);
		expect(doc.openapi).toBe('3.1.0');
	});

	it('documents every /api/v1 route and method, and nothing that does not exist', async () => {
		const doc = JSON.parse((await probe('/api/v1/openapi.json')).body);
		const documented = Object.entries(doc.paths as Record<string, Record<string, unknown>>)
			.flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path.replace(/\{(\w+)\}/g, ':$1')}`))
			.sort();
		const modules = import.meta.glob('/src/routes/api/v1/**/+server.ts');
		const served: string[] = [];
		for (const [file, load] of Object.entries(modules)) {
			const mod = (await load()) as Record<string, unknown>;
			const path = file.replace('/src/routes', '').replace('/+server.ts', '').replace(/\[(\w+)(=\w+)?\]/g, ':$1');
			for (const m of ['GET', 'POST', 'PUT', 'PATCH', 'DELETE']) if (m in mod) served.push(`${m} ${path}`);
		}
		expect(served.sort()).toEqual(documented);
	});
});
