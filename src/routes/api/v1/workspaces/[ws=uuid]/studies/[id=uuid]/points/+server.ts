import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { api, readJson } from '$lib/server/http';
import { bulkPointsBody } from '$lib/schemas/tuning';
import { importPoints } from '$lib/server/services/tuning';

/**
 * Bulk add of scan points (energies in hartree, gamma in bohr^-1), all or nothing. Send an
 * `Idempotency-Key` header so that a retried job does not add the points twice: a repeat with the same
 * key and body answers as the first call did (with `replayed: true`) and stores nothing. `If-Match` is
 * optional here (points are added, nothing is overwritten).
 */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const { points } = bulkPointsBody.parse(await readJson(event, 5_000_000));
	const key = event.request.headers.get('idempotency-key') ?? undefined;
	const ifMatch = event.request.headers.get('if-match');
	let expectedVersion: number | undefined;
	if (ifMatch) {
		expectedVersion = Number(ifMatch.replace(/^W\//, '').replace(/"/g, ''));
		if (!Number.isInteger(expectedVersion) || expectedVersion < 1) throw new ValidationError('If-Match must be the study version you read, e.g. "3"', 'version');
	}
	const r = await importPoints(db(), actor, event.params.id!, points, { idempotencyKey: key, expectedVersion, source: 'the API' });
	return json(r, { status: r.replayed ? 200 : 201, headers: { etag: `"${r.study.version}"` } });
});
