import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api } from '$lib/server/http';
import { listWorkspacesForUser } from '$lib/server/repo/workspaces';

/** The caller's workspaces and role in each. */
export const GET = api(async (event) => {
	const user = requireUser(event);
	return json({ items: await listWorkspacesForUser(db(), user.id) });
});
