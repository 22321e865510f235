import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { epsilonChoiceInput } from '$lib/schemas/dielectric';
import { chooseEpsilon, getEpsilonInUse } from '$lib/server/services/dielectric';
import { getPolymorph } from '$lib/server/services/polymorphs';

/** The polymorph's epsilon in use (404 with type not_found when none is chosen yet). */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	await getPolymorph(db(), event.params.ws!, event.params.id!);
	const c = await getEpsilonInUse(db(), event.params.ws!, event.params.id!);
	return json({ epsilonInUse: c }, { headers: c ? { etag: `"${c.version}"` } : {} });
});

/** Body { entryId, reason, version? }; `version` (or If-Match) is the choice version read, required once one exists. */
export const PUT = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const body = ((await readJson(event)) ?? {}) as Record<string, unknown>;
	const header = event.request.headers.get('if-match');
	const input = epsilonChoiceInput.parse({ ...body, version: header ? header.replace(/^W\//, '').replace(/"/g, '') : body.version });
	const c = await chooseEpsilon(db(), actor, event.params.id!, input);
	return json({ epsilonInUse: c }, { headers: { etag: `"${c.version}"` } });
});
