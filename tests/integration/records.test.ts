// Records against the real PostgreSQL (the integration database made fresh by npm test):
// migrations from empty, optimistic concurrency, transactions, activity log.
import { sql, type Migration, Migrator } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../src/lib/server/db/create-db';
import { migrateToLatest, RecordMigrationProvider } from '../../src/lib/server/db/migrate';
import { DependentsError, StaleVersionError, ValidationError } from '../../src/lib/server/errors';
import { listActivity } from '../../src/lib/server/repo/activity';
import { createMolecule, deleteMolecule, getMolecule, updateMolecule } from '../../src/lib/server/services/molecules';
import { createPolymorph, getPolymorph } from '../../src/lib/server/services/polymorphs';
import { signUp } from '../../src/lib/server/services/accounts';
import { requireEnv } from './http-helpers';
import { WATER_XYZ } from './fixtures';

const migrations = import.meta.glob<Migration>('/migrations/*.ts', { eager: true });
const modules = Object.fromEntries(Object.entries(migrations).map(([f, m]) => [f.replace(/^.*\/|\.ts$/g, ''), m]));
let db: Db;

beforeAll(async () => {
	db = createDb(requireEnv('DATABASE_URL'), { max: 4 });
	await sql`drop schema public cascade; create schema public`.execute(db);
});
afterAll(async () => db?.destroy());

describe('migrations', () => {
	it('run up from an empty database, down to nothing, and up again', async () => {
		const applied = await migrateToLatest(db, modules);
		expect(applied).toEqual(Object.keys(modules).sort());
		const tables = await sql<{ t: string }>`select table_name as t from information_schema.tables where table_schema = 'public'`.execute(db);
		expect(tables.rows.map((r) => r.t)).toEqual(expect.arrayContaining(['User', 'workspace', 'membership', 'molecule', 'polymorph', 'activity', 'invitation']));
		const migrator = new Migrator({ db, provider: new RecordMigrationProvider(modules) });
		for (let i = 0; i < applied.length; i++) {
			const { error } = await migrator.migrateDown();
			expect(error).toBeUndefined();
		}
		expect(await migrateToLatest(db, modules)).toHaveLength(applied.length);
	});
});

describe('molecule and polymorph records', () => {
	let actor: { userId: string; workspaceId: string; role: 'owner' };
	beforeAll(async () => {
		const u = await signUp(db, { email: `rec-${Date.now()}@example.test`, password: 'long-enough-password', name: 'Rec' });
		actor = { userId: u.userId, workspaceId: u.workspaceId, role: 'owner' };
	});
	const input = { name: 'Water', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' };

	it('derives the formula from the geometry and logs the creation', async () => {
		const m = await createMolecule(db, actor, input);
		expect(m.formula).toBe('H2O');
		expect(m.atomCount).toBe(3);
		const log = await listActivity(db, actor.workspaceId, { entityIds: [m.id] });
		expect(log[0].summary).toContain('created molecule Water');
	});

	it('refuses a stale edit and overwrites nothing', async () => {
		const m = await createMolecule(db, actor, { ...input, name: 'Stale test' });
		await updateMolecule(db, actor, m.id, m.version, { notes: 'first edit' });
		await expect(updateMolecule(db, actor, m.id, m.version, { notes: 'second edit from an old page' })).rejects.toBeInstanceOf(StaleVersionError);
		const now = await getMolecule(db, actor.workspaceId, m.id);
		expect(now.notes).toBe('first edit');
		expect(now.version).toBe(m.version + 1);
		const log = await listActivity(db, actor.workspaceId, { entityIds: [m.id] });
		expect(log[0].before).toMatchObject({ notes: '' });
		expect(log[0].after).toMatchObject({ notes: 'first edit' });
	});

	it('a bad geometry stores nothing and names the line', async () => {
		const before = await db.selectFrom('molecule').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
		const err = await createMolecule(db, actor, { ...input, geometryXyz: '3\nbad\nO 0 0 0\nH 0 0.7 zz\nH 0 -0.7 0\n' }).catch((e) => e);
		expect(err).toBeInstanceOf(ValidationError);
		expect(err.line).toBe(4);
		const after = await db.selectFrom('molecule').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
		expect(Number(after.n)).toBe(Number(before.n));
	});

	it('refuses an impossible spin multiplicity', async () => {
		await expect(createMolecule(db, actor, { ...input, multiplicity: 2 })).rejects.toThrow(/multiplicity 2 is impossible with 10 electrons/);
	});

	it('computes cell volume and density for a polymorph and refuses deleting a molecule with polymorphs', async () => {
		const m = await createMolecule(db, actor, { ...input, name: 'Cell test' });
		// Orthorhombic 4.5 x 5.0 x 6.0 Å: V = 135 Å^3 (arithmetic); Z = 2 waters, M = 18.015 g/mol
		// (IUPAC standard atomic weights): rho = 2 x 18.015 / (6.02214076e23 x 135e-24) = 0.4432 g/cm^3.
		const p = await createPolymorph(db, actor, m.id, { label: 'test', spaceGroup: 'P1', a: 4.5, b: 5, c: 6, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 2, temperatureK: undefined, structureSource: '', notes: '' });
		const got = await getPolymorph(db, actor.workspaceId, p.id);
		expect(got.derived.volumeA3).toBeCloseTo(135, 9);
		expect(got.derived.volumePerMoleculeA3).toBeCloseTo(67.5, 9);
		expect(got.derived.densityGPerCm3!).toBeCloseTo(0.4432, 4);
		await expect(deleteMolecule(db, actor, m.id)).rejects.toBeInstanceOf(DependentsError);
	});

	it('records of another workspace are not found', async () => {
		const m = await createMolecule(db, actor, { ...input, name: 'Private' });
		const other = await signUp(db, { email: `other-${Date.now()}@example.test`, password: 'long-enough-password', name: 'O' });
		await expect(getMolecule(db, other.workspaceId, m.id)).rejects.toThrow(/not found/);
	});
});
