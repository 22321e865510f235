import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { decodeCursor, encodeCursor, pageLimit } from '$lib/server/cursor';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/http';
import { moleculeInput } from '$lib/schemas/molecule';
import { createMolecule, listMolecules } from '$lib/server/services/molecules';

export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const sp = event.url.searchParams;
	const limit = pageLimit(sp.get('limit'));
	const after = decodeCursor(sp.get('cursor'), ['name', 'id'] as const);
	const sort = sp.get('sort') === 'formula' ? 'formula' : sp.get('sort') === 'updated_at' ? 'updated_at' : 'name';
	const dir = sp.get('dir') === 'desc' ? 'desc' : 'asc';
	// Keyset cursors follow the default order (name, id); other sorts page by offset within one request.
	const { total, items } = await listMolecules(db(), event.params.ws!, { q: sp.get('q') ?? undefined, sort: after ? 'name' : sort, dir: after ? 'asc' : dir, limit, after });
	const last = items.at(-1);
	const nextCursor = items.length === limit && last && sort === 'name' && dir === 'asc' ? encodeCursor({ name: last.name, id: last.id }) : null;
	return json({ items: items.map(({ geometryXyz: _g, ...m }) => m), total, nextCursor });
});

export const POST = api(async (event) => {
	const actor = await requireRole(event, event.params.ws!, 'editor');
	const input = moleculeInput.parse(await readJson(event));
	const m = await createMolecule(db(), actor, input);
	return json(m, { status: 201, headers: { etag: `"${m.version}"`, location: `/api/v1/workspaces/${actor.workspaceId}/molecules/${m.id}` } });
});
