// Recognises the errors pg raises when PostgreSQL is not reachable (stopped, restarting, refusing
// connections), so the app can answer 503 with Retry-After instead of a generic 500.
// Free of SvelteKit imports: hooks, routes and tests share it.

/** Seconds a client should wait before retrying while the database is down. */
export const DB_RETRY_AFTER_SECONDS = 5;

export const DB_DOWN_MESSAGE = 'The database is not reachable right now (it may be restarting). Nothing was changed by this request; try again in a few seconds.';

// SQLSTATE class 08 (connection exception) and 57P01-57P03 (admin/crash shutdown, cannot connect now).
const SQLSTATE = /^(08|57P0[123])/;
const NODE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN']);
// pg raises these without a code when a connection drops or a pool checkout times out.
const MESSAGES = [/connection terminated/i, /timeout exceeded when trying to connect/i, /connection (?:is )?closed/i, /client has encountered a connection error/i, /terminating connection due to administrator command/i, /the database system is (?:shutting down|starting up|in recovery mode)/i];

/** True when `e` (or its cause, or any error of an AggregateError) says the database is unreachable. */
export function isDatabaseUnavailable(e: unknown, depth = 0): boolean {
	if (!e || typeof e !== 'object' || depth > 4) return false;
	const err = e as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
	if (typeof err.code === 'string' && (NODE_CODES.has(err.code) || SQLSTATE.test(err.code))) return true;
	if (typeof err.message === 'string' && MESSAGES.some((m) => m.test(err.message as string))) return true;
	if (Array.isArray(err.errors) && err.errors.some((x) => isDatabaseUnavailable(x, depth + 1))) return true;
	return isDatabaseUnavailable(err.cause, depth + 1);
}
