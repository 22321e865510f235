import { fail } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { publicOrigin } from '$lib/server/env';
import { sendMail } from '$lib/server/mail';
import { hitRateLimit } from '$lib/server/rate-limit';
import { createPasswordReset } from '$lib/server/services/accounts';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async ({ request, getClientAddress }) => {
		const email = String((await request.formData()).get('email') ?? '').trim();
		if (!email.includes('@')) return fail(400, { email, message: 'Enter the e-mail address of your account.' });
		const limit = await hitRateLimit(db(), `reset:${getClientAddress()}`, 10, 15 * 60);
		if (!limit.allowed) return fail(429, { email, message: 'Too many requests: wait a few minutes.' });
		const reset = await createPasswordReset(db(), email);
		if (reset) {
			await sendMail(
				reset.email,
				'Reset your Kappaline password',
				`Choose a new password with this link (valid for 30 minutes, single use):\n\n${publicOrigin()}/reset/${reset.token}\n\nIf you did not ask for it, ignore this message.`
			);
		}
		// Same answer whether or not the account exists.
		return { sent: true, email };
	}
};
