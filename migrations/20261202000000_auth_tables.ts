import { sql, type Kysely } from 'kysely';

// Tables owned by the Auth.js Kysely adapter, with its own (camelCase, quoted) naming.
// Kept apart from Kappaline's tables; only the adapter and the auth service touch them.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('User')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('name', 'text')
		.addColumn('email', 'text', (c) => c.unique().notNull())
		.addColumn('emailVerified', 'timestamptz')
		.addColumn('image', 'text')
		.execute();
	await db.schema
		.createTable('Account')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('userId', 'uuid', (c) => c.references('User.id').onDelete('cascade').notNull())
		.addColumn('type', 'text', (c) => c.notNull())
		.addColumn('provider', 'text', (c) => c.notNull())
		.addColumn('providerAccountId', 'text', (c) => c.notNull())
		.addColumn('refresh_token', 'text')
		.addColumn('access_token', 'text')
		.addColumn('expires_at', 'bigint')
		.addColumn('token_type', 'text')
		.addColumn('scope', 'text')
		.addColumn('id_token', 'text')
		.addColumn('session_state', 'text')
		.execute();
	await db.schema
		.createTable('Session')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('userId', 'uuid', (c) => c.references('User.id').onDelete('cascade').notNull())
		.addColumn('sessionToken', 'text', (c) => c.notNull().unique())
		.addColumn('expires', 'timestamptz', (c) => c.notNull())
		.execute();
	await db.schema
		.createTable('VerificationToken')
		.addColumn('identifier', 'text', (c) => c.notNull())
		.addColumn('token', 'text', (c) => c.notNull().unique())
		.addColumn('expires', 'timestamptz', (c) => c.notNull())
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	for (const t of ['VerificationToken', 'Session', 'Account', 'User']) await db.schema.dropTable(t).execute();
}
