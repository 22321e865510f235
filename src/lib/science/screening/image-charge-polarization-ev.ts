/**
 * Image-charge polarization energy of a unit charge in vacuum at distance z from the planar surface of a
 * substrate of dielectric constant eps_s (classical electrostatics, e.g. Jackson sec. 4.4; science notes,
 * section 5):
 *   P = e^2/(4 pi eps0) / (4z) x (eps_s - 1)/(eps_s + 1);  a metal is eps_s -> infinity (factor 1).
 * z is measured from the image plane, which for a metal lies somewhat outside the atomic surface.
 */
import { COULOMB_EV_A } from '../units';
import { ScreeningError } from './screening-error';
import { epsilonValue, inputObject, positiveNumber } from './validate';

export interface ImageChargePolarizationInput {
	/** Distance of the charge from the image plane in Å. */
	distanceA: number;
	/** Dielectric constant of the substrate (>= 1), or 'metal'. */
	substrateEpsilon: number | 'metal';
}

/** Image-charge polarization energy in eV (>= 0). */
export function imageChargePolarizationEv(input: ImageChargePolarizationInput): number {
	inputObject(input, 'imageChargePolarizationEv');
	const z = positiveNumber(input.distanceA, 'distanceA');
	const s = input.substrateEpsilon;
	let factor: number;
	if (s === 'metal') {
		factor = 1;
	} else if (typeof s === 'number') {
		const eps = epsilonValue(s, 'substrateEpsilon');
		factor = (eps - 1) / (eps + 1);
	} else {
		throw new ScreeningError('substrateEpsilon', `substrateEpsilon must be a number >= 1 or 'metal', got ${String(s)}`);
	}
	return (COULOMB_EV_A / (4 * z)) * factor;
}
