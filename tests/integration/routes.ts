// Every route the app serves, read from the route files themselves, with the least role each needs
// (tests/integration/policy/*.ts) and a way to fill in its id segments. Shared by the role matrix and
// the workspace-isolation test, so a new route is covered by both as soon as it has a policy entry.
import type { Db } from '../../src/lib/server/db/create-db';
import type { teamFixture } from './fixtures';
import type { Need } from './policy/types';

export type Team = Awaited<ReturnType<typeof teamFixture>>;

type PolicyModule = {
	policy: Record<string, Need>;
	/** Creates the feature's records in the team workspace; returns ids by URL segment (e.g. { studies: id }). */
	seed?: (db: Db, fx: Team) => Promise<Record<string, string>>;
};
const policyModules = Object.values(import.meta.glob<PolicyModule>('./policy/*.ts', { eager: true })).filter((m) => m.policy);

/** `${routeId} ${GET|POST|PATCH|DELETE|?/action}` -> the least role allowed. */
export const POLICY: Record<string, Need> = Object.assign({}, ...policyModules.map((m) => m.policy));

/** Seeds every feature's records in the team workspace and returns the id for each URL segment. */
export async function seedAll(db: Db, fx: Team): Promise<Record<string, string>> {
	const ids: Record<string, string> = { molecules: fx.molecule.id, polymorphs: fx.polymorph.id };
	for (const m of policyModules) if (m.seed) Object.assign(ids, await m.seed(db, fx));
	return ids;
}

const serverModules = import.meta.glob(['/src/routes/**/+page.server.ts', '/src/routes/**/+server.ts']);
const pageFiles = Object.keys(import.meta.glob('/src/routes/**/+page.svelte'));
const routeIdOf = (file: string) => file.replace(/^\/src\/routes/, '').replace(/\/\+[^/]+$/, '') || '/';

/** Every (route, method or action) the app serves, read from its route modules. */
export async function discoverRoutes(): Promise<string[]> {
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

/** True when the route has an id segment besides the workspace (a record of some type). */
export const hasRecordId = (routeId: string) => /\/[\w-]+\/\[\w+=uuid\]/.test(routeId.replace('[ws=uuid]', ''));

/**
 * The URL of a route id in workspace `ws`, each `<segment>/[param=uuid]` taking the id seeded for that
 * segment; a seeded key with two segments (`reruns/outputs`) wins over the last segment alone.
 */
export function urlFor(routeId: string, ws: string, ids: Record<string, string>): string {
	let scoped = routeId;
	for (const [k, v] of Object.entries(ids)) if (k.includes('/')) scoped = scoped.replace(new RegExp(`${k}/\\[\\w+=uuid\\]`), `${k}/${v}`);
	const path = scoped
		.replace(/\/\([^)]+\)/g, '')
		.replace('[ws=uuid]', ws)
		.replace(/([\w-]+)\/\[\w+=uuid\]/g, (whole, segment: string) => {
			if (!ids[segment]) throw new Error(`no id seeded for ${whole}: export a seed() from the feature's policy file`);
			return `${segment}/${ids[segment]}`;
		})
		.replace('[token]', 'not-a-real-token');
	return path || '/';
}

/** SvelteKit posts a page's default action to the page URL itself. */
export const actionUrl = (url: string, name: string) => (name === 'default' ? url : `${url}?/${name}`);
