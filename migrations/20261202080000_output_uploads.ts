import { sql, type Kysely } from 'kysely';

// Uploaded engine outputs waiting for confirmation: what was read (the planned scan points or rerun
// results and the problems) is kept here, nothing is stored in the study or polymorph until the user
// confirms. A pending upload expires after about an hour and can be confirmed once; a discarded one
// keeps only its row (plan cleared) until the clean-up removes it.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('output_upload')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('target_kind', 'text', (c) => c.notNull().check(sql`target_kind in ('study', 'polymorph')`))
		.addColumn('target_id', 'uuid', (c) => c.notNull())
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('files', 'jsonb', (c) => c.notNull())
		.addColumn('size_bytes', 'bigint', (c) => c.notNull())
		.addColumn('sha256', 'text', (c) => c.notNull())
		.addColumn('plan', 'jsonb', (c) => c.notNull())
		.addColumn('confirmed_at', 'timestamptz')
		.addColumn('discarded_at', 'timestamptz')
		.addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.addColumn('expires_at', 'timestamptz', (c) => c.notNull())
		.execute();
	await db.schema.createIndex('output_upload_target_idx').on('output_upload').columns(['workspace_id', 'target_kind', 'target_id']).execute();
	await db.schema.createIndex('output_upload_expires_idx').on('output_upload').column('expires_at').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('output_upload').execute();
}
