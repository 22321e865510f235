import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api } from '$lib/server/http';
import { listTrash } from '$lib/server/services/trash';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	return json({ items: await listTrash(db(), event.params.ws!) });
});
