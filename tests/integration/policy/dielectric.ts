import { readFileSync } from 'node:fs';
import type { Db } from '../../../src/lib/server/db/create-db';
import { replaceCellFromCif } from '../../../src/lib/server/services/cif-import';
import { addDielectricEntry } from '../../../src/lib/server/services/dielectric';
import type { teamFixture } from '../fixtures';
import type { Need } from './types';

/** Dielectric feature: CIF import, dielectric entries, epsilon in use. */
export const policy: Record<string, Need> = {
	'/(app)/w/[ws=uuid]/molecules/[id=uuid] ?/importCif': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/addEntry': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/deleteEntry': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/chooseEpsilon': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/replaceCif': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/from-cif POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/cif GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/cif PUT': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/dielectric-entries GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/dielectric-entries POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/dielectric-entries/[entry=uuid] GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/dielectric-entries/[entry=uuid] DELETE': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/epsilon GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/epsilon PUT': 'editor'
};

/** Stores a CIF with the team's polymorph (so GET .../cif has a file) and adds one dielectric entry. */
export async function seed(db: Db, fx: Awaited<ReturnType<typeof teamFixture>>): Promise<Record<string, string>> {
	const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
	const cif = readFileSync(new URL('../../../src/lib/formats/fixtures/cod-2000724.cif', import.meta.url), 'utf8');
	const { version } = await db.selectFrom('polymorph').select('version').where('id', '=', fx.polymorph.id).executeTakeFirstOrThrow();
	await replaceCellFromCif(db, actor, fx.polymorph.id, version, { cif, fileName: 'cod-2000724.cif' });
	const entry = await addDielectricEntry(db, actor, fx.polymorph.id, { kind: 'scalar', frequency: 'electronic', epsilon: 3.2, method: 'role-matrix seed', engine: '', reference: '', note: '' });
	return { 'dielectric-entries': entry.id };
}
