/**
 * Range-separated hybrid parameters as the deck writers take them, in Kappaline's letters
 * (the project's science notes, sections 2 and 7):
 *
 *   1/r = [alpha + beta erf(gamma r)]/r + [1 - alpha - beta erf(gamma r)]/r
 *
 * alpha = short-range exact-exchange fraction, alpha + beta = long-range fraction,
 * gamma = range-separation parameter in bohr^-1. Gas phase: alpha + beta = 1. Screened
 * (dielectric constant epsilon): alpha + beta = 1/epsilon, so beta = 1/epsilon - alpha (any sign).
 */
import { DeckInputError } from './errors';

export interface SrshParameters {
	/** Short-range exact-exchange fraction, 0 <= alpha <= 1. */
	alpha: number;
	/** Long-range minus short-range exact-exchange fraction; may be negative when screened. */
	beta: number;
	/** Range-separation parameter, bohr^-1 (> 0). */
	gammaBohrInv: number;
	/** Dielectric constant used for the long-range fraction; 1 for the gas phase. */
	epsilon: number;
}

/** Smallest and largest gamma accepted (bohr^-1); outside this the input is surely a unit slip. */
export const GAMMA_MIN_BOHR_INV = 1e-4;
export const GAMMA_MAX_BOHR_INV = 10;

function finite(field: string, v: unknown, what: string): number {
	if (typeof v !== 'number' || !Number.isFinite(v)) {
		throw new DeckInputError(field, `${what} must be a finite number, got ${String(v)}`);
	}
	return v;
}

/** Check alpha in [0, 1]. */
export function checkAlpha(alpha: unknown, field = 'alpha'): number {
	const a = finite(field, alpha, 'alpha (short-range exact-exchange fraction)');
	if (a < 0 || a > 1) throw new DeckInputError(field, `alpha must lie in [0, 1], got ${a}`);
	return a;
}

/** Check gamma > 0 (bohr^-1) within a plausible window. */
export function checkGamma(gamma: unknown, field = 'gammaBohrInv'): number {
	const g = finite(field, gamma, 'gamma (bohr^-1)');
	if (g <= 0) throw new DeckInputError(field, `gamma must be > 0 bohr^-1, got ${g}`);
	if (g < GAMMA_MIN_BOHR_INV || g > GAMMA_MAX_BOHR_INV) {
		throw new DeckInputError(
			field,
			`gamma = ${g} bohr^-1 is outside [${GAMMA_MIN_BOHR_INV}, ${GAMMA_MAX_BOHR_INV}]; is it in Å^-1 or scaled by 1e3?`
		);
	}
	return g;
}

/** Check epsilon >= 1. */
export function checkEpsilon(epsilon: unknown, field = 'epsilon'): number {
	const e = finite(field, epsilon, 'epsilon (dielectric constant)');
	if (e < 1) throw new DeckInputError(field, `epsilon must be >= 1, got ${e}`);
	return e;
}

/** Gas-phase parameters: beta = 1 - alpha (full exact exchange at long range). */
export function gasPhaseSrsh(alpha: number, gammaBohrInv: number): SrshParameters {
	const a = checkAlpha(alpha);
	const g = checkGamma(gammaBohrInv);
	return { alpha: a, beta: 1 - a, gammaBohrInv: g, epsilon: 1 };
}

/** Screened parameters: beta = 1/epsilon - alpha (negative when 1/epsilon < alpha). */
export function screenedSrsh(alpha: number, gammaBohrInv: number, epsilon: number): SrshParameters {
	const a = checkAlpha(alpha);
	const g = checkGamma(gammaBohrInv);
	const e = checkEpsilon(epsilon);
	return { alpha: a, beta: 1 / e - a, gammaBohrInv: g, epsilon: e };
}

/** Weight of the full-range semilocal (PBE) exchange, 1 - alpha - beta, with round-off noise removed. */
export function fullRangeSemilocalWeight(p: SrshParameters): number {
	const w = 1 - p.alpha - p.beta;
	return Math.abs(w) < 1e-12 ? 0 : w;
}

/** Long-range exact-exchange fraction alpha + beta. */
export function longRangeFraction(p: SrshParameters): number {
	return p.alpha + p.beta;
}
