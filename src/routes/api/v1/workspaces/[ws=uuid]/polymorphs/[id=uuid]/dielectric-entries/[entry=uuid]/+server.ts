import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, expectedVersion } from '$lib/server/http';
import { deleteDielectricEntry, getDielectricEntry } from '$lib/server/services/dielectric';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const e = await getDielectricEntry(db(), event.params.ws!, event.params.id!, event.params.entry!);
	return json(e, { headers: { etag: `"${e.version}"` } });
});

export const DELETE = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const header = event.request.headers.get('if-match');
	await deleteDielectricEntry(db(), actor, event.params.id!, event.params.entry!, header ? expectedVersion(event) : undefined);
	return new Response(null, { status: 204 });
});
