/**
 * Points of a series y(x) that break its smoothness: a total or orbital energy that jumps away from the
 * smooth curve through its neighbours (in a gamma scan, typically an SCF that failed or landed on
 * another state).
 *
 * Method (leave-one-out against a local fit): for each point j, fit a polynomial by least squares to
 * up to `windowSize - 1` neighbouring points without j (degree 3, lower when fewer points would leave
 * less than 2 degrees of freedom), and compare y_j with the fit. The score is |residual| divided by the standard deviation
 * of the fit's prediction at x_j: its rms misfit times sqrt(1 + leverage) (an externally studentised
 * residual), floored by `noiseFloor`. At the two end points, where the fit is extrapolated, half the change
 * of the prediction when the degree drops by one is added in quadrature (model uncertainty): the ends of
 * a strongly curved series are judged more cautiously. A genuine outlier is far from a fit that matches its neighbours
 * well; a neighbour of an outlier has a poor fit (the outlier is in its window), hence a low score.
 * The point with the highest score is flagged when |residual| > `threshold` and score > `relativeFactor`;
 * it is then removed and the search repeats (at most `maxOutliers` times).
 * Limitations: with fewer than 7 points the local fits are low-order and only large jumps are found;
 * at the ends of a strongly curved series a jump must be several times the extrapolation error to be
 * found, and a small jump at the second point may be attributed to the end point.
 * Needs at least `minPoints` points; returns [] otherwise.
 */
import { TuningInputError } from './tuning-input-error';

export interface SmoothnessOutliersOptions {
	/** Smallest |residual| that counts (same unit as y; default 1e-4, sized for hartree: ~3 meV). */
	threshold?: number;
	/** Smallest residual-to-misfit ratio that counts (default 10). */
	relativeFactor?: number;
	/** Misfit below this is treated as this (same unit as y; default 1e-6, SCF-convergence scale). */
	noiseFloor?: number;
	/** Points per local window, the tested point included (default 7). */
	windowSize?: number;
	/** Fewest points for a test (default 5). */
	minPoints?: number;
	/** Most points to flag (default floor((n - 1) / 4)). */
	maxOutliers?: number;
}

export interface SmoothnessOutlier {
	/** Index into the input arrays. */
	index: number;
	x: number;
	/** y minus the local fit without this point. */
	residual: number;
	/** |residual| / standard deviation of the local fit's prediction. */
	score: number;
}

// Scratch space for the small least-squares systems (degree <= 3, so at most 4 unknowns). The routine
// is synchronous and never re-entered, so module-level scratch arrays are safe and keep a 1,000-point
// scan free of allocations in the inner loop (see bench/tuning-analysis.ts).
const AUG = new Float64Array(4 * 6); // k rows of [A | b | e1], k <= 4
const ROWS = new Int32Array(4);
const SOL = new Float64Array(8); // coefficients, then the first column of the inverse
const POW = new Float64Array(7); // power sums of u
const TV = new Float64Array(4); // sums of u^r v

/**
 * Solves (A^T A) c = A^T v and (A^T A) e = e_1 for the polynomial basis 1, u, ..., u^(k-1) by Gaussian
 * elimination with partial pivoting on both right-hand sides at once (the same operations as two
 * separate solves). Writes c to SOL[0..k-1] and e to SOL[4..4+k-1]. Returns false when singular.
 */
function solveNormal(u: Float64Array, v: Float64Array, len: number, k: number): boolean {
	const w = k + 2;
	// The normal matrix of the basis 1, u, ..., u^(k-1) is a Hankel matrix of the power sums
	// S_m = sum u^m (m = 0 .. 2k-2); the right-hand side is T_r = sum u^r v.
	for (let m = 0; m < 2 * k - 1; m++) POW[m] = 0;
	for (let r = 0; r < k; r++) TV[r] = 0;
	for (let i = 0; i < len; i++) {
		let p = 1;
		for (let m = 0; m < 2 * k - 1; m++) {
			POW[m] += p;
			if (m < k) TV[m] += p * v[i];
			p *= u[i];
		}
	}
	for (let r = 0; r < k; r++) {
		for (let c = 0; c < k; c++) AUG[r * w + c] = POW[r + c];
		AUG[r * w + k] = TV[r];
	}
	for (let r = 0; r < k; r++) {
		AUG[r * w + k + 1] = r === 0 ? 1 : 0;
		ROWS[r] = r;
	}
	for (let col = 0; col < k; col++) {
		let piv = col;
		for (let r = col + 1; r < k; r++) if (Math.abs(AUG[ROWS[r] * w + col]) > Math.abs(AUG[ROWS[piv] * w + col])) piv = r;
		const t = ROWS[col];
		ROWS[col] = ROWS[piv];
		ROWS[piv] = t;
		const pc = ROWS[col] * w;
		if (Math.abs(AUG[pc + col]) < 1e-300) return false;
		for (let r = col + 1; r < k; r++) {
			const rr = ROWS[r] * w;
			const f = AUG[rr + col] / AUG[pc + col];
			for (let c = col; c < w; c++) AUG[rr + c] -= f * AUG[pc + c];
		}
	}
	for (let rhs = 0; rhs < 2; rhs++) {
		for (let r = k - 1; r >= 0; r--) {
			const rr = ROWS[r] * w;
			let sum = AUG[rr + k + rhs];
			for (let c = r + 1; c < k; c++) sum -= AUG[rr + c] * SOL[rhs * 4 + c];
			SOL[rhs * 4 + r] = sum / AUG[rr + r];
		}
	}
	return true;
}

