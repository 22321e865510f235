import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { api, readJson } from '$lib/server/http';
import { cifImportInput, MAX_CIF_BYTES } from '$lib/schemas/dielectric';
import { importPolymorphFromCif } from '$lib/server/services/cif-import';

/**
 * Creates a polymorph from a CIF. Body: JSON { moleculeId, cif, label?, fileName?, notes? }, or the CIF text
 * itself (Content-Type text/plain or chemical/x-cif) with ?moleculeId=...&label=...&fileName=... in the URL.
 */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const type = event.request.headers.get('content-type') ?? '';
	let body: unknown;
	if (type.includes('json')) body = await readJson(event, MAX_CIF_BYTES * 2);
	else {
		const text = await event.request.text();
		if (text.length > MAX_CIF_BYTES) throw new ValidationError(`the CIF is larger than the limit of ${MAX_CIF_BYTES / 1_000_000} MB`, 'cif');
		const sp = event.url.searchParams;
		body = { moleculeId: sp.get('moleculeId'), label: sp.get('label'), fileName: sp.get('fileName'), cif: text };
	}
	const r = await importPolymorphFromCif(db(), actor, cifImportInput.parse(body));
	return json(r, { status: 201, headers: { etag: `"${r.polymorph.version}"` } });
});
