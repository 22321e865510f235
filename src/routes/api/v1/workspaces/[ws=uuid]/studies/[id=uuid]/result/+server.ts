import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { api } from '$lib/server/http';
import { getStudy } from '$lib/server/services/tuning';

/** The stored analysis result (gamma*, levels, diagnostics, analysis version, input hash and the input). */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const s = await getStudy(db(), event.params.ws!, event.params.id!);
	if (!s.result) throw new NotFoundError('saved result (save an analysis of this study first)');
	return json({ studyId: s.id, savedAt: s.resultSavedAt, ...s.result }, { headers: { etag: `"${s.version}"` } });
});
