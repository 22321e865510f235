import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readUpload } from '$lib/server/http';
import { ingestScanOutputs } from '$lib/server/services/tuning-ingest';

/** Upload tuning-scan outputs as the raw body (the bundle zip or one NWChem output); the points are added to the study. */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const { name, bytes } = await readUpload(event);
	const r = await ingestScanOutputs(db(), actor, event.params.id!, name, bytes, { idempotencyKey: event.request.headers.get('idempotency-key') ?? undefined });
	return json(r, { status: r.replayed ? 200 : 201 });
});
