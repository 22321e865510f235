import { z } from 'zod';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { formFailure } from '$lib/server/http';
import { listTrash, restoreFromTrash } from '$lib/server/services/trash';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, event.params.ws, 'viewer');
	return { items: await listTrash(db(), event.params.ws), canRestore: actor.role === 'owner' };
};

export const actions: Actions = {
	restore: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			const r = await restoreFromTrash(db(), actor, z.uuid().parse(values.id));
			return { restored: `${r.entity} ${r.label}`, notes: r.notes };
		} catch (e) {
			return formFailure(e, values);
		}
	}
};
