import { sql } from 'kysely';
import type { Executor } from './db';

/**
 * Fixed-window rate limit kept in PostgreSQL (shared by every server process, survives restarts).
 * Returns whether this attempt is allowed and, when not, the seconds until the window ends.
 */
export async function hitRateLimit(
	db: Executor,
	key: string,
	limit: number,
	windowSeconds: number
): Promise<{ allowed: boolean; retryAfterSeconds: number }> {
	const row = await db
		.insertInto('rate_limit')
		.values({ key, window_start: new Date(), count: 1 })
		.onConflict((oc) =>
			oc.column('key').doUpdateSet({
				count: sql`case when rate_limit.window_start < now() - make_interval(secs => ${windowSeconds}) then 1 else rate_limit.count + 1 end`,
				window_start: sql`case when rate_limit.window_start < now() - make_interval(secs => ${windowSeconds}) then now() else rate_limit.window_start end`
			})
		)
		.returning(['count', 'window_start'])
		.executeTakeFirstOrThrow();
	const ends = new Date(row.window_start).getTime() + windowSeconds * 1000;
	return { allowed: row.count <= limit, retryAfterSeconds: Math.max(1, Math.ceil((ends - Date.now()) / 1000)) };
}

/** Requests one API token may make per window before it gets 429 (a test can lower it through the environment). */
export const TOKEN_RATE_LIMIT = { requests: Number(process.env.KAPPALINE_TOKEN_RATE_LIMIT) || 600, windowSeconds: 60 };
