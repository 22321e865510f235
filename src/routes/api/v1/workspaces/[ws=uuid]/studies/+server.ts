import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/authz';
import { decodeCursor, encodeCursor, pageLimit } from '$lib/server/cursor';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { studyInput } from '$lib/schemas/tuning';
import { createStudy, listStudies } from '$lib/server/services/tuning';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const sp = event.url.searchParams;
	const limit = pageLimit(sp.get('limit'));
	const moleculeId = sp.get('moleculeId') ? z.uuid('moleculeId must be a UUID').parse(sp.get('moleculeId')) : undefined;
	const items = await listStudies(db(), event.params.ws!, { moleculeId, limit, after: decodeCursor(sp.get('cursor'), ['name', 'id'] as const) });
	const last = items.at(-1);
	return json({ items, nextCursor: items.length === limit && last ? encodeCursor({ name: last.name, id: last.id }) : null });
});

const createBody = studyInput.extend({ moleculeId: z.uuid('moleculeId must be a UUID') });

export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const { moleculeId, ...input } = createBody.parse(await readJson(event));
	const s = await createStudy(db(), actor, moleculeId, input);
	return json(s, { status: 201, headers: { etag: `"${s.version}"` } });
});
