import { sql, type Kysely } from 'kysely';

// CIF files stored with their polymorph, dielectric entries per polymorph, and the polymorph's
// epsilon in use (one chosen entry with a reason).
export async function up(db: Kysely<any>): Promise<void> {
	const now = (c: any) => c.notNull().defaultTo(sql`now()`);

	await db.schema
		.createTable('polymorph_cif')
		.addColumn('polymorph_id', 'uuid', (c) => c.primaryKey().references('polymorph.id').onDelete('cascade'))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('file_name', 'text', (c) => c.notNull())
		.addColumn('cif_text', 'text', (c) => c.notNull())
		.addColumn('block_name', 'text', (c) => c.notNull())
		.addColumn('atom_site_count', 'integer', (c) => c.notNull().check(sql`atom_site_count >= 0`))
		.addColumn('uploaded_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('uploaded_at', 'timestamptz', now)
		.execute();

	await db.schema
		.createTable('dielectric_entry')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('polymorph_id', 'uuid', (c) => c.references('polymorph.id').onDelete('cascade').notNull())
		.addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('scalar', 'tensor', 'refractive_index', 'clausius_mossotti')`))
		.addColumn('frequency', 'text', (c) => c.notNull().check(sql`frequency in ('electronic', 'static')`))
		.addColumn('input', 'jsonb', (c) => c.notNull())
		.addColumn('epsilon', 'double precision', (c) => c.notNull().check(sql`epsilon > 0`))
		.addColumn('epsilon_uncertainty', 'double precision', (c) => c.check(sql`epsilon_uncertainty >= 0`))
		.addColumn('method', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('engine', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('reference', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('note', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('created_at', 'timestamptz', now)
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addUniqueConstraint('dielectric_entry_polymorph_id_uq', ['polymorph_id', 'id'])
		.execute();
	await db.schema.createIndex('dielectric_entry_polymorph_idx').on('dielectric_entry').columns(['workspace_id', 'polymorph_id', 'created_at']).execute();

	// The entry must belong to the same polymorph (composite key). NO ACTION (checked at the end of the
	// statement) lets a polymorph's deletion cascade to both tables.
	await db.schema
		.createTable('polymorph_epsilon')
		.addColumn('polymorph_id', 'uuid', (c) => c.primaryKey().references('polymorph.id').onDelete('cascade'))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('entry_id', 'uuid', (c) => c.notNull())
		.addColumn('reason', 'text', (c) => c.notNull())
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('chosen_at', 'timestamptz', now)
		.addColumn('chosen_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addForeignKeyConstraint('polymorph_epsilon_entry_fk', ['polymorph_id', 'entry_id'], 'dielectric_entry', ['polymorph_id', 'id'])
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	for (const t of ['polymorph_epsilon', 'dielectric_entry', 'polymorph_cif']) await db.schema.dropTable(t).execute();
}
