import { db } from '$lib/server/db';
import { listWorkspacesForUser } from '$lib/server/repo/workspaces';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async ({ locals }) => {
	const user = locals.user;
	return { user, workspaces: user ? await listWorkspacesForUser(db(), user.id) : [] };
};
