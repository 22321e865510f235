/**
 * Shape-preserving piecewise cubic Hermite interpolant (PCHIP) of data y(x).
 *
 * Why this interpolant for J_IP(gamma), J_EA(gamma) and the levels:
 * - The J terms are smooth and nearly monotonic in gamma, and scans are often sparse (5-10 points).
 *   A natural cubic spline couples all points: one noisy point moves the curve everywhere, and it can
 *   overshoot between points, creating spurious minima or extra zero crossings of the objective.
 * - PCHIP is local (each node slope depends on its two neighbouring intervals only), preserves the
 *   monotonicity of the data on every interval (so a J term crosses zero inside an interval exactly when
 *   its node values change sign), never overshoots, and is exact for linear data.
 * - A local polynomial fit would smooth rather than interpolate; the data are deterministic SCF results,
 *   so we interpolate and detect bad points separately (see smoothnessOutliers).
 * The cost is lower accuracy than a spline on very smooth data (no exact reproduction of cubics);
 * with typical gamma steps of 0.02-0.05 bohr^-1 the error in gamma* is far below the scan step.
 *
 * Node slopes (Fritsch & Butland 1984, SIAM J. Sci. Stat. Comput. 5:300, a refinement of
 * Fritsch & Carlson 1980, SIAM J. Numer. Anal. 17:238): with h_k = x_k+1 - x_k and
 * m_k = (y_k+1 - y_k)/h_k,
 * - interior node k: d_k = 0 when m_k-1 and m_k differ in sign or either is 0; otherwise the weighted
 *   harmonic mean (w1 + w2)/d_k = w1/m_k-1 + w2/m_k with w1 = 2h_k + h_k-1, w2 = h_k + 2h_k-1;
 * - end nodes: the one-sided three-point estimate d = ((2h0 + h1)m0 - h0 m1)/(h0 + h1), set to 0 when its
 *   sign differs from m0, and limited to 3 m0 when m0 and m1 differ in sign (the end rule of
 *   Moler, Numerical Computing with MATLAB, 2004, sec. 3.6);
 * - two nodes: the straight line.
 * These are the same rules as scipy.interpolate.PchipInterpolator, so its values serve as a check.
 */
import { cubicHermiteInterpolant, checkNodes, type CubicInterpolant } from './cubic-hermite-interpolant';

export interface PchipInterpolantOptions {
	/** Name of the abscissa in error messages (default 'x'). */
	xName?: string;
}

const sign = (v: number): number => (v > 0 ? 1 : v < 0 ? -1 : 0);

function endSlope(h0: number, h1: number, m0: number, m1: number): number {
	const d = ((2 * h0 + h1) * m0 - h0 * m1) / (h0 + h1);
	if (sign(d) !== sign(m0)) return 0;
	if (sign(m0) !== sign(m1) && Math.abs(d) > 3 * Math.abs(m0)) return 3 * m0;
	return d;
}

export function pchipInterpolant(
	xs: readonly number[],
	ys: readonly number[],
	options: PchipInterpolantOptions = {}
): CubicInterpolant {
	const xName = options.xName ?? 'x';
	checkNodes(xs, ys, xName);
	const n = xs.length;
	const h: number[] = [];
	const m: number[] = [];
	for (let k = 0; k < n - 1; k++) {
		h.push(xs[k + 1] - xs[k]);
		m.push((ys[k + 1] - ys[k]) / h[k]);
	}
	const d = new Array<number>(n).fill(0);
	if (n === 2) {
		d[0] = m[0];
		d[1] = m[0];
	} else {
		for (let k = 1; k < n - 1; k++) {
			const a = m[k - 1];
			const b = m[k];
			if (a === 0 || b === 0 || sign(a) !== sign(b)) {
				d[k] = 0;
				continue;
			}
			const w1 = 2 * h[k] + h[k - 1];
			const w2 = h[k] + 2 * h[k - 1];
			d[k] = (w1 + w2) / (w1 / a + w2 / b);
		}
		d[0] = endSlope(h[0], h[1], m[0], m[1]);
		d[n - 1] = endSlope(h[n - 2], h[n - 3], m[n - 2], m[n - 3]);
	}
	return cubicHermiteInterpolant(xs, ys, d, { xName });
}
