import { fail, redirect } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { resetPassword } from '$lib/server/services/accounts';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async ({ request, params }) => {
		const form = await request.formData();
		const password = String(form.get('password') ?? '');
		if (password.length < 10) return fail(400, { message: 'Use at least 10 characters.' });
		if (password !== String(form.get('confirm') ?? '')) return fail(400, { message: 'The two passwords differ.' });
		try {
			await resetPassword(db(), params.token, password);
		} catch (e) {
			if (e instanceof ValidationError) return fail(400, { message: e.message });
			throw e;
		}
		redirect(303, '/signin?reset=1');
	}
};
