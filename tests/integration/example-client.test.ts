// The dependency-free example client in examples/ pushes a real NWChem scan (SO2, alpha 0.2,
// aug-cc-pVDZ; src/lib/science/tuning/fixtures/README.md) to the started server with a token and
// prints gamma*; running it again adds nothing (Idempotency-Key).
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../src/lib/server/db/create-db';
import { optimalGamma } from '../../src/lib/science/tuning';
import { parseScanPoints } from '../../src/lib/formats/scan-table';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { createStudy, listPoints } from '../../src/lib/server/services/tuning';
import { appDb, teamFixture } from './fixtures';
import { requireEnv } from './http-helpers';

const CSV = 'src/lib/science/tuning/fixtures/so2-alpha0.2-aug-cc-pvdz.csv';
let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
});
afterAll(async () => db?.destroy());

describe('examples/push-scan.mjs', () => {
	it('pushes the scan, prints gamma*, and a retry adds nothing', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		const study = await createStudy(db, actor, fx.molecule.id, { name: 'from the example client', engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'aug-cc-pVDZ', alpha: 0.2, objective: 'abs-sum', notes: '' });
		const { token } = await createApiToken(db, fx.editor.id, { workspaceId: fx.ws, name: 'cluster job', role: 'editor', expiresInDays: 1 });
		const env = { ...process.env, KAPPALINE_URL: requireEnv('APP_URL'), KAPPALINE_TOKEN: token };
		const run = () => spawnSync(process.execPath, ['examples/push-scan.mjs', '--workspace', fx.ws, '--study', study.id, CSV], { encoding: 'utf8', env });

		const first = run();
		expect(first.status, first.stderr).toBe(0);
		const points = parseScanPoints(readFileSync(CSV, 'utf8'), { energyUnit: 'hartree' });
		expect(first.stdout).toContain(`pushed ${points.length} points`);
		const expected = optimalGamma(points).optimum!.gammaBohrInv;
		expect(first.stdout).toContain(`gamma* = ${expected.toFixed(4)} bohr^-1`);

		const second = run();
		expect(second.status, second.stderr).toBe(0);
		expect(second.stdout).toContain('nothing added');
		expect(await listPoints(db, study.id)).toHaveLength(points.length);
	});

	it('fails with a message and a non-zero exit on a bad token', () => {
		const r = spawnSync(process.execPath, ['examples/push-scan.mjs', '--workspace', fx.ws, '--study', fx.molecule.id, CSV], { encoding: 'utf8', env: { ...process.env, KAPPALINE_URL: requireEnv('APP_URL'), KAPPALINE_TOKEN: 'kl_wrong' } });
		expect(r.status).toBe(1);
		expect(r.stderr).toMatch(/401|unknown, revoked or expired/);
	});
});
