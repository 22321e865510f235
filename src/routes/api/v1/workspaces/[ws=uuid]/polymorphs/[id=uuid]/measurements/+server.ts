import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { measurementInput } from '$lib/schemas/measurement';
import { addMeasurement, listMeasurements } from '$lib/server/services/measurements';
import { getPolymorph } from '$lib/server/services/polymorphs';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	await getPolymorph(db(), event.params.ws!, event.params.id!);
	return json({ items: await listMeasurements(db(), event.params.ws!, event.params.id!), nextCursor: null });
});

export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const m = await addMeasurement(db(), actor, event.params.id!, measurementInput.parse(await readJson(event)));
	return json(m, { status: 201 });
});
