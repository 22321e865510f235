import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { bundleRequestFromForm } from '$lib/schemas/bundle';
import { previewBundle } from '$lib/server/services/bundles';
import { _bundleFormError } from '../+server';

/** The files a bundle form would produce, as JSON for the preview list; records nothing. */
export const POST: RequestHandler = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	const f = Object.fromEntries(await event.request.formData()) as Record<string, string>;
	try {
		return json({ files: await previewBundle(db(), event.params.ws, bundleRequestFromForm(f)) });
	} catch (e) {
		return _bundleFormError(e);
	}
};
