// Workspace isolation for every record type: an owner of workspace P who puts the id of a record from
// workspace T into P's URLs (pages, form actions and API handlers alike) gets 404 and changes nothing.
// The routes come from the route files (./routes.ts), so a new record type is covered once its route
// has a policy entry and its policy file seeds a record.
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { appDb, PASSWORD, teamFixture, WATER_XYZ } from './fixtures';
import { probe, signInCookie } from './http-helpers';
import { actionUrl, hasRecordId, POLICY, seedAll, urlFor, type Team } from './routes';

let db: Db;
let fx: Team;
let ids: Record<string, string> = {};
let cookie = '';

beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
	ids = await seedAll(db, fx);
	cookie = await signInCookie(fx.outsider.email, PASSWORD);
});
afterAll(async () => db?.destroy());

/**
 * A fingerprint of everything stored for workspace `ws`: every table with a workspace_id column (found in
 * the catalogue, so new tables are included), plus scan points through their study.
 */
async function fingerprint(ws: string): Promise<Record<string, string>> {
	const tables = await sql<{ t: string }>`select table_name as t from information_schema.columns where table_schema = 'public' and column_name = 'workspace_id' order by 1`.execute(db);
	const out: Record<string, string> = {};
	for (const { t } of tables.rows) {
		const r = await sql<{ n: string; h: string | null }>`select count(*)::text as n, md5(string_agg(x::text, '|' order by x::text)) as h from ${sql.table(t)} x where x.workspace_id = ${ws}`.execute(db);
		out[t] = `${r.rows[0].n}:${r.rows[0].h}`;
	}
	const points = await sql<{ n: string; h: string | null }>`select count(*)::text as n, md5(string_agg(p::text, '|' order by p::text)) as h from scan_point p join tuning_study s on s.id = p.study_id where s.workspace_id = ${ws}`.execute(db);
	out.scan_point = `${points.rows[0].n}:${points.rows[0].h}`;
	return out;
}

const recordRoutes = Object.entries(POLICY).filter(([key, need]) => ['viewer', 'editor', 'owner'].includes(need) && hasRecordId(key.split(' ')[0]));

/** Query strings that GET routes need to get past validation (so the lookup decides). */
const QUERY: Record<string, string> = { '/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/levels/sweep GET': '?epsilons=2,3' };

/** Requests a route of workspace P with workspace T's record ids. */
function foreign(key: string, body?: { form?: Record<string, string>; json?: unknown }) {
	const [routeId, verb] = key.split(' ');
	const isAction = verb.startsWith('?/');
	const url = urlFor(routeId, fx.outsider.personal, ids) + (QUERY[key] ?? '');
	const method = isAction ? 'POST' : verb;
	return probe(isAction ? actionUrl(url, verb.slice(2)) : url, {
		method,
		cookie,
		action: isAction,
		// '<segment>' in a body stands for the id seeded for that segment (ids exist only after seeding).
		body: method === 'GET' ? undefined : isAction ? new URLSearchParams(body?.form ?? { version: '1' }) : JSON.stringify(body?.json ?? {}).replace(/<([\w-]+)>/g, (_, seg: string) => ids[seg]),
		headers: method === 'GET' || isAction ? {} : { 'content-type': 'application/json', 'if-match': '"1"' }
	});
}

