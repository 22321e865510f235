import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { rerunsBody } from '$lib/schemas/levels';
import { getPolymorph } from '$lib/server/services/polymorphs';
import { addReruns, listReruns } from '$lib/server/services/reruns';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	await getPolymorph(db(), event.params.ws!, event.params.id!);
	return json({ items: await listReruns(db(), event.params.ws!, event.params.id!), nextCursor: null });
});

/** Screened rerun results typed or computed elsewhere: frontier orbital energies in hartree. */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const { results } = rerunsBody.parse(await readJson(event));
	const stored = await addReruns(db(), actor, event.params.id!, results.map((r) => ({ ...r, lumoHartree: r.lumoHartree ?? null })), 'typed');
	return json({ items: stored }, { status: 201 });
});
