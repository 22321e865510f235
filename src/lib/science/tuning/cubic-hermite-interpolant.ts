/**
 * Piecewise cubic Hermite interpolant: on each interval [x_k, x_k+1] the cubic that matches the values
 * y_k, y_k+1 and the slopes d_k, d_k+1 at both ends (C1 continuous). The slopes are chosen by the caller;
 * `pchipInterpolant` chooses them so that the data's shape is preserved.
 *
 * Reference for the Hermite basis: any numerical-analysis text, e.g. Fritsch & Carlson, SIAM J. Numer.
 * Anal. 17 (1980) 238, eq. (2)-(3).
 */
import { TuningInputError } from './tuning-input-error';

/** A C1 piecewise-cubic function of one variable, defined on [minX, maxX]. */
export interface CubicInterpolant {
	readonly xs: readonly number[];
	readonly ys: readonly number[];
	/** First derivatives at the nodes. */
	readonly slopes: readonly number[];
	readonly minX: number;
	readonly maxX: number;
	/** Value at x; throws RangeError outside [minX, maxX] (no extrapolation). */
	value(x: number): number;
	/** First derivative at x; throws RangeError outside [minX, maxX]. */
	derivative(x: number): number;
}

export interface CubicHermiteInterpolantOptions {
	/** Name of the abscissa in error messages (default 'x'). */
	xName?: string;
}

/** Throws unless xs is strictly increasing, every array is finite and the lengths match (>= 2 nodes). */
export function checkNodes(xs: readonly number[], ys: readonly number[], xName: string): void {
	if (!Array.isArray(xs) || !Array.isArray(ys)) throw new TuningInputError('nodes must be arrays', xName);
	if (xs.length !== ys.length)
		throw new TuningInputError(`${xName} and values differ in length (${xs.length} vs ${ys.length})`, xName);
	if (xs.length < 2) throw new TuningInputError(`at least 2 nodes are needed, got ${xs.length}`, xName);
	for (let i = 0; i < xs.length; i++) {
		if (!Number.isFinite(xs[i])) throw new TuningInputError(`${xName}[${i}] is not a finite number`, xName, i);
		if (!Number.isFinite(ys[i])) throw new TuningInputError(`value[${i}] is not a finite number`, 'value', i);
		if (i > 0 && !(xs[i] > xs[i - 1]))
			throw new TuningInputError(
				`${xName} must be strictly increasing: ${xName}[${i}] = ${xs[i]} follows ${xs[i - 1]}`,
				xName,
				i
			);
	}
}

export function cubicHermiteInterpolant(
	xs: readonly number[],
	ys: readonly number[],
	slopes: readonly number[],
	options: CubicHermiteInterpolantOptions = {}
): CubicInterpolant {
	const xName = options.xName ?? 'x';
	checkNodes(xs, ys, xName);
	if (!Array.isArray(slopes) || slopes.length !== xs.length)
		throw new TuningInputError(`slopes must have ${xs.length} entries`, 'slopes');
	slopes.forEach((d, i) => {
		if (!Number.isFinite(d)) throw new TuningInputError(`slopes[${i}] is not a finite number`, 'slopes', i);
	});
	const x = [...xs];
	const y = [...ys];
	const d = [...slopes];
	const n = x.length;
	const minX = x[0];
	const maxX = x[n - 1];
	// Points within this distance outside the range are treated as on its edge (round-off only).
	const slack = 1e-12 * Math.max(1, Math.abs(minX), Math.abs(maxX));

	/** Interval index k with x_k <= t <= x_k+1, by bisection. */
	const locate = (t: number): number => {
		if (!Number.isFinite(t) || t < minX - slack || t > maxX + slack)
			throw new RangeError(`${xName} = ${t} is outside the interpolated range [${minX}, ${maxX}]`);
		let lo = 0;
		let hi = n - 1;
		while (hi - lo > 1) {
			const mid = (lo + hi) >> 1;
			if (x[mid] <= t) lo = mid;
			else hi = mid;
		}
		return lo;
	};

	const value = (t: number): number => {
		const k = locate(t);
		const h = x[k + 1] - x[k];
		const s = Math.min(1, Math.max(0, (t - x[k]) / h));
		const s1 = 1 - s;
		const h00 = (1 + 2 * s) * s1 * s1;
		const h10 = s * s1 * s1;
		const h01 = s * s * (3 - 2 * s);
		const h11 = s * s * (s - 1);
		return h00 * y[k] + h10 * h * d[k] + h01 * y[k + 1] + h11 * h * d[k + 1];
	};

	const derivative = (t: number): number => {
		const k = locate(t);
		const h = x[k + 1] - x[k];
		const s = Math.min(1, Math.max(0, (t - x[k]) / h));
		const dh00 = 6 * s * s - 6 * s;
		const dh10 = 3 * s * s - 4 * s + 1;
		const dh11 = 3 * s * s - 2 * s;
		return (dh00 * (y[k] - y[k + 1])) / h + dh10 * d[k] + dh11 * d[k + 1];
	};

	return Object.freeze({ xs: Object.freeze(x), ys: Object.freeze(y), slopes: Object.freeze(d), minX, maxX, value, derivative });
}
