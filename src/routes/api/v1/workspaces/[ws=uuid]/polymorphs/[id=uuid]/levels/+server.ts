import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api } from '$lib/server/http';
import { levelsQuery, substrateOf } from '$lib/schemas/levels';
import { CAUTIONS } from '$lib/science/screening';
import { listMeasurements } from '$lib/server/services/measurements';
import { listReruns } from '$lib/server/services/reruns';
import { polymorphLevels } from '$lib/server/services/levels-api';

/** Screened parameters and solid-state levels (Born, rerun results, measurements), computed on request. */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const q = levelsQuery.parse(Object.fromEntries(event.url.searchParams));
	const r = await polymorphLevels(db(), event.params.ws!, event.params.id!, { epsilon: q.epsilon, radiusA: q.radius, substrate: substrateOf(q) });
	const [reruns, measurements] = await Promise.all([listReruns(db(), event.params.ws!, event.params.id!), listMeasurements(db(), event.params.ws!, event.params.id!)]);
	return json({ ...r, reruns, measurements, cautions: CAUTIONS });
});
