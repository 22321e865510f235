import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, expectedVersion, readJson } from '$lib/server/http';
import { moleculePatch } from '$lib/schemas/molecule';
import { deleteMolecule, getMolecule, updateMolecule } from '$lib/server/services/molecules';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const m = await getMolecule(db(), event.params.ws!, event.params.id!);
	return json(m, { headers: { etag: `"${m.version}"` } });
});

export const PATCH = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const body = (await readJson(event)) as Record<string, unknown>;
	const version = expectedVersion(event, body?.version);
	const { version: _v, ...rest } = body ?? {};
	const m = await updateMolecule(db(), actor, event.params.id!, version, moleculePatch.parse(rest));
	return json(m, { headers: { etag: `"${m.version}"` } });
});

export const DELETE = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const header = event.request.headers.get('if-match');
	await deleteMolecule(db(), actor, event.params.id!, header ? expectedVersion(event) : undefined);
	return new Response(null, { status: 204 });
});
