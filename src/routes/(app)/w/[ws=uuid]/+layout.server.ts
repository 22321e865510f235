import { requireRole } from '$lib/server/authz';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const actor = await requireRole(event, event.params.ws, 'viewer');
	return { workspace: { id: actor.workspaceId, name: actor.workspaceName, isDemo: actor.isDemo, role: actor.role } };
};
