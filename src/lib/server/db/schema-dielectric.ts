// Tables for CIF files and dielectric entries. Joined into `Database` in schema.ts.
import type { ColumnType, Generated, Selectable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json = ColumnType<unknown, string, string>;

export type DielectricKind = 'scalar' | 'tensor' | 'refractive_index' | 'clausius_mossotti';
export type DielectricFrequency = 'electronic' | 'static';

/** The CIF file a polymorph was imported from (or whose cell replaced the polymorph's). */
export interface PolymorphCifTable {
	polymorph_id: string;
	workspace_id: string;
	file_name: string;
	cif_text: string;
	block_name: string;
	atom_site_count: number;
	uploaded_by: string | null;
	uploaded_at: Timestamp;
}

/** One way of getting the polymorph's dielectric constant, with the scalar it gives. */
export interface DielectricEntryTable {
	id: Generated<string>;
	workspace_id: string;
	polymorph_id: string;
	kind: DielectricKind;
	frequency: DielectricFrequency;
	/** What the user gave and what was derived from it (tensor 3x3, n + wavelength, polarizability + unit + V/Z). */
	input: Json;
	epsilon: number;
	epsilon_uncertainty: number | null;
	method: string;
	engine: string;
	reference: string;
	note: string;
	version: Generated<number>;
	created_at: Timestamp;
	created_by: string | null;
}

/** The entry chosen as the polymorph's epsilon in use. */
export interface PolymorphEpsilonTable {
	polymorph_id: string;
	workspace_id: string;
	entry_id: string;
	reason: string;
	version: Generated<number>;
	chosen_at: Timestamp;
	chosen_by: string | null;
}

export interface DielectricTables {
	polymorph_cif: PolymorphCifTable;
	dielectric_entry: DielectricEntryTable;
	polymorph_epsilon: PolymorphEpsilonTable;
}

export type DielectricEntryRow = Selectable<DielectricEntryTable>;
export type PolymorphCifRow = Selectable<PolymorphCifTable>;
