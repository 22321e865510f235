/**
 * Weights of the semilocal (PBE-type) parts of a screened range-separated hybrid (science notes,
 * sections 2 and 7). With exact exchange alpha/r + beta erf(gamma r)/r, the semilocal exchange is
 *   (1 - alpha) SR + (1 - alpha - beta) LR = beta x SR-PBE exchange + (1 - alpha - beta) x full PBE exchange,
 * and the semilocal correlation is taken in full.
 */
import { ScreeningError } from './screening-error';
import { finiteNumber, fractionValue, inputObject } from './validate';

export interface SemilocalExchangeWeightsInput {
	/** Short-range exact-exchange fraction. */
	alpha: number;
	/** Long-range minus short-range exact-exchange fraction (may be negative). */
	beta: number;
}

export interface SemilocalExchangeWeights {
	/** Weight of the short-range (erfc-screened) PBE exchange: beta. Negative when beta < 0. */
	srPbeX: number;
	/** Weight of the full-range PBE exchange: 1 - alpha - beta. */
	fullPbeX: number;
	/** Weight of PBE correlation: always 1. */
	pbeC: number;
}

/** Semilocal exchange and correlation weights for an engine deck. */
export function semilocalExchangeWeights(input: SemilocalExchangeWeightsInput): SemilocalExchangeWeights {
	inputObject(input, 'semilocalExchangeWeights');
	const alpha = fractionValue(input.alpha, 'alpha');
	const beta = finiteNumber(input.beta, 'beta');
	const longRange = alpha + beta;
	if (longRange < -1e-12 || longRange > 1 + 1e-12) {
		throw new ScreeningError('beta', `alpha + beta (the long-range fraction) must be between 0 and 1, got ${longRange}`);
	}
	return { srPbeX: beta, fullPbeX: 1 - alpha - beta, pbeC: 1 };
}
