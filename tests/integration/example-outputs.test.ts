// examples/push-outputs.mjs against the started server: a real NWChem screened rerun of SO2
// (NWChem 7.0.2, alpha 0.2, gamma 0.3, epsilon 3; src/lib/formats/decks/fixtures/README.md) is
// previewed without storing, then confirmed; a second run finds it already stored.
import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { listReruns } from '../../src/lib/server/services/reruns';
import { appDb, teamFixture } from './fixtures';
import { requireEnv } from './http-helpers';

const OUT = 'src/lib/formats/decks/fixtures/so2_g0p3000_e3p0000.out';
let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
});
afterAll(async () => db?.destroy());

describe('examples/push-outputs.mjs', () => {
	it('previews without storing, stores with --confirm, and finds the result already stored the second time', async () => {
		const { token } = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'cluster job', role: 'editor', expiresInDays: 1 });
		const env = { ...process.env, KAPPALINE_URL: requireEnv('APP_URL'), KAPPALINE_TOKEN: token };
		const run = (...extra: string[]) => spawnSync(process.execPath, ['examples/push-outputs.mjs', '--workspace', fx.ws, '--polymorph', fx.polymorph.id, ...extra, OUT], { encoding: 'utf8', env });

		const look = run();
		expect(look.status, look.stderr).toBe(0);
		expect(look.stdout).toContain('epsilon 3.000: new');
		expect(look.stdout).toMatch(/upload [0-9a-f-]{36}: 1 to store, 0 already stored, 0 in conflict/);
		expect(look.stdout).toContain('nothing stored');
		expect(await listReruns(db, fx.ws, fx.polymorph.id)).toEqual([]);

		const store = run('--confirm');
		expect(store.status, store.stderr).toBe(0);
		expect(store.stdout).toContain('stored: 1 added, 0 completed, 0 skipped');
		expect(await listReruns(db, fx.ws, fx.polymorph.id)).toHaveLength(1);

		const again = run('--confirm');
		expect(again.status, again.stderr).toBe(0);
		expect(again.stdout).toContain('epsilon 3.000: already-stored');
		expect(again.stdout).toContain('nothing new to store; the upload was discarded');
		expect(await listReruns(db, fx.ws, fx.polymorph.id)).toHaveLength(1);
	});

	it('says what is wrong when the token is missing', () => {
		const r = spawnSync(process.execPath, ['examples/push-outputs.mjs', OUT], { encoding: 'utf8', env: { ...process.env, KAPPALINE_URL: '', KAPPALINE_TOKEN: '' } });
		expect(r.status).toBe(1);
		expect(r.stderr).toContain('push-outputs: usage:');
	});
});