/**
 * Least-squares polynomial of the given degree through (u, v) (u scaled to [-1, 1] around the tested
 * point, which sits at u = 0): its value at u = 0 and the standard deviation of that prediction for a
 * new observation, s * sqrt(1 + e0), with s the rms misfit and e0 = [(A^T A)^-1]_00 the leverage.
 */
const PRED = { value: 0, sd: 0 }; // result of localPrediction (scratch, see above)

function localPrediction(u: Float64Array, v: Float64Array, len: number, degree: number): boolean {
	const k = degree + 1;
	if (!solveNormal(u, v, len, k)) return false;
	let ssr = 0;
	for (let i = 0; i < len; i++) {
		let p = 0;
		for (let c = k - 1; c >= 0; c--) p = p * u[i] + SOL[c];
		ssr += (v[i] - p) ** 2;
	}
	const dof = len - k;
	const s = dof > 0 ? Math.sqrt(ssr / dof) : 0;
	PRED.value = SOL[0];
	PRED.sd = s * Math.sqrt(1 + Math.max(0, SOL[4]));
	return true;
}

export function smoothnessOutliers(
	xs: readonly number[],
	ys: readonly number[],
	options: SmoothnessOutliersOptions = {}
): SmoothnessOutlier[] {
	const threshold = options.threshold ?? 1e-4;
	const relativeFactor = options.relativeFactor ?? 10;
	const noiseFloor = options.noiseFloor ?? 1e-6;
	const windowSize = options.windowSize ?? 7;
	const minPoints = options.minPoints ?? 5;
	for (const [name, v] of [
		['threshold', threshold],
		['relativeFactor', relativeFactor],
		['noiseFloor', noiseFloor]
	] as const)
		if (!(Number.isFinite(v) && v > 0)) throw new TuningInputError(`${name} must be a positive number, got ${v}`, name);
	if (!Number.isInteger(windowSize) || windowSize < 5)
		throw new TuningInputError(`windowSize must be an integer >= 5, got ${windowSize}`, 'windowSize');
	if (!Number.isInteger(minPoints) || minPoints < 5)
		throw new TuningInputError(`minPoints must be an integer >= 5, got ${minPoints}`, 'minPoints');
	if (xs.length !== ys.length) throw new TuningInputError('xs and ys differ in length', 'ys');
	for (let i = 0; i < xs.length; i++) {
		if (!Number.isFinite(xs[i]) || !Number.isFinite(ys[i]))
			throw new TuningInputError(`point ${i} is not finite`, 'xs', i);
		if (i > 0 && !(xs[i] > xs[i - 1])) throw new TuningInputError('xs must be strictly increasing', 'xs', i);
	}
	const maxOutliers = options.maxOutliers ?? Math.floor((xs.length - 1) / 4);

	/** The point of `set` (indices into xs) with the highest leave-one-out score that passes both limits. */
	const bestCandidate = (set: number[]): SmoothnessOutlier | null => {
		const m = set.length;
		const size = Math.min(windowSize, m);
		let best: SmoothnessOutlier | null = null;
		const u = new Float64Array(size);
		const v = new Float64Array(size);
		for (let j = 0; j < m; j++) {
			const start = Math.min(Math.max(0, j - Math.floor(size / 2)), m - size);
			const xj = xs[set[j]];
			let len = 0;
			let span = 0;
			let yMean = 0;
			for (let q = start; q < start + size; q++) {
				if (q === j) continue;
				span = Math.max(span, Math.abs(xs[set[q]] - xj));
				yMean += ys[set[q]];
				len++;
			}
			yMean /= len;
			let allPos = true;
			let allNeg = true;
			for (let q = start, i = 0; q < start + size; q++) {
				if (q === j) continue;
				u[i] = (xs[set[q]] - xj) / span;
				v[i] = ys[set[q]] - yMean;
				if (!(u[i] > 0)) allPos = false;
				if (!(u[i] < 0)) allNeg = false;
				i++;
			}
			const degree = Math.min(3, len - 3);
			if (!localPrediction(u, v, len, degree)) continue;
			const fitValue = PRED.value;
			const fitSd = PRED.sd;
			// At an end point the fit is extrapolated, and for a strongly curved series its error is
			// systematic, not captured by the misfit. Add a model uncertainty there: half the change of the
			// prediction when the degree drops by one (the weight 1/2 was chosen on synthetic curved scans:
			// about 1 % false alarms on smooth data, end-point jumps of ~30 mHa found in most cases).
			const extrapolated = allPos || allNeg;
			const lower = extrapolated && degree > 1 && localPrediction(u, v, len, degree - 1);
			const modelSd = lower ? 0.5 * Math.abs(fitValue - PRED.value) : 0;
			const sd = Math.max(Math.hypot(fitSd, modelSd), noiseFloor);
			const residual = ys[set[j]] - yMean - fitValue;
			const score = Math.abs(residual) / sd;
			if (Math.abs(residual) > threshold && score > relativeFactor && (best === null || score > best.score))
				best = { index: set[j], x: xs[set[j]], residual, score };
		}
		return best;
	};

	const remaining = xs.map((_, i) => i);
	const found: SmoothnessOutlier[] = [];
	while (found.length < maxOutliers && remaining.length >= minPoints) {
		const best = bestCandidate(remaining);
		if (best === null) break;
		found.push(best);
		remaining.splice(remaining.indexOf(best.index), 1);
	}
	return found.sort((a, b) => a.index - b.index);
}
