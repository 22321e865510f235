import type { ColumnType, Generated } from 'kysely';
import type { Role } from './schema';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

/** Personal API tokens: only a SHA-256 hash of the secret is stored. */
export interface ApiTokenTable {
	id: Generated<string>;
	user_id: string;
	workspace_id: string;
	name: string;
	token_hash: string;
	/** The first characters of the token, shown in lists so users can tell tokens apart. */
	prefix: string;
	role: Role;
	expires_at: Timestamp | null;
	last_used_at: Timestamp | null;
	revoked_at: Timestamp | null;
	created_at: Timestamp;
}

export interface ApiTables {
	api_token: ApiTokenTable;
}
