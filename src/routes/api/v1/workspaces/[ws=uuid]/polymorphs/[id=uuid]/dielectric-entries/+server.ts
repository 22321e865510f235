import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { dielectricEntryInput } from '$lib/schemas/dielectric';
import { addDielectricEntry, getEpsilonInUse, listDielectricEntries } from '$lib/server/services/dielectric';
import { getPolymorph } from '$lib/server/services/polymorphs';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	await getPolymorph(db(), event.params.ws!, event.params.id!);
	const [items, inUse] = await Promise.all([listDielectricEntries(db(), event.params.ws!, event.params.id!), getEpsilonInUse(db(), event.params.ws!, event.params.id!)]);
	return json({ items, epsilonInUse: inUse ? { entryId: inUse.entryId, reason: inUse.reason, version: inUse.version } : null });
});

export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const entry = await addDielectricEntry(db(), actor, event.params.id!, dielectricEntryInput.parse(await readJson(event)));
	return json(entry, { status: 201, headers: { etag: `"${entry.version}"` } });
});
