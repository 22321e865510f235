import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, expectedVersion, readJson } from '$lib/server/http';
import { studyPatch } from '$lib/schemas/tuning';
import { deleteStudy, getStudy, updateStudy } from '$lib/server/services/tuning';

/** The study with its scan points; the stored result is at ./result. */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const { result: _r, ...s } = await getStudy(db(), event.params.ws!, event.params.id!);
	return json(s, { headers: { etag: `"${s.version}"` } });
});

export const PATCH = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const body = (await readJson(event)) as Record<string, unknown>;
	const version = expectedVersion(event, body?.version);
	const { version: _v, ...rest } = body ?? {};
	const s = await updateStudy(db(), actor, event.params.id!, version, studyPatch.parse(rest));
	return json(s, { headers: { etag: `"${s.version}"` } });
});

export const DELETE = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const header = event.request.headers.get('if-match');
	await deleteStudy(db(), actor, event.params.id!, header ? expectedVersion(event) : undefined);
	return new Response(null, { status: 204 });
});
