import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { api } from '$lib/server/http';
import { ingestScanOutputs } from '$lib/server/services/tuning-ingest';

const MAX_UPLOAD = 50_000_000;

/** Upload tuning-scan outputs as the raw body (the bundle zip or one NWChem output); the points are added to the study. */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const name = event.url.searchParams.get('name') ?? (event.request.headers.get('content-type')?.includes('zip') ? 'outputs.zip' : 'output.out');
	const bytes = new Uint8Array(await event.request.arrayBuffer());
	if (bytes.length === 0) throw new ValidationError('the upload is empty', 'body');
	if (bytes.length > MAX_UPLOAD) throw new ValidationError(`the upload is over the limit of ${MAX_UPLOAD / 1e6} MB`, 'body');
	const r = await ingestScanOutputs(db(), actor, event.params.id!, name, bytes, { idempotencyKey: event.request.headers.get('idempotency-key') ?? undefined });
	return json(r, { status: r.replayed ? 200 : 201 });
});
