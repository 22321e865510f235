import { sql } from 'kysely';
import type { Executor } from './db';

/**
 * Fixed-window rate limit kept in PostgreSQL (shared by every server process, survives restarts).
 * Returns whether this attempt is allowed and, when not, the seconds until the window ends. Call it on
 * the pool, never inside a transaction (it turns synchronous_commit off for its own transaction).
 */
export async function hitRateLimit(
	db: Executor,
	key: string,
	limit: number,
	windowSeconds: number
): Promise<{ allowed: boolean; retryAfterSeconds: number }> {
	// A counter, not a record: its commit need not wait for the WAL flush (synchronous_commit off for this
	// statement's transaction only). A crash can forget the last few hits; nothing else is affected. Every
	// API request makes this write on one row per token, so waiting for the flush there serialised them
	// (measured by the load benchmark, bench/http/load.ts).
	const { rows } = await sql<{ count: number; window_start: Date }>`
		insert into rate_limit (key, window_start, count)
		select ${key}, now(), 1 from (select set_config('synchronous_commit', 'off', true)) as cfg
		on conflict (key) do update set
			count = case when rate_limit.window_start < now() - make_interval(secs => ${windowSeconds}) then 1 else rate_limit.count + 1 end,
			window_start = case when rate_limit.window_start < now() - make_interval(secs => ${windowSeconds}) then now() else rate_limit.window_start end
		returning count, window_start`.execute(db);
	const row = rows[0];
	const ends = new Date(row.window_start).getTime() + windowSeconds * 1000;
	return { allowed: row.count <= limit, retryAfterSeconds: Math.max(1, Math.ceil((ends - Date.now()) / 1000)) };
}

/** Requests one API token may make per window before it gets 429 (a test can lower it through the environment). */
export const TOKEN_RATE_LIMIT = { requests: Number(process.env.KAPPALINE_TOKEN_RATE_LIMIT) || 600, windowSeconds: 60 };
