/**
 * Electronic dielectric constant from a measured refractive index: eps_inf = n^2 (science notes, section 4),
 * valid for a non-absorbing, non-magnetic medium. The wavelength is carried along as metadata.
 */
import { DielectricError } from './dielectric-error';
import { epsilonUncertaintyFromRefractiveIndex } from './epsilon-uncertainty-from-refractive-index';

export interface RefractiveIndexInput {
	refractiveIndex: number;
	/** Wavelength of the measurement in nm (metadata). */
	wavelengthNm?: number | null;
	/** Standard uncertainty of n; gives epsilonUncertainty = 2 n u(n). */
	refractiveIndexUncertainty?: number | null;
}

export interface EpsilonFromRefractiveIndex {
	epsilon: number;
	refractiveIndex: number;
	wavelengthNm: number | null;
	epsilonUncertainty: number | null;
	note: string;
}

export const REFRACTIVE_INDEX_NOTE =
	'eps = n^2 holds where the material does not absorb. Measured in the visible, n is usually a little above ' +
	'its long-wavelength (infrared-side) value because of dispersion, so n^2 slightly overestimates eps_inf; ' +
	'prefer n extrapolated away from absorption bands (common practice). For an anisotropic crystal, n along ' +
	'one axis gives eps along that axis only.';

/** eps = n^2 with the wavelength carried along and an optional first-order uncertainty. */
export function epsilonFromRefractiveIndex(input: number | RefractiveIndexInput): EpsilonFromRefractiveIndex {
	const data: RefractiveIndexInput = typeof input === 'number' ? { refractiveIndex: input } : input;
	if (data === null || typeof data !== 'object') {
		throw new DielectricError('refractiveIndex', 'give a refractive index or { refractiveIndex, wavelengthNm }');
	}
	const n = data.refractiveIndex;
	if (typeof n !== 'number' || !Number.isFinite(n) || n < 1) {
		throw new DielectricError('refractiveIndex', `refractive index must be a finite number >= 1, got ${String(n)}`);
	}
	const wl = data.wavelengthNm ?? null;
	if (wl !== null && (typeof wl !== 'number' || !Number.isFinite(wl) || wl <= 0)) {
		throw new DielectricError('wavelengthNm', `wavelength must be a finite number > 0 nm, got ${String(wl)}`);
	}
	const dn = data.refractiveIndexUncertainty ?? null;
	const epsilonUncertainty =
		dn === null ? null : epsilonUncertaintyFromRefractiveIndex({ refractiveIndex: n, refractiveIndexUncertainty: dn });
	return { epsilon: n * n, refractiveIndex: n, wavelengthNm: wl, epsilonUncertainty, note: REFRACTIVE_INDEX_NOTE };
}
