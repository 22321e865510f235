/**
 * A root of a continuous function inside a bracket [a, b] where it changes sign, by bisection.
 * Bisection is slow but cannot fail on a valid bracket; the functions here are cheap cubics.
 */
import { TuningInputError } from './tuning-input-error';

export interface BracketedRootOptions {
	/** Stop when the bracket is narrower than this (default 1e-12). */
	tolerance?: number;
	/** Safety limit on iterations (default 200). */
	maxIterations?: number;
}

export function bracketedRoot(
	f: (x: number) => number,
	a: number,
	b: number,
	options: BracketedRootOptions = {}
): number {
	const tolerance = options.tolerance ?? 1e-12;
	const maxIterations = options.maxIterations ?? 200;
	if (!Number.isFinite(a) || !Number.isFinite(b) || !(a < b))
		throw new TuningInputError(`bracket must satisfy a < b with finite ends, got [${a}, ${b}]`, 'bracket');
	if (!(tolerance > 0)) throw new TuningInputError(`tolerance must be > 0, got ${tolerance}`, 'tolerance');
	let fa = f(a);
	const fb = f(b);
	if (!Number.isFinite(fa) || !Number.isFinite(fb))
		throw new TuningInputError('function is not finite at the bracket ends', 'bracket');
	if (fa === 0) return a;
	if (fb === 0) return b;
	if (Math.sign(fa) === Math.sign(fb))
		throw new TuningInputError(`no sign change on [${a}, ${b}] (f = ${fa}, ${fb})`, 'bracket');
	let lo = a;
	let hi = b;
	for (let i = 0; i < maxIterations && hi - lo > tolerance; i++) {
		const mid = 0.5 * (lo + hi);
		if (mid <= lo || mid >= hi) break; // no representable midpoint left
		const fm = f(mid);
		if (fm === 0) return mid;
		if (Math.sign(fm) === Math.sign(fa)) {
			lo = mid;
			fa = fm;
		} else {
			hi = mid;
		}
	}
	return 0.5 * (lo + hi);
}
