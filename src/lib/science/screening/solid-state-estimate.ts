/**
 * One solid-state estimate: the screened SRSH parameters for a dielectric constant, and the
 * polarization-shifted IP, EA and gap from the Born sphere (plus an optional substrate image-charge
 * term), following science notes sections 2 and 5. The same routine serves the web page, the API,
 * the stored estimates and the command line.
 */
import { bornPolarizationEv } from './born-polarization-ev';
import { bornRadiusA } from './born-radius-a';
import { imageChargePolarizationEv } from './image-charge-polarization-ev';
import { screenedFractions } from './screened-fractions';
import { ScreeningError } from './screening-error';
import { solidStateLevels } from './solid-state-levels';
import { finiteNumber } from './validate';

export interface SolidStateEstimateInput {
	/** Gas-phase tuned short-range exact-exchange fraction. */
	alpha: number;
	/** Gas-phase tuned range-separation parameter, bohr^-1 (carried into the screened parameters unchanged). */
	gammaBohrInv: number;
	ipGasEv: number;
	eaGasEv: number;
	epsilon: number;
	/** Born cavity: a radius in Å, or the volume per molecule in Å^3 from which a = (3V/4pi)^(1/3). */
	cavity: { radiusA: number } | { volumePerMoleculeA3: number };
	/** Optional image-charge term of a substrate at distance z (Å) with dielectric constant eps_s or a metal. */
	substrate?: { distanceA: number; epsilon: number | 'metal' } | null;
}

export interface SolidStateEstimate {
	alpha: number;
	beta: number;
	gammaBohrInv: number;
	longRangeFraction: number;
	betaNegative: boolean;
	betaNote: string | null;
	radiusA: number;
	radiusSource: 'typed' | 'volume-per-molecule';
	bornEv: number;
	imageChargeEv: number | null;
	pPlusEv: number;
	pMinusEv: number;
	ipGasEv: number;
	eaGasEv: number;
	gapGasEv: number;
	ipSolidEv: number;
	eaSolidEv: number;
	gapSolidEv: number;
	renormalizationEv: number;
	warnings: string[];
}

export function solidStateEstimate(input: SolidStateEstimateInput): SolidStateEstimate {
	const gammaBohrInv = finiteNumber(input.gammaBohrInv, 'gammaBohrInv');
	if (gammaBohrInv <= 0) throw new ScreeningError('gammaBohrInv', `gamma must be > 0 bohr^-1, got ${gammaBohrInv}`);
	const fractions = screenedFractions({ alpha: input.alpha, epsilon: input.epsilon });
	const typed = 'radiusA' in input.cavity;
	const radiusA = typed
		? finiteNumber((input.cavity as { radiusA: number }).radiusA, 'radiusA')
		: bornRadiusA({ volumePerMoleculeA3: (input.cavity as { volumePerMoleculeA3: number }).volumePerMoleculeA3 });
	if (radiusA <= 0) throw new ScreeningError('radiusA', `the cavity radius must be > 0 Å, got ${radiusA}`);
	const bornEv = bornPolarizationEv({ radiusA, epsilon: input.epsilon });
	const imageChargeEv = input.substrate
		? imageChargePolarizationEv({ distanceA: input.substrate.distanceA, substrateEpsilon: input.substrate.epsilon })
		: null;
	const p = bornEv + (imageChargeEv ?? 0);
	const levels = solidStateLevels({ ipGasEv: input.ipGasEv, eaGasEv: input.eaGasEv, pPlusEv: p, pMinusEv: p });
	return {
		alpha: fractions.alpha,
		beta: fractions.beta,
		gammaBohrInv,
		longRangeFraction: fractions.longRange,
		betaNegative: fractions.betaNegative,
		betaNote: fractions.note,
		radiusA,
		radiusSource: typed ? 'typed' : 'volume-per-molecule',
		bornEv,
		imageChargeEv,
		pPlusEv: p,
		pMinusEv: p,
		ipGasEv: input.ipGasEv,
		eaGasEv: input.eaGasEv,
		gapGasEv: levels.gapGasEv,
		ipSolidEv: levels.ipSolidEv,
		eaSolidEv: levels.eaSolidEv,
		gapSolidEv: levels.gapSolidEv,
		renormalizationEv: levels.renormalizationEv,
		warnings: levels.warnings
	};
}
