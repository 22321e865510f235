import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { bundleRequestFromForm } from '$lib/schemas/bundle';
import { createBundle } from '$lib/server/services/bundles';
import { z } from 'zod';

/** Form post from a page: builds, records and downloads a rerun bundle (zip). */
export const POST: RequestHandler = async (event) => {
	const actor = await requireRole(event, event.params.ws, 'editor');
	const f = Object.fromEntries(await event.request.formData()) as Record<string, string>;
	try {
		const req = bundleRequestFromForm(f);
		const { record, bytes } = await createBundle(db(), actor, req);
		return new Response(Buffer.from(bytes), {
			headers: { 'content-type': 'application/zip', 'content-disposition': `attachment; filename="${record.fileName}"`, 'x-kappaline-bundle': record.id }
		});
	} catch (e) {
		return _bundleFormError(e);
	}
};

/** Bad form input becomes a 400 with the reason; anything else is a server error. */
export function _bundleFormError(e: unknown): never {
	if (e instanceof z.ZodError) error(400, e.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
	if (e instanceof ValidationError) error(400, e.message);
	if (e instanceof Error && /not a number|range/.test(e.message)) error(400, e.message);
	throw e;
}
