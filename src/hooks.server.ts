import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';

const sessionUser: Handle = async ({ event, resolve }) => {
	const session = await event.locals.auth();
	const u = session?.user;
	event.locals.user = u?.id && u.email ? { id: u.id, email: u.email, name: u.name ?? null } : null;
	return resolve(event);
};

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('X-Content-Type-Options', 'nosniff');
	response.headers.set('Referrer-Policy', 'same-origin');
	response.headers.set('X-Frame-Options', 'DENY');
	return response;
};

export const handle = sequence(securityHeaders, authHandle, sessionUser);

export const handleError: HandleServerError = ({ error, event, status }) => {
	const id = crypto.randomUUID().slice(0, 8);
	if (status !== 404) console.error(`[error ${id}] ${event.request.method} ${event.url.pathname}:`, error);
	const message = isDbDown(error) ? 'The database is not reachable right now; try again in a moment.' : 'Something went wrong on our side.';
	return { message, id };
};

function isDbDown(e: unknown): boolean {
	const code = (e as { code?: string })?.code;
	return code === 'ECONNREFUSED' || code === '57P01' || code === '57P03';
}

process.on('sveltekit:shutdown', () => {
	void closeDb();
});
