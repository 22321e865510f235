import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api } from '$lib/server/http';
import { downloadBundle } from '$lib/server/services/bundles';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const { fileName, bytes } = await downloadBundle(db(), event.params.ws!, event.params.id!);
	return new Response(Buffer.from(bytes), { headers: { 'content-type': 'application/zip', 'content-disposition': `attachment; filename="${fileName}"` } });
});
