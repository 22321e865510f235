/**
 * Dielectric constant from the molecular polarizability and the volume per molecule, by the
 * Clausius–Mossotti (Lorentz–Lorenz) relation (science notes, section 4; Jackson, Classical
 * Electrodynamics, sec. 4.5):
 *   (eps - 1)/(eps + 2) = 4 pi alpha' / (3 V_m) =: x,   eps = (1 + 2x)/(1 - x),
 * with alpha' the polarizability volume (Å^3) and V_m = V_cell / Z (Å^3). x >= 1 has no solution.
 * The relation assumes a cubic-like local field; for anisotropic molecular crystals it is an estimate.
 */
import { DielectricError, PolarizationCatastropheError } from './dielectric-error';
import { type PolarizabilityInput, polarizabilityToA3Factor, polarizabilityVolumeA3 } from './polarizability-volume-a3';

export interface ClausiusMossottiInput extends PolarizabilityInput {
	volumePerMoleculeA3: number;
	/** Standard uncertainty of the (mean) polarizability, in the same unit. */
	polarizabilityUncertainty?: number | null;
	/** Standard uncertainty of the volume per molecule in Å^3. */
	volumePerMoleculeUncertaintyA3?: number | null;
}

export interface ClausiusMossottiOptions {
	/** x above which a sensitivity warning is given. Default 0.75 (eps = 10); a display choice. */
	sensitivityWarnX?: number;
}

export interface ClausiusMossottiResult {
	epsilon: number;
	/** x = 4 pi alpha' / (3 V_m) = (eps - 1)/(eps + 2). */
	x: number;
	polarizabilityVolumeA3: number;
	volumePerMoleculeA3: number;
	/** First-order standard uncertainty of eps (null without input uncertainties). */
	epsilonUncertainty: number | null;
	warnings: string[];
}

function optionalUncertainty(value: number | null | undefined, field: string): number | null {
	if (value === undefined || value === null) return null;
	if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
		throw new DielectricError(field, `${field} must be a finite number >= 0, got ${String(value)}`);
	}
	return value;
}

/** eps from Clausius–Mossotti; throws PolarizationCatastropheError when x >= 1. */
export function clausiusMossottiEpsilon(
	input: ClausiusMossottiInput,
	options: ClausiusMossottiOptions = {}
): ClausiusMossottiResult {
	const alphaA3 = polarizabilityVolumeA3(input);
	const v = input.volumePerMoleculeA3;
	if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
		throw new DielectricError('volumePerMoleculeA3', `volume per molecule must be a finite number > 0 Å^3, got ${String(v)}`);
	}
	const dAlpha = optionalUncertainty(input.polarizabilityUncertainty, 'polarizabilityUncertainty');
	const dV = optionalUncertainty(input.volumePerMoleculeUncertaintyA3, 'volumePerMoleculeUncertaintyA3');
	const warnX = options.sensitivityWarnX ?? 0.75;
	if (typeof warnX !== 'number' || !Number.isFinite(warnX) || warnX <= 0 || warnX >= 1) {
		throw new RangeError(`sensitivityWarnX must be between 0 and 1, got ${String(warnX)}`);
	}

	const x = (4 * Math.PI * alphaA3) / (3 * v);
	if (x >= 1) throw new PolarizationCatastropheError(x, alphaA3, v);
	const epsilon = (1 + 2 * x) / (1 - x);

	let epsilonUncertainty: number | null = null;
	if (dAlpha !== null || dV !== null) {
		// d eps / d x = 3 / (1 - x)^2; u(x)/x = sqrt((u(alpha)/alpha)^2 + (u(V)/V)^2) (linear propagation, GUM).
		const relAlpha = dAlpha === null ? 0 : (dAlpha * polarizabilityToA3Factor(input.unit)) / alphaA3;
		const relV = dV === null ? 0 : dV / v;
		const dx = x * Math.hypot(relAlpha, relV);
		epsilonUncertainty = (3 / (1 - x) ** 2) * dx;
	}

	const warnings: string[] = [];
	if (x > warnX) {
		warnings.push(
			`x = ${Number(x.toPrecision(3))} is close to 1 (eps = ${Number(epsilon.toPrecision(3))}): the result is very ` +
				'sensitive to the polarizability and volume; small input errors change eps a lot'
		);
	}
	return { epsilon, x, polarizabilityVolumeA3: alphaA3, volumePerMoleculeA3: v, epsilonUncertainty, warnings };
}
