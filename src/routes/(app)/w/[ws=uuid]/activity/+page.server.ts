import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { listActivity } from '$lib/server/repo/activity';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	const before = event.url.searchParams.get('before') ?? undefined;
	const entries = await listActivity(db(), event.params.ws, { limit: 50, before: before && /^\d+$/.test(before) ? before : undefined });
	return { entries, next: entries.length === 50 ? entries[entries.length - 1].id : null };
};
