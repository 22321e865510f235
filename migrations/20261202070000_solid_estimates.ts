import { sql, type Kysely } from 'kysely';

// Stored solid-state estimates: the result and exactly what it was computed from (study result, dielectric
// entry, cell, options, code version), so a later change of any source marks it stale.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('solid_estimate')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('polymorph_id', 'uuid', (c) => c.references('polymorph.id').onDelete('cascade').notNull())
		.addColumn('label', 'text', (c) => c.notNull())
		.addColumn('options', 'jsonb', (c) => c.notNull())
		.addColumn('sources', 'jsonb', (c) => c.notNull())
		.addColumn('result', 'jsonb', (c) => c.notNull())
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.execute();
	await db.schema.createIndex('solid_estimate_polymorph_idx').on('solid_estimate').columns(['workspace_id', 'polymorph_id']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('solid_estimate').execute();
}
