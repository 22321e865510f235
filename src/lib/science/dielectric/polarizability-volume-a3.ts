/**
 * Polarizability volume alpha' in Å^3 from a polarizability given in one of the usual units.
 * - 'A3': already a volume in Å^3.
 * - 'bohr3': atomic units (a0^3); 1 bohr^3 = 0.148184711 Å^3 (CODATA 2018).
 * - 'cm3': a volume in cm^3 (the CGS habit, e.g. 10.4e-24 cm^3); 1 cm^3 = 1e24 Å^3.
 * - 'SI': C·m^2/V (= C^2·m^2/J); alpha' = alpha / (4 pi eps0) in m^3, times 1e30 for Å^3.
 * A 3x3 polarizability tensor is averaged as trace/3 (the isotropic mean).
 */
import { BOHR3_A3, EPSILON0_F_PER_M } from '../units';
import { DielectricError } from './dielectric-error';
import { type Matrix3Input, checkedMatrix3 } from './matrix3';

export type PolarizabilityUnit = 'A3' | 'bohr3' | 'cm3' | 'SI';

export interface PolarizabilityInput {
	/** A scalar (isotropic or mean) polarizability, or a 3x3 tensor (trace/3 is used). */
	polarizability: number | Matrix3Input;
	unit: PolarizabilityUnit;
}

/** Factor converting one unit of polarizability to Å^3 of polarizability volume. */
export function polarizabilityToA3Factor(unit: PolarizabilityUnit): number {
	switch (unit) {
		case 'A3':
			return 1;
		case 'bohr3':
			return BOHR3_A3;
		case 'cm3':
			return 1e24;
		case 'SI':
			return 1e30 / (4 * Math.PI * EPSILON0_F_PER_M);
		default:
			throw new DielectricError('unit', `unknown polarizability unit '${String(unit)}' (use A3, bohr3, cm3 or SI)`);
	}
}

/** Isotropic polarizability volume in Å^3 (> 0). */
export function polarizabilityVolumeA3(input: PolarizabilityInput): number {
	if (input === null || typeof input !== 'object') {
		throw new DielectricError('polarizability', 'give { polarizability, unit }');
	}
	const factor = polarizabilityToA3Factor(input.unit);
	const p = input.polarizability;
	let mean: number;
	if (typeof p === 'number') {
		if (!Number.isFinite(p)) throw new DielectricError('polarizability', `polarizability must be a finite number, got ${p}`);
		mean = p;
	} else {
		const t = checkedMatrix3(p, 'polarizability');
		mean = (t[0][0] + t[1][1] + t[2][2]) / 3;
	}
	if (!(mean > 0)) {
		throw new DielectricError('polarizability', `polarizability must be > 0, got ${mean} ${input.unit}`);
	}
	return mean * factor;
}
