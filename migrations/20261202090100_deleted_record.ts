import { sql, type Kysely } from 'kysely';

// The trash: a deleted record with every row that went with it (its cascade), kept as JSON so an
// owner can restore it exactly, and the links that were cleared (ON DELETE SET NULL) to put back.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('deleted_record')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('entity_type', 'text', (c) => c.notNull())
		.addColumn('entity_id', 'uuid', (c) => c.notNull())
		.addColumn('root_table', 'text', (c) => c.notNull())
		.addColumn('label', 'text', (c) => c.notNull())
		.addColumn('contents', 'text', (c) => c.notNull())
		.addColumn('parent_href', 'text')
		.addColumn('rows', 'jsonb', (c) => c.notNull())
		.addColumn('relinks', 'jsonb', (c) => c.notNull())
		.addColumn('deleted_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('deleted_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.addColumn('restored_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('restored_at', 'timestamptz')
		.execute();
	await db.schema.createIndex('deleted_record_ws_idx').on('deleted_record').columns(['workspace_id', 'deleted_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('deleted_record').execute();
}
