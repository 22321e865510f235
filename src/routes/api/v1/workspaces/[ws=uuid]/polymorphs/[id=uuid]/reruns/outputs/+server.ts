import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readUpload } from '$lib/server/http';
import { ingestReruns } from '$lib/server/services/reruns';

/** Upload screened-rerun outputs as the raw body (a bundle zip or one NWChem output); ?name= gives the file name. */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const { name, bytes } = await readUpload(event);
	const r = await ingestReruns(db(), actor, event.params.id!, name, bytes);
	return json(r, { status: 201 });
});
