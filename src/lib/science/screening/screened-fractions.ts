/**
 * Exact-exchange fractions of the screened range-separated hybrid (science notes, section 2):
 * alpha (short range) stays as chosen for the gas phase, the long-range fraction becomes 1/epsilon,
 * so beta = 1/epsilon - alpha. beta < 0 (when 1/epsilon < alpha) is legal and flagged with a note.
 * gamma is not touched: it stays at its gas-phase optimum.
 */
import { type SemilocalExchangeWeights, semilocalExchangeWeights } from './semilocal-exchange-weights';
import { ScreeningError } from './screening-error';
import { epsilonValue, fractionValue, inputObject } from './validate';

export interface ScreenedFractionsInput {
	/** Short-range exact-exchange fraction, 0 <= alpha <= 1. */
	alpha: number;
	/** Dielectric constant, >= 1 (1 = gas phase). */
	epsilon: number;
	/** Optional standard uncertainty of epsilon. */
	epsilonUncertainty?: number | null;
}

export interface ScreenedFractions {
	alpha: number;
	/** 1/epsilon - alpha. Values within 1e-15 of zero are returned as exactly 0. */
	beta: number;
	/** alpha + beta = 1/epsilon. */
	longRange: number;
	betaNegative: boolean;
	/** Why the values look the way they do (gas phase, negative beta), or null. */
	note: string | null;
	/** Semilocal weights for engine decks (srPbeX = beta, fullPbeX = 1 - alpha - beta, pbeC = 1). */
	semilocal: SemilocalExchangeWeights;
	/** u(1/epsilon) = u(epsilon)/epsilon^2 (also u(beta)); null without an epsilon uncertainty. */
	longRangeUncertainty: number | null;
}

/** Rounding noise below which beta is reported as exactly zero. */
const BETA_ZERO = 1e-15;

/** alpha, beta and the long-range fraction for a medium of dielectric constant epsilon. */
export function screenedFractions(input: ScreenedFractionsInput): ScreenedFractions {
	inputObject(input, 'screenedFractions');
	const alpha = fractionValue(input.alpha, 'alpha');
	const epsilon = epsilonValue(input.epsilon, 'epsilon');
	const du = input.epsilonUncertainty ?? null;
	if (du !== null && (typeof du !== 'number' || !Number.isFinite(du) || du < 0)) {
		throw new ScreeningError('epsilonUncertainty', `epsilonUncertainty must be a finite number >= 0, got ${String(du)}`);
	}

	const longRange = 1 / epsilon;
	let beta = longRange - alpha;
	if (Math.abs(beta) < BETA_ZERO) beta = 0;
	const betaNegative = beta < 0;

	let note: string | null = null;
	if (betaNegative) {
		note =
			`beta = 1/epsilon - alpha = ${round(beta)} is negative because the long-range fraction 1/epsilon ` +
			`(${round(longRange)}) is below the short-range fraction alpha (${round(alpha)}): exact exchange ` +
			'decreases with distance. This is legal; the short-range semilocal weight (= beta) is negative too, ' +
			'so check that the engine accepts negative weights.';
	} else if (epsilon === 1) {
		note = 'epsilon = 1 is the gas phase: alpha + beta = 1 (full long-range exact exchange).';
	}

	return {
		alpha,
		beta,
		longRange,
		betaNegative,
		note,
		semilocal: semilocalExchangeWeights({ alpha, beta }),
		longRangeUncertainty: du === null ? null : du / epsilon ** 2
	};
}

function round(v: number): number {
	return Number(v.toPrecision(4));
}
