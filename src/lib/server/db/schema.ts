import type { TuningTables } from './schema-tuning';
import type { DielectricTables } from './schema-dielectric';
import type { LevelsTables } from './schema-levels';
import type { ApiTables } from './schema-api';
import type { TrashTables } from './schema-trash';
import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json = ColumnType<unknown, string | null, string | null>;

export type Role = 'owner' | 'editor' | 'viewer';

/** Auth.js adapter tables (quarantined naming). */
export interface UserTable {
	id: Generated<string>;
	name: string | null;
	email: string;
	emailVerified: Date | null;
	image: string | null;
}
export interface AccountTable {
	id: Generated<string>;
	userId: string;
	type: string;
	provider: string;
	providerAccountId: string;
	refresh_token: string | null;
	access_token: string | null;
	expires_at: number | null;
	token_type: string | null;
	scope: string | null;
	id_token: string | null;
	session_state: string | null;
}
export interface SessionTable {
	id: Generated<string>;
	userId: string;
	sessionToken: string;
	expires: Date;
}
export interface VerificationTokenTable {
	identifier: string;
	token: string;
	expires: Date;
}

export interface PasswordCredentialTable {
	user_id: string;
	hash: string;
	updated_at: Timestamp;
}
export interface PasswordResetTable {
	token_hash: string;
	user_id: string;
	expires_at: Timestamp;
	used_at: Timestamp | null;
	created_at: Timestamp;
}
export interface WorkspaceTable {
	id: Generated<string>;
	name: string;
	is_demo: Generated<boolean>;
	created_at: Timestamp;
	version: Generated<number>;
}
export interface MembershipTable {
	workspace_id: string;
	user_id: string;
	role: Role;
	created_at: Timestamp;
}
export interface InvitationTable {
	id: Generated<string>;
	workspace_id: string;
	email: string;
	role: Role;
	token_hash: string;
	expires_at: Timestamp;
	accepted_at: Timestamp | null;
	accepted_by: string | null;
	revoked_at: Timestamp | null;
	sent_at: Timestamp | null;
	invited_by: string | null;
	created_at: Timestamp;
	/** E-mail sends tried so far, the time of the last one, and its error (null after a success). */
	send_attempts: Generated<number>;
	last_attempt_at: Timestamp | null;
	last_send_error: string | null;
}
export interface RateLimitTable {
	key: string;
	window_start: Timestamp;
	count: number;
}
export interface MoleculeTable {
	id: Generated<string>;
	workspace_id: string;
	name: string;
	formula: string;
	net_charge: number;
	multiplicity: number;
	geometry_xyz: string;
	atom_count: number;
	smiles: string | null;
	notes: string;
	version: Generated<number>;
	created_at: Timestamp;
	created_by: string | null;
	updated_at: Timestamp;
	updated_by: string | null;
}
export interface PolymorphTable {
	id: Generated<string>;
	workspace_id: string;
	molecule_id: string;
	label: string;
	space_group: string;
	a_a: number;
	b_a: number;
	c_a: number;
	alpha_deg: number;
	beta_deg: number;
	gamma_deg: number;
	z: number;
	temperature_k: number | null;
	structure_source: string;
	notes: string;
	version: Generated<number>;
	created_at: Timestamp;
	created_by: string | null;
	updated_at: Timestamp;
	updated_by: string | null;
}
export interface ActivityTable {
	id: Generated<string>;
	workspace_id: string;
	actor_id: string | null;
	entity_type: string;
	entity_id: string;
	action: string;
	summary: string;
	before: Json;
	after: Json;
	created_at: Timestamp;
}

/** Foundation tables; each feature adds its own in a schema-<feature>.ts file, joined below. */
export interface CoreTables {
	User: UserTable;
	Account: AccountTable;
	Session: SessionTable;
	VerificationToken: VerificationTokenTable;
	password_credential: PasswordCredentialTable;
	password_reset: PasswordResetTable;
	workspace: WorkspaceTable;
	membership: MembershipTable;
	invitation: InvitationTable;
	rate_limit: RateLimitTable;
	molecule: MoleculeTable;
	polymorph: PolymorphTable;
	activity: ActivityTable;
}

export interface Database extends CoreTables, TuningTables, DielectricTables, LevelsTables, ApiTables, TrashTables {}

export type MoleculeRow = Selectable<MoleculeTable>;
export type NewMoleculeRow = Insertable<MoleculeTable>;
export type MoleculeUpdate = Updateable<MoleculeTable>;
export type PolymorphRow = Selectable<PolymorphTable>;
