// The trash (deleted records kept for restore). Joined into `Database` in schema.ts.
import type { ColumnType, Generated } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json<T> = ColumnType<T, string, string>;

/** One row that went with a deleted record: its table and the row as PostgreSQL's to_jsonb gave it. */
export interface TrashedRow {
	table: string;
	row: Record<string, unknown>;
}

/** Rows whose link to the deleted record was cleared (ON DELETE SET NULL), to set again on restore. */
export interface TrashRelink {
	table: string;
	column: string;
	keyColumn: string;
	keys: unknown[];
	value: unknown;
}

export interface DeletedRecordTable {
	id: Generated<string>;
	workspace_id: string;
	entity_type: string;
	entity_id: string;
	root_table: string;
	label: string;
	/** What was deleted with it, in words ("2 dielectric entries, 1 measurement"). */
	contents: string;
	/** Page of the record's parent (where it was listed), for links from the trash. */
	parent_href: string | null;
	rows: Json<TrashedRow[]>;
	relinks: Json<TrashRelink[]>;
	deleted_by: string | null;
	deleted_at: Timestamp;
	restored_by: string | null;
	restored_at: Timestamp | null;
}

export interface TrashTables {
	deleted_record: DeletedRecordTable;
}
