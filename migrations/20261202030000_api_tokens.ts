import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('api_token')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('user_id', 'uuid', (c) => c.references('User.id').onDelete('cascade').notNull())
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('token_hash', 'text', (c) => c.notNull().unique())
		.addColumn('prefix', 'text', (c) => c.notNull())
		.addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('owner', 'editor', 'viewer')`))
		.addColumn('expires_at', 'timestamptz')
		.addColumn('last_used_at', 'timestamptz')
		.addColumn('revoked_at', 'timestamptz')
		.addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.execute();
	await db.schema.createIndex('api_token_user_idx').on('api_token').column('user_id').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('api_token').execute();
}
