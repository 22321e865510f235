import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { db } from '$lib/server/db';
import { signUp } from '$lib/server/services/accounts';
import { ValidationError } from '$lib/server/errors';
import { signIn, withForm } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

const schema = z.object({
	name: z.string().trim().max(120).default(''),
	email: z.email('enter a valid e-mail address').max(320),
	password: z.string().min(10, 'use at least 10 characters').max(200)
});

export const load: PageServerLoad = ({ locals, url }) => {
	if (locals.user) redirect(303, '/');
	return { redirectTo: url.searchParams.get('redirectTo') ?? '/' };
};

export const actions: Actions = {
	default: async (event) => {
		const form = Object.fromEntries(await event.request.clone().formData());
		const values = { name: String(form.name ?? ''), email: String(form.email ?? '') };
		const r = schema.safeParse(form);
		if (!r.success) return fail(400, { values, errors: z.flattenError(r.error).fieldErrors as Record<string, string[]> });
		try {
			await signUp(db(), r.data);
		} catch (e) {
			if (e instanceof ValidationError) return fail(400, { values, errors: { [e.field ?? 'email']: [e.message] } });
			throw e;
		}
		const redirectTo = String(form.redirectTo ?? '/');
		await signIn(
			withForm(event, {
				providerId: 'credentials',
				email: r.data.email,
				password: r.data.password,
				redirectTo: redirectTo.startsWith('/') && !redirectTo.startsWith('//') ? redirectTo : '/'
			})
		);
	}
};
