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

export interface LevelsTables {
	measurement: MeasurementTable;
}
