import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { createWorkspace } from '$lib/server/repo/workspaces';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	return {};
};

export const actions: Actions = {
	create: async (event) => {
		const user = requireUser(event);
		const name = String((await event.request.formData()).get('name') ?? '').trim();
		if (!name || name.length > 120) return fail(400, { name, message: 'A workspace name has 1 to 120 characters.' });
		const id = await createWorkspace(db(), name, user.id);
		redirect(303, `/w/${id}/molecules`);
	}
};
