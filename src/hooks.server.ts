import { json, type Handle, type HandleServerError, type RequestEvent } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from '$lib/server/auth';
import { closeDb, db } from '$lib/server/db';
import { DB_DOWN_MESSAGE, DB_RETRY_AFTER_SECONDS, isDatabaseUnavailable } from '$lib/server/db/availability';
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

/**
 * While PostgreSQL is down (stopped, restarting), every request that needs it answers 503 with
 * Retry-After: a JSON error body on /api, the envelope SvelteKit's client expects for data and form
 * requests, and a plain page otherwise. The pool reconnects by itself once the database is back.
 * Errors thrown inside loads and actions reach `handleError` first, which flags the event.
 */
const databaseDown: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (e) {
		if (!isDatabaseUnavailable(e)) throw e;
		console.error(`[db] ${event.request.method} ${event.url.pathname}: database unavailable:`, (e as Error).message);
		event.locals.databaseDown = true;
		response = new Response(null, { status: 500 });
	}
	return event.locals.databaseDown ? databaseDownResponse(event) : response;
};

function databaseDownResponse(event: RequestEvent): Response {
	const headers = { 'retry-after': String(DB_RETRY_AFTER_SECONDS), 'cache-control': 'no-store' };
	let r: Response;
	if (event.url.pathname.startsWith('/api/')) {
		r = apiError(503, 'database_unavailable', DB_DOWN_MESSAGE);
	} else if (event.isDataRequest) {
		r = json(DB_DOWN_MESSAGE, { status: 503 });
	} else if (event.request.headers.get('x-sveltekit-action') === 'true') {
		r = json({ type: 'error', status: 503, error: { message: DB_DOWN_MESSAGE } }, { status: 503 });
	} else {
		r = new Response(DB_DOWN_PAGE, { status: 503, headers: { 'content-type': 'text/html; charset=utf-8' } });
	}
	for (const [k, v] of Object.entries(headers)) r.headers.set(k, v);
	return r;
}

const DB_DOWN_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Database unavailable · Kappaline</title></head>
<body><h1>The database is unavailable</h1>
<p>${DB_DOWN_MESSAGE}</p>
<p><a href="">Try again</a></p></body></html>
`;

export const handle = sequence(securityHeaders, databaseDown, bearerToken, authHandle, sessionUser);

export const handleError: HandleServerError = ({ error, event, status }) => {
	const id = crypto.randomUUID().slice(0, 8);
	if (isDatabaseUnavailable(error)) {
		event.locals.databaseDown = true;
		console.error(`[db ${id}] ${event.request.method} ${event.url.pathname}: database unavailable:`, (error as Error).message);
		return { message: DB_DOWN_MESSAGE, id };
	}
	if (status !== 404) console.error(`[error ${id}] ${event.request.method} ${event.url.pathname}:`, error);
	return { message: 'Something went wrong on our side.', id };
};

process.on('sveltekit:shutdown', () => {
	void closeDb();
});
