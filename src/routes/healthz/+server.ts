import { json } from '@sveltejs/kit';
import { sql } from 'kysely';
import { db } from '$lib/server/db';

/** Liveness and database reachability (used by the start and test commands). */
export async function GET() {
	try {
		await sql`select 1`.execute(db());
		return json({ ok: true, database: 'up' });
	} catch {
		return json({ ok: false, database: 'down' }, { status: 503 });
	}
}
