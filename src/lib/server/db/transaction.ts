import type { Transaction } from 'kysely';
import type { Executor } from './create-db';
import type { Database } from './schema';

/**
 * Runs `fn` in a transaction: a new one on the pool, or the caller's when `db` already is one, so
 * services compose (the demo seed runs many of them as one all-or-nothing write).
 */
export function inTransaction<T>(db: Executor, fn: (tx: Transaction<Database>) => Promise<T>): Promise<T> {
	return db.isTransaction ? fn(db as Transaction<Database>) : db.transaction().execute(fn);
}
