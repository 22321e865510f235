/**
 * First-order uncertainty of eps = n^2 from the standard uncertainty of n: d eps = 2 n dn
 * (linear error propagation, GUM).
 */
import { DielectricError } from './dielectric-error';

export interface RefractiveIndexUncertaintyInput {
	refractiveIndex: number;
	refractiveIndexUncertainty: number;
}

/** Standard uncertainty of eps = n^2, i.e. 2 n u(n). */
export function epsilonUncertaintyFromRefractiveIndex(input: RefractiveIndexUncertaintyInput): number {
	const { refractiveIndex: n, refractiveIndexUncertainty: dn } = input;
	if (typeof n !== 'number' || !Number.isFinite(n) || n < 1) {
		throw new DielectricError('refractiveIndex', `refractive index must be a finite number >= 1, got ${String(n)}`);
	}
	if (typeof dn !== 'number' || !Number.isFinite(dn) || dn < 0) {
		throw new DielectricError(
			'refractiveIndexUncertainty',
			`refractive index uncertainty must be a finite number >= 0, got ${String(dn)}`
		);
	}
	return 2 * n * dn;
}
