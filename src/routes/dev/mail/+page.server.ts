import { error } from '@sveltejs/kit';
import { capturedMail } from '$lib/server/dev-mail';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = () => {
	const messages = capturedMail();
	if (!messages) error(404, 'Not found');
	return { messages };
};
