/**
 * Shared types of the gamma-tuning module (science notes, section 3).
 *
 * Engine quantities are stored in their native units: energies in hartree, gamma in bohr^-1.
 */

/**
 * One point of a gamma scan: the neutral (N electrons), cation (N-1) and anion (N+1) computed at the
 * same neutral geometry with the range-separation parameter `gammaBohrInv`.
 * Any energy may be null or missing (for example when the anion run was not done or failed).
 */
export interface ScanPoint {
	/** Range-separation parameter gamma (also called omega or mu), bohr^-1. */
	gammaBohrInv: number;
	/** Total energy of the neutral, E(N), hartree. */
	eNeutralHartree?: number | null;
	/** Total energy of the cation, E(N-1), hartree. */
	eCationHartree?: number | null;
	/** Total energy of the anion, E(N+1), hartree. */
	eAnionHartree?: number | null;
	/** Highest occupied orbital energy of the neutral, eps_HOMO(N), hartree. */
	homoNeutralHartree?: number | null;
	/** Lowest unoccupied orbital energy of the neutral, eps_LUMO(N), hartree. */
	lumoNeutralHartree?: number | null;
	/** Highest occupied orbital energy of the anion, eps_HOMO(N+1), hartree. */
	homoAnionHartree?: number | null;
	/** True when the user left this point out of the analysis (for example a failed SCF). */
	excluded?: boolean;
}

/** The energy fields of a ScanPoint, in a fixed order (used by validation, parsers and writers). */
export const SCAN_ENERGY_FIELDS = [
	'eNeutralHartree',
	'eCationHartree',
	'eAnionHartree',
	'homoNeutralHartree',
	'lumoNeutralHartree',
	'homoAnionHartree'
] as const;

export type ScanEnergyField = (typeof SCAN_ENERGY_FIELDS)[number];

/** Plain-word names of the energy fields, for messages. */
export const SCAN_ENERGY_LABELS: Record<ScanEnergyField, string> = {
	eNeutralHartree: 'neutral total energy E(N)',
	eCationHartree: 'cation total energy E(N-1)',
	eAnionHartree: 'anion total energy E(N+1)',
	homoNeutralHartree: 'neutral HOMO energy eps_HOMO(N)',
	lumoNeutralHartree: 'neutral LUMO energy eps_LUMO(N)',
	homoAnionHartree: 'anion HOMO energy eps_HOMO(N+1)'
};

/**
 * What gamma* minimises (science notes, section 3):
 * - 'abs-sum' (default): |J_IP| + |J_EA|;
 * - 'square-sum': J_IP^2 + J_EA^2;
 * - 'ip-only': |J_IP| (when the anion is unbound);
 * - 'lumo-variant': |J_IP| + |eps_LUMO(N) + EA|.
 */
export const TUNING_OBJECTIVES = ['abs-sum', 'square-sum', 'ip-only', 'lumo-variant'] as const;
export type TuningObjective = (typeof TUNING_OBJECTIVES)[number];

export type DiagnosticSeverity = 'info' | 'warning' | 'error';

export type TuningDiagnosticCode =
	| 'too-few-points'
	| 'duplicate-gamma'
	| 'incomplete-points'
	| 'energy-independent-of-gamma'
	| 'optimum-at-edge'
	| 'optimum-away-from-best-grid-point'
	| 'few-points-near-optimum'
	| 'no-zero-crossing'
	| 'multiple-zero-crossings'
	| 'crossings-far-apart'
	| 'unbound-anion'
	| 'unbound-anion-at-optimum'
	| 'non-smooth-point'
	| 'anion-term-without-diffuse-basis';

/** A finding about a scan, in plain words, with what to do about it. */
export interface TuningDiagnostic {
	code: TuningDiagnosticCode;
	severity: DiagnosticSeverity;
	/** What was found, in plain words. */
	message: string;
	/** What the user should do. */
	action: string;
	/** The gamma the finding is about, when there is one (bohr^-1). */
	gammaBohrInv?: number;
}
