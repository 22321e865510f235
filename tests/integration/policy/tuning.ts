import type { Db } from '../../../src/lib/server/db/create-db';
import { syntheticScan, GRID } from '../../../src/lib/science/tuning/synthetic-scan.testdata';
import { createStudy, importPoints, saveAnalysis } from '../../../src/lib/server/services/tuning';
import type { teamFixture } from '../fixtures';
import type { Need } from './types';

/** Tuning routes: `${routeId} ${verb}` -> the least role allowed. */
export const policy: Record<string, Need> = {
	'/(app)/w/[ws=uuid]/molecules/[id=uuid]/studies/new GET': 'editor',
	'/(app)/w/[ws=uuid]/molecules/[id=uuid]/studies/new ?/create': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] GET': 'viewer',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/update': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/delete': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/import': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/ingest': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/save': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/markCurrent': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/excludePoint': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/editPoint': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/studies POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid] GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid] PATCH': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid] DELETE': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid]/points POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid]/result GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/points/[id=uuid] PATCH': 'editor'
};

/** A study with a synthetic scan (test data, not engine output) and a saved result in the team workspace. */
export async function seed(db: Db, fx: Awaited<ReturnType<typeof teamFixture>>): Promise<Record<string, string>> {
	const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
	const s = await createStudy(db, actor, fx.molecule.id, { name: 'role-matrix study', engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'aug-cc-pVDZ', alpha: 0.2, objective: 'abs-sum', notes: '' });
	const r = await importPoints(db, actor, s.id, syntheticScan(GRID));
	await saveAnalysis(db, actor, s.id, r.study.version, { objective: 'abs-sum' });
	return { studies: s.id, points: r.pointIds[0] };
}
