import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api } from '$lib/server/http';
import { restoreFromTrash } from '$lib/server/services/trash';

export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'owner');
	const r = await restoreFromTrash(db(), actor, event.params.id!);
	return json({ restored: `${r.entity} ${r.label}`, notes: r.notes });
});
