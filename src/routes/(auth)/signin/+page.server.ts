import { fail, isRedirect, redirect } from '@sveltejs/kit';
import { AuthError } from '@auth/sveltekit';
import { signIn, withForm } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

const safeRedirect = (to: FormDataEntryValue | string | null): string => {
	const s = typeof to === 'string' ? to : '';
	return s.startsWith('/') && !s.startsWith('//') ? s : '/';
};

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeRedirect(url.searchParams.get('redirectTo')));
	const code = url.searchParams.get('error');
	return {
		redirectTo: safeRedirect(url.searchParams.get('redirectTo')),
		linkError: code === 'Verification' ? 'That sign-in link is invalid, expired or already used: ask for a new one.' : code ? 'Sign-in failed: try again.' : null
	};
};

/** Re-posts the form to Auth.js with the provider chosen by the action. */
async function authSignIn(event: Parameters<Actions[string]>[0], providerId: string) {
	const form = await event.request.clone().formData();
	const email = String(form.get('email') ?? '').trim();
	const redirectTo = safeRedirect(form.get('redirectTo'));
	if (!email) return fail(400, { provider: providerId, email, message: 'Enter your e-mail address.' });
	const fields: Record<string, string> = { providerId, email, redirectTo };
	if (providerId === 'credentials') fields.password = String(form.get('password') ?? '');
	try {
		await signIn(withForm(event, fields));
	} catch (e) {
		if (isRedirect(e)) {
			// Auth.js reports a failed credential check as a redirect to the error page.
			if (e.location.includes('error=')) return fail(400, { provider: providerId, email, message: failureMessage(e.location) });
			throw e;
		}
		if (e instanceof AuthError) return fail(400, { provider: providerId, email, message: failureMessage(`code=${(e as { code?: string }).code ?? ''}`) });
		throw e;
	}
	return fail(500, { provider: providerId, email, message: 'Sign-in did not complete.' });
}

function failureMessage(location: string): string {
	if (location.includes('rate_limited')) return 'Too many sign-in attempts: wait 15 minutes and try again.';
	if (location.includes('EmailSignin') || location.includes('Verification')) return 'The sign-in e-mail could not be sent: try again shortly.';
	return 'Wrong e-mail or password.';
}

export const actions: Actions = {
	password: (event) => authSignIn(event, 'credentials'),
	link: (event) => authSignIn(event, 'nodemailer')
};
