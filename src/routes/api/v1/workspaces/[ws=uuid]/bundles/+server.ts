import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { bundleRequest } from '$lib/schemas/bundle';
import { createBundle, listBundles } from '$lib/server/services/bundles';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const sp = event.url.searchParams;
	const moleculeId = sp.get('moleculeId') ? z.uuid('moleculeId must be a UUID').parse(sp.get('moleculeId')) : undefined;
	const polymorphId = sp.get('polymorphId') ? z.uuid('polymorphId must be a UUID').parse(sp.get('polymorphId')) : undefined;
	return json({ items: await listBundles(db(), event.params.ws!, { moleculeId, polymorphId }), nextCursor: null });
});

/** Builds and records a bundle; answers the zip itself (its record id in X-Kappaline-Bundle). */
export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const { record, bytes } = await createBundle(db(), actor, bundleRequest.parse(await readJson(event)));
	return new Response(Buffer.from(bytes), {
		status: 201,
		headers: { 'content-type': 'application/zip', 'content-disposition': `attachment; filename="${record.fileName}"`, 'x-kappaline-bundle': record.id, location: `/api/v1/workspaces/${actor.workspaceId}/bundles/${record.id}` }
	});
});
