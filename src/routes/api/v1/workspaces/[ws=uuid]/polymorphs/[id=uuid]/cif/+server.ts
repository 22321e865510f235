import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { api, expectedVersion, readJson } from '$lib/server/http';
import { cifReplaceInput, MAX_CIF_BYTES } from '$lib/schemas/dielectric';
import { getStoredCif, replaceCellFromCif } from '$lib/server/services/cif-import';

/** The stored CIF file, as uploaded. */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const c = await getStoredCif(db(), event.params.ws!, event.params.id!);
	if (!c) throw new NotFoundError('CIF');
	return new Response(c.text, { headers: { 'content-type': 'chemical/x-cif; charset=utf-8', 'content-disposition': `attachment; filename="${c.fileName.replace(/["\\\r\n]/g, '_')}"` } });
});

/** Replaces the polymorph's cell from a CIF: JSON { cif, fileName?, version } or If-Match with the polymorph version. */
export const PUT = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const body = ((await readJson(event, MAX_CIF_BYTES * 2)) ?? {}) as Record<string, unknown>;
	const version = expectedVersion(event, body.version);
	const r = await replaceCellFromCif(db(), actor, event.params.id!, version, cifReplaceInput.parse(body));
	return json(r, { headers: { etag: `"${r.polymorph.version}"` } });
});
