/**
 * Born polarization energy of a unit charge at the centre of a spherical cavity of radius a in a
 * continuum of dielectric constant epsilon (Born 1920; science notes, section 5):
 *   P = e^2/(4 pi eps0) / (2a) x (1 - 1/epsilon),
 * with e^2/(4 pi eps0) = 14.399645478 eV·Å. The same value is used for holes (P+) and electrons (P-).
 */
import { COULOMB_EV_A } from '../units';
import { epsilonValue, inputObject, positiveNumber } from './validate';

export interface BornPolarizationInput {
	/** Cavity radius in Å (see bornRadiusA for the default from the volume per molecule). */
	radiusA: number;
	epsilon: number;
}

/** Born polarization energy in eV (>= 0; 0 at epsilon = 1). */
export function bornPolarizationEv(input: BornPolarizationInput): number {
	inputObject(input, 'bornPolarizationEv');
	const a = positiveNumber(input.radiusA, 'radiusA');
	const epsilon = epsilonValue(input.epsilon, 'epsilon');
	return (COULOMB_EV_A / (2 * a)) * (1 - 1 / epsilon);
}
