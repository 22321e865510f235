import type { ColumnType, Generated } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

/** A measured level set for a polymorph or a film of it (energies in eV, positive IP/EA). */
export interface MeasurementTable {
	id: Generated<string>;
	workspace_id: string;
	polymorph_id: string;
	ip_ev: number | null;
	ea_ev: number | null;
	transport_gap_ev: number | null;
	optical_gap_ev: number | null;
	uncertainty_ev: number | null;
	method: string;
	sample_notes: string;
	reference: string;
	version: Generated<number>;
	created_at: Timestamp;
	created_by: string | null;
}

/** A rerun bundle handed out (the zip is rebuilt from `request` on download). */
export interface BundleTable {
	id: Generated<string>;
	workspace_id: string;
	molecule_id: string;
	polymorph_id: string | null;
	study_id: string | null;
	kind: 'tuning' | 'screened' | 'tuning+screened';
	request: ColumnType<unknown, string, string>;
	file_name: string;
	sha256: string;
	size_bytes: number;
	file_count: number;
	created_by: string | null;
	created_at: Timestamp;
}

/** A screened rerun's frontier orbitals (hartree), typed or read from an engine output. */
export interface RerunResultTable {
	id: Generated<string>;
	workspace_id: string;
	polymorph_id: string;
	epsilon: number;
	alpha: number;
	gamma_bohr_inv: number;
	homo_hartree: number;
	lumo_hartree: number | null;
	source: 'typed' | 'engine-output';
	file_name: string | null;
	created_by: string | null;
	created_at: Timestamp;
}

/** A stored solid-state estimate with the sources it was computed from. */
export interface SolidEstimateTable {
	id: Generated<string>;
	workspace_id: string;
	polymorph_id: string;
	label: string;
	options: ColumnType<unknown, string, string>;
	sources: ColumnType<unknown, string, string>;
	result: ColumnType<unknown, string, string>;
	created_by: string | null;
	created_at: Timestamp;
}

/** Engine outputs read and waiting for the user's confirmation (see services/output-uploads). */
export interface OutputUploadTable {
	id: Generated<string>;
	workspace_id: string;
	target_kind: 'study' | 'polymorph';
	target_id: string;
	created_by: string | null;
	files: ColumnType<{ name: string; sizeBytes: number; sha256: string }[], string, string>;
	size_bytes: ColumnType<string, number, number>;
	sha256: string;
	plan: ColumnType<unknown, string, string>;
	confirmed_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
	discarded_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
	created_at: Timestamp;
	expires_at: ColumnType<Date, Date | string, Date | string>;
}

export interface LevelsTables {
	solid_estimate: SolidEstimateTable;
	measurement: MeasurementTable;
	bundle: BundleTable;
	rerun_result: RerunResultTable;
	output_upload: OutputUploadTable;
}
