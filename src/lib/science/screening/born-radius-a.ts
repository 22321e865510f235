/**
 * Default cavity radius of the Born model from the volume per molecule (science notes, section 5):
 * the radius of a sphere of that volume, a = (3 V_m / (4 pi))^(1/3).
 */
import { inputObject, positiveNumber } from './validate';

export interface BornRadiusInput {
	/** Volume per molecule V_cell / Z in Å^3. */
	volumePerMoleculeA3: number;
}

/** Radius in Å of the sphere whose volume is the volume per molecule. */
export function bornRadiusA(input: BornRadiusInput): number {
	inputObject(input, 'bornRadiusA');
	const v = positiveNumber(input.volumePerMoleculeA3, 'volumePerMoleculeA3');
	return Math.cbrt((3 * v) / (4 * Math.PI));
}
