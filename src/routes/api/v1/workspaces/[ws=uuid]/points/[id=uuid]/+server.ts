import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, expectedVersion, readJson } from '$lib/server/http';
import { pointPatch } from '$lib/schemas/tuning';
import { updatePoint } from '$lib/server/services/tuning';

/** Edit or exclude one scan point (`{"excluded": true, "excludedReason": "..."}`); needs the point's version. */
export const PATCH = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const body = (await readJson(event)) as Record<string, unknown>;
	const version = expectedVersion(event, body?.version);
	const { version: _v, ...rest } = body ?? {};
	const p = await updatePoint(db(), actor, event.params.id!, version, pointPatch.parse(rest));
	return json(p, { headers: { etag: `"${p.version}"` } });
});
