// Tables for tuning studies and scan points. Joined into `Database` in schema.ts.
import type { ColumnType, Generated, Selectable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json = ColumnType<unknown, string | null, string | null>;

export interface TuningStudyTable {
	id: Generated<string>;
	workspace_id: string;
	molecule_id: string;
	name: string;
	engine: string;
	engine_version: string;
	semilocal_base: string;
	basis_set: string;
	alpha: number;
	/** The molecule's geometry frozen at study creation (XYZ text). */
	geometry_xyz: string;
	objective: string;
	notes: string;
	is_current: Generated<boolean>;
	/** Stored analysis (see services/tuning.ts StoredTuningResult). */
	result: Json | null;
	result_analysis_version: string | null;
	result_input_hash: string | null;
	result_saved_at: Timestamp | null;
	version: Generated<number>;
	created_at: Timestamp;
	created_by: string | null;
	updated_at: Timestamp;
	updated_by: string | null;
}

export interface ScanPointTable {
	id: Generated<string>;
	study_id: string;
	gamma_bohr_inv: number;
	e_neutral_ha: number | null;
	e_cation_ha: number | null;
	e_anion_ha: number | null;
	homo_neutral_ha: number | null;
	lumo_neutral_ha: number | null;
	homo_anion_ha: number | null;
	excluded: Generated<boolean>;
	excluded_reason: Generated<string>;
	version: Generated<number>;
	created_at: Timestamp;
	updated_at: Timestamp;
}

export interface TuningIdempotencyKeyTable {
	study_id: string;
	key: string;
	request_hash: string;
	response: Json;
	created_at: Timestamp;
}

export interface TuningTables {
	tuning_study: TuningStudyTable;
	scan_point: ScanPointTable;
	tuning_idempotency_key: TuningIdempotencyKeyTable;
}

export type TuningStudyRow = Selectable<TuningStudyTable>;
export type ScanPointRow = Selectable<ScanPointTable>;
