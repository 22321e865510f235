import { json } from '@sveltejs/kit';
import { sql } from 'kysely';
import { db } from '$lib/server/db';
import { DB_RETRY_AFTER_SECONDS } from '$lib/server/db/availability';

/** Liveness and database reachability (used by the start and test commands). */
export async function GET() {
	try {
		await sql`select 1`.execute(db());
		return json({ ok: true, database: 'up' });
	} catch {
		return json({ ok: false, database: 'down' }, { status: 503, headers: { 'retry-after': String(DB_RETRY_AFTER_SECONDS), 'cache-control': 'no-store' } });
	}
}
