/**
 * Inverse Clausius–Mossotti: the polarizability volume (Å^3) that gives a dielectric constant eps at a
 * volume per molecule V_m: alpha' = (3 V_m / (4 pi)) (eps - 1)/(eps + 2) (Jackson, sec. 4.5).
 * Useful to compare a measured eps with a computed molecular polarizability.
 */
import { DielectricError } from './dielectric-error';

export interface ClausiusMossottiPolarizabilityInput {
	epsilon: number;
	volumePerMoleculeA3: number;
}

/** Polarizability volume in Å^3 reproducing eps at V_m. */
export function clausiusMossottiPolarizabilityA3(input: ClausiusMossottiPolarizabilityInput): number {
	const { epsilon, volumePerMoleculeA3: v } = input;
	if (typeof epsilon !== 'number' || !Number.isFinite(epsilon) || epsilon < 1) {
		throw new DielectricError('epsilon', `epsilon must be a finite number >= 1, got ${String(epsilon)}`);
	}
	if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
		throw new DielectricError('volumePerMoleculeA3', `volume per molecule must be a finite number > 0 Å^3, got ${String(v)}`);
	}
	return ((3 * v) / (4 * Math.PI)) * ((epsilon - 1) / (epsilon + 2));
}
