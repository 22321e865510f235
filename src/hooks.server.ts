import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from '$lib/server/auth';
import { closeDb, db } from '$lib/server/db';
import { apiError } from '$lib/server/http';
import { hitRateLimit, TOKEN_RATE_LIMIT } from '$lib/server/rate-limit';
import { authenticateToken } from '$lib/server/services/api-tokens';

/** `Authorization: Bearer <token>` on the API: same role checks as a session, limited to the token's workspace. */
const bearerToken: Handle = async ({ event, resolve }) => {
	const header = event.request.headers.get('authorization');
	if (!header || !event.url.pathname.startsWith('/api/')) return resolve(event);
	const m = /^Bearer\s+(\S+)$/i.exec(header);
	if (!m) return apiError(401, 'unauthenticated', 'the Authorization header must be "Bearer <token>"');
	const identity = await authenticateToken(db(), m[1]);
	if (!identity) return apiError(401, 'unauthenticated', 'this token is unknown, revoked or expired');
	const limit = await hitRateLimit(db(), `token:${identity.tokenId}`, TOKEN_RATE_LIMIT.requests, TOKEN_RATE_LIMIT.windowSeconds);
	if (!limit.allowed) {
		const r = apiError(429, 'rate_limited', `this token made more than ${TOKEN_RATE_LIMIT.requests} requests in ${TOKEN_RATE_LIMIT.windowSeconds} s; retry after ${limit.retryAfterSeconds} s`);
		r.headers.set('retry-after', String(limit.retryAfterSeconds));
		return r;
	}
	event.locals.user = identity.user;
	event.locals.token = { id: identity.tokenId, workspaceId: identity.workspaceId, role: identity.role };
	return resolve(event);
};

const sessionUser: Handle = async ({ event, resolve }) => {
	if (event.locals.token) return resolve(event);
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

export const handle = sequence(securityHeaders, bearerToken, authHandle, sessionUser);

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
