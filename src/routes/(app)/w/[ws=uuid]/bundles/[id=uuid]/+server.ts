import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError, ValidationError } from '$lib/server/errors';
import { downloadBundle } from '$lib/server/services/bundles';

/** Downloads a recorded bundle again (rebuilt and checked against its SHA-256). */
export const GET: RequestHandler = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	try {
		const { fileName, bytes } = await downloadBundle(db(), event.params.ws, event.params.id);
		return new Response(Buffer.from(bytes), { headers: { 'content-type': 'application/zip', 'content-disposition': `attachment; filename="${fileName}"` } });
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		if (e instanceof ValidationError) error(409, e.message);
		throw e;
	}
};
