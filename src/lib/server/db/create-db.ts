import { Kysely, PostgresDialect, type Transaction } from 'kysely';
import pg from 'pg';
import type { Database } from './schema';

// bigint (activity ids, counts) arrive as strings; timestamps as Date.
pg.types.setTypeParser(20, (v) => Number(v));

export type Db = Kysely<Database>;
/** Anything a repository can run on: the pool-backed handle or a transaction. */
export type Executor = Kysely<Database> | Transaction<Database>;

/** Factory free of SvelteKit imports, so scripts and tests can use it. */
export function createDb(connectionString: string, options: { max?: number; connectTimeoutMs?: number } = {}): Db {
	// A bounded connect time: while the cluster is down, requests fail fast (503) instead of hanging.
	const pool = new pg.Pool({ connectionString, max: options.max ?? 10, connectionTimeoutMillis: options.connectTimeoutMs ?? 5000 });
	// A dropped idle connection (e.g. the cluster restarting) must not crash the process; the pool
	// discards that client and opens new ones once the database answers again.
	pool.on('error', (err) => console.error('[db] idle client error:', err.message));
	// The pool listens only on idle clients: a client that is checked out (between the statements of a
	// transaction, or just acquired) when the server goes away emits 'error' with no listener, which
	// would end the process. Listen on every client; its next query fails (503) and the pool drops it.
	pool.on('connect', (client) => {
		client.on('error', (err) => console.error('[db] connection lost:', err.message));
	});
	return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}