describe('workspace isolation', () => {
	it('covers every record type that has an id route', () => {
		const segments = new Set(recordRoutes.flatMap(([key]) => [...key.matchAll(/([\w-]+)\/\[\w+=uuid\]/g)].map((m) => m[1])).filter((s) => s !== 'w' && s !== 'workspaces'));
		// The record types of the product today; a new one joins this list when its routes appear.
		for (const t of ['molecules', 'polymorphs', 'studies', 'points', 'bundles', 'dielectric-entries']) expect(segments, t).toContain(t);
	});

	it.each(recordRoutes)('%s with another workspace’s record id: 404, nothing leaked or changed', async (key) => {
		const before = await fingerprint(fx.ws);
		const r = await foreign(key);
		const [routeId, verb] = key.split(' ');
		if (verb === 'GET') {
			expect(r.status, `${key}: ${r.body.slice(0, 200)}`).toBe(404);
		} else {
			// A write may be refused by validation before the lookup (400) or by the lookup (404);
			// never accepted, never a conflict that would reveal the record exists.
			expect([400, 404, 413, 415, 422], `${key}: ${r.status} ${r.body.slice(0, 200)}`).toContain(r.status);
		}
		expect(r.body, 'no name of the foreign record in the answer').not.toContain(fx.molecule.name);
		expect(routeId).toBeTruthy();
		expect(await fingerprint(fx.ws)).toEqual(before);
	});

	// Writes with well-formed bodies, so that only the workspace check can refuse them.
	const wellFormed: [string, { form?: Record<string, string>; json?: unknown }][] = [
		['/api/v1/workspaces/[ws=uuid]/molecules/[id=uuid] PATCH', { json: { name: 'taken over', notes: 'x' } }],
		['/api/v1/workspaces/[ws=uuid]/molecules/[id=uuid] DELETE', { json: {} }],
		['/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid] PATCH', { json: { label: 'taken over' } }],
		['/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid] DELETE', { json: {} }],
		['/api/v1/workspaces/[ws=uuid]/studies/[id=uuid] PATCH', { json: { name: 'taken over' } }],
		['/api/v1/workspaces/[ws=uuid]/studies/[id=uuid] DELETE', { json: {} }],
		['/api/v1/workspaces/[ws=uuid]/studies/[id=uuid]/points POST', { json: { points: [{ gammaBohrInv: 0.77, eNeutralHartree: -76.4, eCationHartree: -76.0, eAnionHartree: -76.38, homoNeutralHartree: -0.45, homoAnionHartree: 0.02 }] } }],
		['/api/v1/workspaces/[ws=uuid]/points/[id=uuid] PATCH', { json: { excluded: true, excludedReason: 'taken over' } }],
		['/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/dielectric-entries/[entry=uuid] DELETE', { json: {} }],
		['/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/epsilon PUT', { json: { entryId: '<dielectric-entries>', reason: 'taken over' } }],
		['/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/reruns POST', { json: { results: [{ epsilon: 3, alpha: 0.2, gammaBohrInv: 0.3, homoHartree: -0.25, lumoHartree: -0.1 }] } }],
		['/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/measurements POST', { json: { ipEv: 5.1, method: 'UPS' } }],
		['/(app)/w/[ws=uuid]/molecules/[id=uuid] ?/update', { form: { version: '1', name: 'taken over', netCharge: '0', multiplicity: '1', geometryXyz: WATER_XYZ } }],
		['/(app)/w/[ws=uuid]/molecules/[id=uuid] ?/delete', { form: { version: '1' } }],
		['/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/delete', { form: { version: '1' } }],
		['/(app)/w/[ws=uuid]/studies/[id=uuid] ?/delete', { form: { version: '1' } }]
	];
	it.each(wellFormed.filter(([key]) => key in POLICY))('%s with a well-formed body: 404', async (key, body) => {
		const before = await fingerprint(fx.ws);
		const r = await foreign(key, body);
		expect(r.status, `${key}: ${r.body.slice(0, 300)}`).toBe(404);
		expect(await fingerprint(fx.ws)).toEqual(before);
	});

	it('the same well-formed write in the record’s own workspace is accepted (so the 404 above is the workspace check)', async () => {
		const owner = await signInCookie(fx.owner.email, PASSWORD);
		const r = await probe(`/api/v1/workspaces/${fx.ws}/polymorphs/${fx.polymorph.id}/measurements`, {
			method: 'POST',
			cookie: owner,
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(wellFormed.find(([k]) => k.endsWith('measurements POST'))![1].json)
		});
		expect(r.status, r.body).toBe(201);
	});
});
