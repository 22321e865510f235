// The role matrix: for every page, form action and API handler, an anonymous visitor, an outsider
// (signed in, not a member), a viewer, an editor and an owner get what they should. The list of
// routes is read from the route files themselves, so a new route missing from POLICY fails here.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { appDb, PASSWORD, teamFixture } from './fixtures';
import { probe, signInCookie } from './http-helpers';

import type { Need } from './policy/types';

/**
 * `${routeId} ${GET|POST|PATCH|DELETE|?/action}` -> the least role allowed, one file per feature in
 * ./policy (so features added side by side do not edit the same table).
 */
type PolicyModule = {
	policy: Record<string, Need>;
	/** Creates the feature's records in the team workspace; returns ids by URL segment (e.g. { studies: id }). */
	seed?: (db: Db, fx: Awaited<ReturnType<typeof teamFixture>>) => Promise<Record<string, string>>;
};
const policyModules = Object.values(import.meta.glob<PolicyModule>('./policy/*.ts', { eager: true })).filter((m) => m.policy);
const POLICY: Record<string, Need> = Object.assign({}, ...policyModules.map((m) => m.policy));

const serverModules = import.meta.glob(['/src/routes/**/+page.server.ts', '/src/routes/**/+server.ts']);
const pageFiles = Object.keys(import.meta.glob('/src/routes/**/+page.svelte'));
const routeIdOf = (file: string) => file.replace(/^\/src\/routes/, '').replace(/\/\+[^/]+$/, '') || '/';

/** Every (route, method or action) the app serves, read from its route modules. */
async function discoverRoutes(): Promise<string[]> {
	const found = new Set<string>();
	for (const [file, load] of Object.entries(serverModules)) {
		const id = routeIdOf(file);
		const mod = (await load()) as Record<string, unknown>;
		if (file.endsWith('+server.ts')) {
			for (const m of ['GET', 'POST', 'PUT', 'PATCH', 'DELETE']) if (m in mod) found.add(`${id} ${m}`);
		} else {
			found.add(`${id} GET`);
			for (const a of Object.keys((mod.actions as object) ?? {})) found.add(`${id} ?/${a}`);
		}
	}
	for (const f of pageFiles) found.add(`${routeIdOf(f)} GET`);
	return [...found].sort();
}

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
const cookies: Record<string, string> = {};
let ids: Record<string, string> = {};

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	ids = { molecules: fx.molecule.id, polymorphs: fx.polymorph.id };
	for (const m of policyModules) if (m.seed) Object.assign(ids, await m.seed(db, fx));
	for (const who of ['owner', 'editor', 'viewer', 'outsider'] as const) cookies[who] = await signInCookie(fx[who].email, PASSWORD);
});
afterAll(async () => db?.destroy());

function urlFor(routeId: string): string {
	// Each `<segment>/[param=uuid]` takes the id seeded for that segment (molecules, polymorphs, ...);
	// a seeded key with two segments (`reruns/outputs`) wins over the last segment alone.
	let scoped = routeId;
	for (const [k, v] of Object.entries(ids)) if (k.includes('/')) scoped = scoped.replace(new RegExp(`${k}/\\[\\w+=uuid\\]`), `${k}/${v}`);
	const path = scoped
		.replace(/\/\([^)]+\)/g, '')
		.replace('[ws=uuid]', fx.ws)
		.replace(/([\w-]+)\/\[\w+=uuid\]/g, (whole, segment: string) => {
			if (!ids[segment]) throw new Error(`no id seeded for ${whole}: export a seed() from the feature's policy file`);
			return `${segment}/${ids[segment]}`;
		})
		.replace('[token]', 'not-a-real-token');
	return path || '/';
}

/** SvelteKit posts a page's default action to the page URL itself. */
const actionUrl = (routeId: string, name: string) => (name === 'default' ? urlFor(routeId) : `${urlFor(routeId)}?/${name}`);

const RANK = { viewer: 0, editor: 1, owner: 2 } as const;
const denied = (s: number) => s === 401 || s === 403 || s === 404;

describe('role matrix', () => {
	it('every route the app serves has a policy entry (and no entry is stale)', async () => {
		const routes = await discoverRoutes();
		expect(routes.filter((r) => !(r in POLICY)), 'routes without a policy entry').toEqual([]);
		expect(Object.keys(POLICY).filter((k) => !routes.includes(k)), 'policy entries without a route').toEqual([]);
	});

	it.each(Object.entries(POLICY).filter(([, need]) => need === 'viewer' || need === 'editor' || need === 'owner'))(
		'%s: members below %s are refused, outsiders get 404, anonymous callers are sent to sign in',
		async (key, need) => {
			const [routeId, verb] = key.split(' ');
			const isAction = verb.startsWith('?/');
			const method = isAction ? 'POST' : verb;
			const url = isAction ? actionUrl(routeId, verb.slice(2)) : urlFor(routeId);
			// Empty bodies (and an impossible If-Match) so that allowed calls fail validation instead of changing data.
			const send = (cookie?: string) =>
				probe(url, {
					method,
					cookie,
					action: isAction,
					body: method === 'GET' ? undefined : isAction ? new URLSearchParams({ version: '0' }) : '{}',
					headers: method === 'GET' || isAction ? {} : { 'content-type': 'application/json', 'if-match': '"999999"' }
				});
			const anon = await send();
			if (routeId.startsWith('/api/')) expect(anon.status, 'anonymous API call').toBe(401);
			else expect(anon.location ?? '', 'anonymous page or action redirects to sign-in').toMatch(/^\/signin/);

			const outsider = await send(cookies.outsider);
			expect(outsider.status, 'outsider').toBe(404);

			for (const role of ['viewer', 'editor', 'owner'] as const) {
				const r = await send(cookies[role]);
				if (RANK[role] < RANK[need as keyof typeof RANK]) expect(r.status, `${role} should be refused`).toBe(403);
				else expect(denied(r.status), `${role} should be allowed (got ${r.status}: ${r.body.slice(0, 200)})`).toBe(false);
			}
		}
	);

	it.each(Object.entries(POLICY).filter(([, need]) => need === 'user'))('%s needs a signed-in user', async (key) => {
		const [routeId, verb] = key.split(' ');
		const isAction = verb.startsWith('?/');
		const url = isAction ? actionUrl(routeId, verb.slice(2)) : urlFor(routeId);
		const anon = await probe(url, { method: isAction ? 'POST' : verb, action: isAction, body: isAction ? new URLSearchParams() : undefined });
		if (routeId.startsWith('/api/')) expect(anon.status).toBe(401);
		else expect(anon.location ?? '').toMatch(/^\/signin/);
		const signedIn = await probe(url, { method: isAction ? 'POST' : verb, cookie: cookies.viewer, action: isAction, body: isAction ? new URLSearchParams() : undefined });
		expect(denied(signedIn.status)).toBe(false);
	});

	it.each(Object.entries(POLICY).filter(([key, need]) => need === 'public' && key.endsWith(' GET')))('%s is open to anonymous visitors', async (key) => {
		const r = await probe(urlFor(key.split(' ')[0]));
		expect(r.status).toBeLessThan(400);
	});

	it('workspace API lists only the caller’s workspaces', async () => {
		const r = await probe('/api/v1/workspaces', { cookie: cookies.outsider });
		const ids = JSON.parse(r.body).items.map((w: { id: string }) => w.id);
		expect(ids).toContain(fx.outsider.personal);
		expect(ids).not.toContain(fx.ws);
	});
});
