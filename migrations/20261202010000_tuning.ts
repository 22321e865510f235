import { sql, type Kysely } from 'kysely';

// Gas-phase tuning studies (one molecule, one alpha and basis), their scan points, and the
// Idempotency-Key record of bulk point imports through the API.
export async function up(db: Kysely<any>): Promise<void> {
	const id = (c: any) => c.primaryKey().defaultTo(sql`gen_random_uuid()`);
	const now = (c: any) => c.notNull().defaultTo(sql`now()`);

	await db.schema
		.createTable('tuning_study')
		.addColumn('id', 'uuid', id)
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('molecule_id', 'uuid', (c) => c.references('molecule.id').onDelete('restrict').notNull())
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('engine', 'text', (c) => c.notNull())
		.addColumn('engine_version', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('semilocal_base', 'text', (c) => c.notNull().defaultTo('PBE'))
		.addColumn('basis_set', 'text', (c) => c.notNull())
		.addColumn('alpha', 'double precision', (c) => c.notNull().check(sql`alpha >= 0 and alpha <= 1`))
		.addColumn('geometry_xyz', 'text', (c) => c.notNull())
		.addColumn('objective', 'text', (c) => c.notNull().defaultTo('abs-sum').check(sql`objective in ('abs-sum', 'square-sum', 'ip-only', 'lumo-variant')`))
		.addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('is_current', 'boolean', (c) => c.notNull().defaultTo(false))
		.addColumn('result', 'jsonb')
		.addColumn('result_analysis_version', 'text')
		.addColumn('result_input_hash', 'text')
		.addColumn('result_saved_at', 'timestamptz')
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('created_at', 'timestamptz', now)
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('updated_at', 'timestamptz', now)
		.addColumn('updated_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.execute();
	await db.schema.createIndex('tuning_study_molecule_idx').on('tuning_study').columns(['workspace_id', 'molecule_id']).execute();
	// At most one current study per molecule.
	await db.schema.createIndex('tuning_study_one_current').on('tuning_study').column('molecule_id').unique().where(sql.ref('is_current'), '=', true).execute();

	await db.schema
		.createTable('scan_point')
		.addColumn('id', 'uuid', id)
		.addColumn('study_id', 'uuid', (c) => c.references('tuning_study.id').onDelete('cascade').notNull())
		.addColumn('gamma_bohr_inv', 'double precision', (c) => c.notNull().check(sql`gamma_bohr_inv >= 0`))
		.addColumn('e_neutral_ha', 'double precision')
		.addColumn('e_cation_ha', 'double precision')
		.addColumn('e_anion_ha', 'double precision')
		.addColumn('homo_neutral_ha', 'double precision')
		.addColumn('lumo_neutral_ha', 'double precision')
		.addColumn('homo_anion_ha', 'double precision')
		.addColumn('excluded', 'boolean', (c) => c.notNull().defaultTo(false))
		.addColumn('excluded_reason', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('created_at', 'timestamptz', now)
		.addColumn('updated_at', 'timestamptz', now)
		.execute();
	await db.schema.createIndex('scan_point_study_idx').on('scan_point').columns(['study_id', 'gamma_bohr_inv']).execute();

	await db.schema
		.createTable('tuning_idempotency_key')
		.addColumn('study_id', 'uuid', (c) => c.references('tuning_study.id').onDelete('cascade').notNull())
		.addColumn('key', 'text', (c) => c.notNull())
		.addColumn('request_hash', 'text', (c) => c.notNull())
		.addColumn('response', 'jsonb', (c) => c.notNull())
		.addColumn('created_at', 'timestamptz', now)
		.addPrimaryKeyConstraint('tuning_idempotency_key_pk', ['study_id', 'key'])
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	for (const t of ['tuning_idempotency_key', 'scan_point', 'tuning_study']) await db.schema.dropTable(t).execute();
}
