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

/** Solves the small dense system a x = b by Gaussian elimination with partial pivoting (null if singular). */
function solveSmall(a: number[][], b: number[]): number[] | null {
	const k = b.length;
	const m = a.map((row, i) => [...row, b[i]]);
	for (let col = 0; col < k; col++) {
		let piv = col;
		for (let r = col + 1; r < k; r++) if (Math.abs(m[r][col]) > Math.abs(m[piv][col])) piv = r;
		[m[col], m[piv]] = [m[piv], m[col]];
		if (Math.abs(m[col][col]) < 1e-300) return null;
		for (let r = col + 1; r < k; r++) {
			const f = m[r][col] / m[col][col];
			for (let c = col; c <= k; c++) m[r][c] -= f * m[col][c];
		}
	}
	const x = new Array<number>(k).fill(0);
	for (let r = k - 1; r >= 0; r--) {
		let s = m[r][k];
		for (let c = r + 1; c < k; c++) s -= m[r][c] * x[c];
		x[r] = s / m[r][r];
	}
	return x;
}

/**
 * Least-squares polynomial of the given degree through (u_i, y_i), evaluated at u = 0, with the standard
 * deviation of that prediction for a new observation: s sqrt(1 + leverage), s the rms misfit with
 * degrees-of-freedom correction, leverage = [(X^T X)^-1]_00. Extrapolation (an end point) has a large
 * leverage, so its larger prediction error is not mistaken for an outlier. Null if the fit is singular.
 */
function localPrediction(u: number[], y: number[], degree: number): { value: number; sd: number } | null {
	const k = degree + 1;
	const ata = Array.from({ length: k }, () => new Array<number>(k).fill(0));
	const aty = new Array<number>(k).fill(0);
	for (let i = 0; i < u.length; i++) {
		const pw = [1];
		for (let p = 1; p < k; p++) pw.push(pw[p - 1] * u[i]);
		for (let r = 0; r < k; r++) {
			aty[r] += pw[r] * y[i];
			for (let c = 0; c < k; c++) ata[r][c] += pw[r] * pw[c];
		}
	}
	const coef = solveSmall(ata, aty);
	const e0 = solveSmall(ata, [1, ...new Array<number>(k - 1).fill(0)]);
	if (coef === null || e0 === null) return null;
	let ssr = 0;
	for (let i = 0; i < u.length; i++) {
		let p = 0;
		for (let c = k - 1; c >= 0; c--) p = p * u[i] + coef[c];
		ssr += (y[i] - p) ** 2;
	}
	const dof = u.length - k;
	const s = dof > 0 ? Math.sqrt(ssr / dof) : 0;
	return { value: coef[0], sd: s * Math.sqrt(1 + Math.max(0, e0[0])) };
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

	/** Leave-one-out residual and score of every point of `set` (indices into xs), in order. */
	const looScores = (set: number[]): { index: number; residual: number; score: number }[] => {
		const m = set.length;
		const size = Math.min(windowSize, m);
		const out: { index: number; residual: number; score: number }[] = [];
		for (let j = 0; j < m; j++) {
			const start = Math.min(Math.max(0, j - Math.floor(size / 2)), m - size);
			const others = set.slice(start, start + size).filter((_, q) => start + q !== j);
			const degree = Math.min(3, others.length - 3);
			const xj = xs[set[j]];
			const span = Math.max(...others.map((i) => Math.abs(xs[i] - xj)));
			const yMean = others.reduce((s, i) => s + ys[i], 0) / others.length;
			const u = others.map((i) => (xs[i] - xj) / span);
			const v = others.map((i) => ys[i] - yMean);
			const fit = localPrediction(u, v, degree);
			if (fit === null) continue;
			// At an end point the fit is extrapolated, and for a strongly curved series its error is
			// systematic, not captured by the misfit. Add a model uncertainty there: half the change of the
			// prediction when the degree drops by one (the weight 1/2 was chosen on synthetic curved scans:
			// about 1 % false alarms on smooth data, end-point jumps of ~30 mHa found in most cases).
			const extrapolated = u.every((t) => t > 0) || u.every((t) => t < 0);
			const lower = extrapolated && degree > 1 ? localPrediction(u, v, degree - 1) : null;
			const modelSd = lower === null ? 0 : 0.5 * Math.abs(fit.value - lower.value);
			const sd = Math.max(Math.hypot(fit.sd, modelSd), noiseFloor);
			const residual = ys[set[j]] - yMean - fit.value;
			out.push({ index: set[j], residual, score: Math.abs(residual) / sd });
		}
		return out;
	};

	const remaining = xs.map((_, i) => i);
	const found: SmoothnessOutlier[] = [];
	while (found.length < maxOutliers && remaining.length >= minPoints) {
		let best: SmoothnessOutlier | null = null;
		for (const c of looScores(remaining))
			if (Math.abs(c.residual) > threshold && c.score > relativeFactor && (best === null || c.score > best.score))
				best = { index: c.index, x: xs[c.index], residual: c.residual, score: c.score };
		if (best === null) break;
		found.push(best);
		remaining.splice(remaining.indexOf(best.index), 1);
	}
	return found.sort((a, b) => a.index - b.index);
}
