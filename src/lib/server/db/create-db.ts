import { Kysely, PostgresDialect, type Transaction } from 'kysely';
import pg from 'pg';
import type { Database } from './schema';

// bigint (activity ids, counts) arrive as strings; timestamps as Date.
pg.types.setTypeParser(20, (v) => Number(v));

export type Db = Kysely<Database>;
/** Anything a repository can run on: the pool-backed handle or a transaction. */
export type Executor = Kysely<Database> | Transaction<Database>;

/** Factory free of SvelteKit imports, so scripts and tests can use it. */
export function createDb(connectionString: string, options: { max?: number } = {}): Db {
	const pool = new pg.Pool({ connectionString, max: options.max ?? 10 });
	// A dropped connection (e.g. the cluster restarting) must not crash the process.
	pool.on('error', (err) => console.error('[db] idle client error:', err.message));
	return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}
