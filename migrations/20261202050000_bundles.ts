import { sql, type Kysely } from 'kysely';

// Rerun bundles handed out: who made them, when, from what. The request is stored and the zip is
// rebuilt from it on a later download (the build is deterministic; the stored SHA-256 checks that).
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('bundle')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('molecule_id', 'uuid', (c) => c.references('molecule.id').onDelete('cascade').notNull())
		.addColumn('polymorph_id', 'uuid', (c) => c.references('polymorph.id').onDelete('set null'))
		.addColumn('study_id', 'uuid')
		.addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('tuning', 'screened', 'tuning+screened')`))
		.addColumn('request', 'jsonb', (c) => c.notNull())
		.addColumn('file_name', 'text', (c) => c.notNull())
		.addColumn('sha256', 'text', (c) => c.notNull())
		.addColumn('size_bytes', 'integer', (c) => c.notNull())
		.addColumn('file_count', 'integer', (c) => c.notNull())
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.execute();
	await db.schema.createIndex('bundle_molecule_idx').on('bundle').columns(['workspace_id', 'molecule_id']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('bundle').execute();
}
