import { redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	redirect(303, `/w/${event.params.ws}/molecules`);
};
