/**
 * Minimum of a function on a closed interval [a, b], by Brent's method: golden-section steps, replaced
 * by parabolic interpolation steps when those are safe (R. P. Brent, Algorithms for Minimization without
 * Derivatives, Prentice-Hall 1973, ch. 5, procedure localmin). It finds a local minimum inside (a, b); the
 * ends themselves are not evaluated, so callers compare with f(a) and f(b). For a unimodal function,
 * including one with a kink such as |g(x)|, it converges to the minimum (golden-section steps never
 * stop shrinking the bracket).
 */
import { TuningInputError } from './tuning-input-error';

export interface BrentMinimumOptions {
	/** Absolute tolerance on the abscissa (default 1e-10). */
	tolerance?: number;
	/** Safety limit on iterations (default 500). */
	maxIterations?: number;
}

export interface BrentMinimum {
	x: number;
	value: number;
	evaluations: number;
}

const GOLDEN = (3 - Math.sqrt(5)) / 2;
const SQRT_EPS = Math.sqrt(Number.EPSILON);

export function brentMinimum(
	f: (x: number) => number,
	a: number,
	b: number,
	options: BrentMinimumOptions = {}
): BrentMinimum {
	const t = options.tolerance ?? 1e-10;
	const maxIterations = options.maxIterations ?? 500;
	if (!Number.isFinite(a) || !Number.isFinite(b) || !(a < b))
		throw new TuningInputError(`interval must satisfy a < b with finite ends, got [${a}, ${b}]`, 'interval');
	if (!(t > 0)) throw new TuningInputError(`tolerance must be > 0, got ${t}`, 'tolerance');

	let lo = a;
	let hi = b;
	let x = lo + GOLDEN * (hi - lo);
	let w = x;
	let v = x;
	let fx = f(x);
	let fw = fx;
	let fv = fx;
	let evaluations = 1;
	let d = 0;
	let e = 0;
	for (let iter = 0; iter < maxIterations; iter++) {
		const mid = 0.5 * (lo + hi);
		const tol1 = SQRT_EPS * Math.abs(x) + t / 3;
		const tol2 = 2 * tol1;
		if (Math.abs(x - mid) <= tol2 - 0.5 * (hi - lo)) break;
		let useGolden = true;
		if (Math.abs(e) > tol1) {
			// Parabola through (v, fv), (w, fw), (x, fx).
			let r = (x - w) * (fx - fv);
			let q = (x - v) * (fx - fw);
			let p = (x - v) * q - (x - w) * r;
			q = 2 * (q - r);
			if (q > 0) p = -p;
			else q = -q;
			r = e;
			e = d;
			if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (lo - x) && p < q * (hi - x)) {
				d = p / q;
				const u = x + d;
				if (u - lo < tol2 || hi - u < tol2) d = x < mid ? tol1 : -tol1;
				useGolden = false;
			}
		}
		if (useGolden) {
			e = (x < mid ? hi : lo) - x;
			d = GOLDEN * e;
		}
		const u = x + (Math.abs(d) >= tol1 ? d : d > 0 ? tol1 : -tol1);
		const fu = f(u);
		evaluations++;
		if (!Number.isFinite(fu)) throw new TuningInputError(`function is not finite at x = ${u}`, 'function');
		if (fu <= fx) {
			if (u < x) hi = x;
			else lo = x;
			v = w;
			fv = fw;
			w = x;
			fw = fx;
			x = u;
			fx = fu;
		} else {
			if (u < x) lo = u;
			else hi = u;
			if (fu <= fw || w === x) {
				v = w;
				fv = fw;
				w = u;
				fw = fu;
			} else if (fu <= fv || v === x || v === w) {
				v = u;
				fv = fu;
			}
		}
	}
	return { x, value: fx, evaluations };
}
