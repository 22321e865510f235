import { createDb, type Db } from '../../src/lib/server/db/create-db';
import { createMolecule } from '../../src/lib/server/services/molecules';
import { createPolymorph } from '../../src/lib/server/services/polymorphs';
import { signUp } from '../../src/lib/server/services/accounts';
import { createWorkspace } from '../../src/lib/server/repo/workspaces';
import { requireEnv } from './http-helpers';

export const WATER_XYZ = '3\nwater\nO 0.000 0.000 0.117\nH 0.000 0.757 -0.467\nH 0.000 -0.757 -0.467\n';
export const PASSWORD = 'integration-password-1';

/** A workspace with an owner, an editor and a viewer, plus an outsider with a workspace of their own. */
export async function teamFixture(db: Db) {
	const tag = Math.random().toString(36).slice(2, 8);
	const mk = async (role: string) => {
		const email = `${role}-${tag}@example.test`;
		const u = await signUp(db, { email, password: PASSWORD, name: role });
		return { email, id: u.userId, personal: u.workspaceId };
	};
	const owner = await mk('owner');
	const editor = await mk('editor');
	const viewer = await mk('viewer');
	const outsider = await mk('outsider');
	const ws = await createWorkspace(db, `Team ${tag}`, owner.id);
	await db.insertInto('membership').values([
		{ workspace_id: ws, user_id: editor.id, role: 'editor' },
		{ workspace_id: ws, user_id: viewer.id, role: 'viewer' }
	]).execute();
	const actor = { userId: owner.id, workspaceId: ws, role: 'owner' as const };
	const molecule = await createMolecule(db, actor, { name: `Water ${tag}`, formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' });
	const polymorph = await createPolymorph(db, actor, molecule.id, { label: 'ice-like', spaceGroup: 'P1', a: 4.5, b: 4.5, c: 7.3, alphaDeg: 90, betaDeg: 90, gammaDeg: 120, z: 4, temperatureK: 100, structureSource: 'test', notes: '' });
	return { tag, ws, owner, editor, viewer, outsider, molecule, polymorph };
}

export function appDb(): Db {
	return createDb(requireEnv('APP_DATABASE_URL'), { max: 3 });
}
