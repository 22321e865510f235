import { sql, type Kysely } from 'kysely';

// Measured levels per polymorph (or film of it), for comparison with the estimates.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('measurement')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('polymorph_id', 'uuid', (c) => c.references('polymorph.id').onDelete('cascade').notNull())
		.addColumn('ip_ev', 'double precision')
		.addColumn('ea_ev', 'double precision')
		.addColumn('transport_gap_ev', 'double precision')
		.addColumn('optical_gap_ev', 'double precision')
		.addColumn('uncertainty_ev', 'double precision')
		.addColumn('method', 'text', (c) => c.notNull())
		.addColumn('sample_notes', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('reference', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addCheckConstraint('measurement_has_value', sql`coalesce(ip_ev, ea_ev, transport_gap_ev, optical_gap_ev) is not null`)
		.execute();
	await db.schema.createIndex('measurement_polymorph_idx').on('measurement').columns(['workspace_id', 'polymorph_id']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('measurement').execute();
}
