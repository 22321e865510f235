import type { Need } from './types';
import type { Db } from '../../../src/lib/server/db/create-db';
import { createBundle } from '../../../src/lib/server/services/bundles';
import { createPolymorph, deletePolymorph } from '../../../src/lib/server/services/polymorphs';
import { bundleRequest } from '../../../src/lib/schemas/bundle';

/** Foundation routes: `${routeId} ${GET|POST|PATCH|DELETE|?/action}` -> the least role allowed. */
export const policy: Record<string, Need> = {
	'/ GET': 'public',
	'/healthz GET': 'public',
	'/dev/mail GET': 'dev',
	'/(auth)/signin GET': 'public',
	'/(auth)/signin ?/password': 'public',
	'/(auth)/signin ?/link': 'public',
	'/(auth)/signin/check-email GET': 'public',
	'/(auth)/signup GET': 'public',
	'/(auth)/signup ?/default': 'public',
	'/(auth)/signout GET': 'public',
	'/(auth)/signout ?/default': 'public',
	'/(auth)/reset GET': 'public',
	'/(auth)/reset ?/default': 'public',
	'/(auth)/reset/[token] GET': 'public',
	'/(auth)/reset/[token] ?/default': 'public',
	'/(auth)/invite/[token] GET': 'public',
	'/(auth)/invite/[token] ?/default': 'user',
	'/(app)/workspaces GET': 'user',
	'/(app)/workspaces ?/create': 'user',
	'/(app)/w/[ws=uuid] GET': 'viewer',
	'/(app)/w/[ws=uuid]/molecules GET': 'viewer',
	'/(app)/w/[ws=uuid]/molecules/new GET': 'editor',
	'/(app)/w/[ws=uuid]/molecules/new ?/create': 'editor',
	'/(app)/w/[ws=uuid]/molecules/[id=uuid] GET': 'viewer',
	'/(app)/w/[ws=uuid]/molecules/[id=uuid] ?/update': 'editor',
	'/(app)/w/[ws=uuid]/molecules/[id=uuid] ?/delete': 'editor',
	'/(app)/w/[ws=uuid]/molecules/[id=uuid] ?/addPolymorph': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] GET': 'viewer',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/update': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid] ?/delete': 'editor',
	'/(app)/w/[ws=uuid]/activity GET': 'viewer',
	'/(app)/w/[ws=uuid]/bundles POST': 'editor',
	'/(app)/w/[ws=uuid]/bundles/preview POST': 'viewer',
	'/(app)/w/[ws=uuid]/bundles/[id=uuid] GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/bundles GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/levels GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/levels/sweep GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/measurements GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/measurements POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/reruns GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/reruns POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/reruns/outputs POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid]/outputs POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/bundles POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/bundles/[id=uuid] GET': 'viewer',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels GET': 'viewer',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/addMeasurement': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/deleteMeasurement': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/addRerun': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/saveEstimate': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/uploadOutputs': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/deleteRerun': 'editor',
	'/(app)/w/[ws=uuid]/members GET': 'viewer',
	'/(app)/w/[ws=uuid]/trash GET': 'viewer',
	'/(app)/w/[ws=uuid]/trash ?/restore': 'owner',
	'/api/v1/workspaces/[ws=uuid]/trash GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/trash/[id=uuid]/restore POST': 'owner',
	'/(app)/w/[ws=uuid]/members ?/invite': 'owner',
	'/(app)/w/[ws=uuid]/members ?/resendInvitation': 'owner',
	'/(app)/w/[ws=uuid]/members ?/role': 'owner',
	'/(app)/w/[ws=uuid]/members ?/remove': 'owner',
	'/(app)/w/[ws=uuid]/members ?/rename': 'owner',
	'/(app)/w/[ws=uuid]/members ?/deleteWorkspace': 'owner',
	'/api/v1/workspaces GET': 'user',
	'/api/v1/openapi.json GET': 'public',
	'/api-docs GET': 'public',
	'/(app)/settings/tokens GET': 'user',
	'/(app)/settings/tokens ?/create': 'user',
	'/(app)/settings/tokens ?/revoke': 'user',
	'/api/v1/workspaces/[ws=uuid]/molecules GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/molecules POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/molecules/[id=uuid] GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/molecules/[id=uuid] PATCH': 'editor',
	'/api/v1/workspaces/[ws=uuid]/molecules/[id=uuid] DELETE': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid] GET': 'viewer',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid] PATCH': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid] DELETE': 'editor'
};

/** Records that the foundation's id routes need besides the molecule and polymorph. */
export async function seed(db: Db, fx: { ws: string; owner: { id: string }; molecule: { id: string } }): Promise<Record<string, string>> {
	const actor = { userId: fx.owner.id, workspaceId: fx.ws, role: 'owner' as const };
	const { record } = await createBundle(db, actor, bundleRequest.parse({ moleculeId: fx.molecule.id, alpha: 0.2, tuningGammas: [0.3] }));
	// A record in the trash, for the restore route.
	const p = await createPolymorph(db, actor, fx.molecule.id, { label: 'trashed for the role matrix', spaceGroup: 'P1', a: 5, b: 5, c: 5, alphaDeg: 90, betaDeg: 90, gammaDeg: 90, z: 1, structureSource: '', notes: '' });
	await deletePolymorph(db, actor, p.id);
	const trashed = await db.selectFrom('deleted_record').select('id').where('entity_id', '=', p.id).executeTakeFirstOrThrow();
	return { bundles: record.id, trash: trashed.id };
}
