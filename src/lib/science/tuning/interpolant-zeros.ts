/**
 * Every zero of a piecewise-cubic interpolant on its range, in increasing order.
 * Each piece is split where its derivative vanishes, so every sub-piece is monotonic and holds at most
 * one zero, which is then found by bisection. Nodes where the value is exactly zero count as zeros.
 */
import { bracketedRoot } from './bracketed-root';
import type { CubicInterpolant } from './cubic-hermite-interpolant';

export interface InterpolantZerosOptions {
	/** Absolute tolerance on each zero (default 1e-12). Zeros closer than 10x this are merged. */
	tolerance?: number;
}

/** Roots in (0, 1) of a t^2 + b t + c. */
function unitQuadraticRoots(a: number, b: number, c: number): number[] {
	const scale = Math.max(Math.abs(a), Math.abs(b), Math.abs(c));
	if (scale === 0) return [];
	const A = a / scale;
	const B = b / scale;
	const C = c / scale;
	let roots: number[];
	if (Math.abs(A) < 1e-14) roots = Math.abs(B) < 1e-14 ? [] : [-C / B];
	else {
		const disc = B * B - 4 * A * C;
		if (disc < 0) roots = [];
		else {
			// Numerically stable form.
			const q = -0.5 * (B + (B >= 0 ? 1 : -1) * Math.sqrt(disc));
			roots = [q / A];
			if (q !== 0) roots.push(C / q);
		}
	}
	return roots.filter((t) => t > 0 && t < 1).sort((p, q) => p - q);
}

export function interpolantZeros(interp: CubicInterpolant, options: InterpolantZerosOptions = {}): number[] {
	const tolerance = options.tolerance ?? 1e-12;
	const { xs, ys, slopes } = interp;
	const zeros: number[] = [];
	const push = (z: number) => {
		if (zeros.length === 0 || z - zeros[zeros.length - 1] > 10 * tolerance) zeros.push(z);
	};
	for (let k = 0; k < xs.length - 1; k++) {
		const h = xs[k + 1] - xs[k];
		// d/dt of the Hermite cubic in t = (x - x_k)/h is a t^2 + b t + c:
		const a = 6 * ys[k] + 3 * h * slopes[k] - 6 * ys[k + 1] + 3 * h * slopes[k + 1];
		const b = -6 * ys[k] - 4 * h * slopes[k] + 6 * ys[k + 1] - 2 * h * slopes[k + 1];
		const c = h * slopes[k];
		const cuts = [xs[k], ...unitQuadraticRoots(a, b, c).map((t) => xs[k] + t * h), xs[k + 1]];
		for (let j = 0; j < cuts.length - 1; j++) {
			const lo = cuts[j];
			const hi = cuts[j + 1];
			if (!(hi > lo)) continue;
			const flo = j === 0 ? ys[k] : interp.value(lo);
			const fhi = j === cuts.length - 2 ? ys[k + 1] : interp.value(hi);
			if (flo === 0) push(lo);
			else if (fhi !== 0 && Math.sign(flo) !== Math.sign(fhi))
				push(bracketedRoot((x) => interp.value(x), lo, hi, { tolerance }));
		}
	}
	if (ys[ys.length - 1] === 0) push(xs[xs.length - 1]);
	return zeros;
}
