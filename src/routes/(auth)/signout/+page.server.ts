import { redirect } from '@sveltejs/kit';
import { signOut, withForm } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => redirect(303, '/');

export const actions: Actions = {
	default: async (event) => {
		await signOut(withForm(event, { redirectTo: '/' }));
	}
};
