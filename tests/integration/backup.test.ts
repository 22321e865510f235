// npm run db:backup / db:restore: back up the integration database, wipe it, restore, and compare
// every table's rows (count and an md5 of the ordered rows).
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql, type Migration } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../src/lib/server/db/create-db';
import { migrateToLatest } from '../../src/lib/server/db/migrate';
import { signUp } from '../../src/lib/server/services/accounts';
import { createMolecule } from '../../src/lib/server/services/molecules';
import { requireEnv } from './http-helpers';
import { WATER_XYZ } from './fixtures';

const migrations = import.meta.glob<Migration>('/migrations/*.ts', { eager: true });
let db: Db;
beforeAll(async () => {
	db = createDb(requireEnv('DATABASE_URL'), { max: 2 });
	// A database of its own making: fresh schema, all migrations, a user, a workspace and a molecule.
	await sql`drop schema public cascade; create schema public`.execute(db);
	await migrateToLatest(db, Object.fromEntries(Object.entries(migrations).map(([f, m]) => [f.replace(/^.*\/|\.ts$/g, ''), m])));
	const u = await signUp(db, { email: `backup-${Date.now()}@example.test`, password: 'long-enough-password', name: 'B' });
	await createMolecule(db, { userId: u.userId, workspaceId: u.workspaceId, role: 'owner' }, { name: 'Water', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: 'kept across a backup' });
});
afterAll(async () => db?.destroy());

async function fingerprint(): Promise<Record<string, string>> {
	const tables = await sql<{ t: string }>`select table_name as t from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by 1`.execute(db);
	const out: Record<string, string> = {};
	for (const { t } of tables.rows) {
		const r = await sql<{ n: string; h: string | null }>`select count(*)::text as n, md5(string_agg(x::text, '|' order by x::text)) as h from ${sql.table(t)} x`.execute(db);
		out[t] = `${r.rows[0].n}:${r.rows[0].h}`;
	}
	return out;
}

describe('backups', () => {
	it('backs up, wipes, restores and gets every table back', async () => {
		const before = await fingerprint();
		expect(Object.keys(before).length).toBeGreaterThan(5);
		expect(Number(before.molecule?.split(':')[0] ?? 0)).toBeGreaterThan(0);
		const file = join(mkdtempSync(join(tmpdir(), 'kl-backup-')), 'test.dump');
		const env = { ...process.env, DATABASE_URL: requireEnv('DATABASE_URL') };
		const backup = spawnSync(process.execPath, ['scripts/db-backup.mjs', 'backup', '--file', file], { encoding: 'utf8', env });
		expect(backup.status, backup.stderr).toBe(0);
		await sql`drop schema public cascade; create schema public`.execute(db);
		expect(Object.keys(await fingerprint())).toHaveLength(0);
		const restore = spawnSync(process.execPath, ['scripts/db-backup.mjs', 'restore', '--file', file], { encoding: 'utf8', env });
		expect(restore.status, restore.stderr).toBe(0);
		expect(await fingerprint()).toEqual(before);
	});

	it('a missing dump is refused with a clear message', () => {
		const r = spawnSync(process.execPath, ['scripts/db-backup.mjs', 'restore', '--file', '/nonexistent.dump'], { encoding: 'utf8', env: { ...process.env, DATABASE_URL: requireEnv('DATABASE_URL') } });
		expect(r.status).toBe(1);
		expect(r.stderr).toMatch(/no such file/);
	});
});
