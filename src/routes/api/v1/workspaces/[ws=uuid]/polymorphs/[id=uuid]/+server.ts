import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, expectedVersion, readJson } from '$lib/server/http';
import { polymorphPatch } from '$lib/schemas/polymorph';
import { deletePolymorph, getPolymorph, updatePolymorph } from '$lib/server/services/polymorphs';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const p = await getPolymorph(db(), event.params.ws!, event.params.id!);
	return json(p, { headers: { etag: `"${p.version}"` } });
});

export const PATCH = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const body = (await readJson(event)) as Record<string, unknown>;
	const version = expectedVersion(event, body?.version);
	const { version: _v, ...rest } = body ?? {};
	const p = await updatePolymorph(db(), actor, event.params.id!, version, polymorphPatch.parse(rest));
	return json(p, { headers: { etag: `"${p.version}"` } });
});

export const DELETE = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const header = event.request.headers.get('if-match');
	await deletePolymorph(db(), actor, event.params.id!, header ? expectedVersion(event) : undefined);
	return new Response(null, { status: 204 });
});
