import { sql, type Kysely } from 'kysely';

// Results of screened reruns (the neutral recomputed with beta = 1/epsilon - alpha): typed by hand or
// read from uploaded engine outputs. IP_s ~ -eps_HOMO and EA_s ~ -eps_LUMO of that run.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('rerun_result')
		.addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('polymorph_id', 'uuid', (c) => c.references('polymorph.id').onDelete('cascade').notNull())
		.addColumn('epsilon', 'double precision', (c) => c.notNull().check(sql`epsilon >= 1`))
		.addColumn('alpha', 'double precision', (c) => c.notNull())
		.addColumn('gamma_bohr_inv', 'double precision', (c) => c.notNull())
		.addColumn('homo_hartree', 'double precision', (c) => c.notNull())
		.addColumn('lumo_hartree', 'double precision')
		.addColumn('source', 'text', (c) => c.notNull().check(sql`source in ('typed', 'engine-output')`))
		.addColumn('file_name', 'text')
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
		.execute();
	await db.schema.createIndex('rerun_result_polymorph_idx').on('rerun_result').columns(['workspace_id', 'polymorph_id']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('rerun_result').execute();
}
