import { sql, type Kysely } from 'kysely';

export async function up(db: Kysely<any>): Promise<void> {
	const id = (c: any) => c.primaryKey().defaultTo(sql`gen_random_uuid()`);
	const now = (c: any) => c.notNull().defaultTo(sql`now()`);

	await db.schema
		.createTable('password_credential')
		.addColumn('user_id', 'uuid', (c) => c.primaryKey().references('User.id').onDelete('cascade'))
		.addColumn('hash', 'text', (c) => c.notNull())
		.addColumn('updated_at', 'timestamptz', now)
		.execute();

	await db.schema
		.createTable('password_reset')
		.addColumn('token_hash', 'text', (c) => c.primaryKey())
		.addColumn('user_id', 'uuid', (c) => c.references('User.id').onDelete('cascade').notNull())
		.addColumn('expires_at', 'timestamptz', (c) => c.notNull())
		.addColumn('used_at', 'timestamptz')
		.addColumn('created_at', 'timestamptz', now)
		.execute();

	await db.schema
		.createTable('workspace')
		.addColumn('id', 'uuid', id)
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('is_demo', 'boolean', (c) => c.notNull().defaultTo(false))
		.addColumn('created_at', 'timestamptz', now)
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.execute();

	await db.schema
		.createTable('membership')
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('user_id', 'uuid', (c) => c.references('User.id').onDelete('cascade').notNull())
		.addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('owner', 'editor', 'viewer')`))
		.addColumn('created_at', 'timestamptz', now)
		.addPrimaryKeyConstraint('membership_pk', ['workspace_id', 'user_id'])
		.execute();
	await db.schema.createIndex('membership_user_idx').on('membership').column('user_id').execute();

	await db.schema
		.createTable('invitation')
		.addColumn('id', 'uuid', id)
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('email', 'text', (c) => c.notNull())
		.addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('owner', 'editor', 'viewer')`))
		.addColumn('token_hash', 'text', (c) => c.notNull().unique())
		.addColumn('expires_at', 'timestamptz', (c) => c.notNull())
		.addColumn('accepted_at', 'timestamptz')
		.addColumn('accepted_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('revoked_at', 'timestamptz')
		.addColumn('sent_at', 'timestamptz')
		.addColumn('invited_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('created_at', 'timestamptz', now)
		.execute();

	await db.schema
		.createTable('rate_limit')
		.addColumn('key', 'text', (c) => c.primaryKey())
		.addColumn('window_start', 'timestamptz', (c) => c.notNull())
		.addColumn('count', 'integer', (c) => c.notNull())
		.execute();

	await db.schema
		.createTable('molecule')
		.addColumn('id', 'uuid', id)
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('formula', 'text', (c) => c.notNull())
		.addColumn('net_charge', 'integer', (c) => c.notNull().defaultTo(0))
		.addColumn('multiplicity', 'integer', (c) => c.notNull().defaultTo(1).check(sql`multiplicity >= 1`))
		.addColumn('geometry_xyz', 'text', (c) => c.notNull())
		.addColumn('atom_count', 'integer', (c) => c.notNull())
		.addColumn('smiles', 'text')
		.addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('created_at', 'timestamptz', now)
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('updated_at', 'timestamptz', now)
		.addColumn('updated_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.execute();
	await db.schema.createIndex('molecule_workspace_idx').on('molecule').columns(['workspace_id', 'name']).execute();

	await db.schema
		.createTable('polymorph')
		.addColumn('id', 'uuid', id)
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('molecule_id', 'uuid', (c) => c.references('molecule.id').onDelete('restrict').notNull())
		.addColumn('label', 'text', (c) => c.notNull())
		.addColumn('space_group', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('a_a', 'double precision', (c) => c.notNull())
		.addColumn('b_a', 'double precision', (c) => c.notNull())
		.addColumn('c_a', 'double precision', (c) => c.notNull())
		.addColumn('alpha_deg', 'double precision', (c) => c.notNull())
		.addColumn('beta_deg', 'double precision', (c) => c.notNull())
		.addColumn('gamma_deg', 'double precision', (c) => c.notNull())
		.addColumn('z', 'integer', (c) => c.notNull().check(sql`z >= 1`))
		.addColumn('temperature_k', 'double precision')
		.addColumn('structure_source', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
		.addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
		.addColumn('created_at', 'timestamptz', now)
		.addColumn('created_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('updated_at', 'timestamptz', now)
		.addColumn('updated_by', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.execute();
	await db.schema.createIndex('polymorph_molecule_idx').on('polymorph').columns(['workspace_id', 'molecule_id']).execute();

	await db.schema
		.createTable('activity')
		.addColumn('id', 'bigserial', (c) => c.primaryKey())
		.addColumn('workspace_id', 'uuid', (c) => c.references('workspace.id').onDelete('cascade').notNull())
		.addColumn('actor_id', 'uuid', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('entity_type', 'text', (c) => c.notNull())
		.addColumn('entity_id', 'uuid', (c) => c.notNull())
		.addColumn('action', 'text', (c) => c.notNull())
		.addColumn('summary', 'text', (c) => c.notNull())
		.addColumn('before', 'jsonb')
		.addColumn('after', 'jsonb')
		.addColumn('created_at', 'timestamptz', now)
		.execute();
	await db.schema.createIndex('activity_entity_idx').on('activity').columns(['workspace_id', 'entity_id']).execute();
	await db.schema.createIndex('activity_ws_time_idx').on('activity').columns(['workspace_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	for (const t of ['activity', 'polymorph', 'molecule', 'rate_limit', 'invitation', 'membership', 'workspace', 'password_reset', 'password_credential'])
		await db.schema.dropTable(t).execute();
}
