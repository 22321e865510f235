import { describe, expect, it } from 'vitest';
import { cubicHermiteInterpolant } from './cubic-hermite-interpolant';
import { pchipInterpolant } from './pchip-interpolant';
import { TuningInputError } from './tuning-input-error';

// References: the slope rules of Fritsch & Butland (1984, SIAM J. Sci. Stat. Comput. 5:300) for interior
// nodes and the three-point end rule (Moler, Numerical Computing with MATLAB, 2004, sec. 3.6), which are
// the rules documented for scipy.interpolate.PchipInterpolator. Every expected number below is derived by
// hand in the comment beside it; the same numbers were also printed by scipy 1.17.1 PchipInterpolator.

describe('cubicHermiteInterpolant', () => {
	it('reproduces a cubic exactly when given its exact slopes (Hermite basis, any textbook)', () => {
		const f = (x: number) => 2 - x + 0.5 * x ** 2 - 0.3 * x ** 3;
		const df = (x: number) => -1 + x - 0.9 * x ** 2;
		const xs = [0, 0.4, 1.1, 2, 3.5];
		const h = cubicHermiteInterpolant(xs, xs.map(f), xs.map(df));
		for (let x = 0; x <= 3.5; x += 0.05) {
			expect(h.value(x)).toBeCloseTo(f(x), 12);
			expect(h.derivative(x)).toBeCloseTo(df(x), 11);
		}
	});

	it('refuses to extrapolate', () => {
		const h = cubicHermiteInterpolant([0, 1], [0, 1], [1, 1]);
		expect(() => h.value(1.5)).toThrow(RangeError);
		expect(() => h.value(-0.1)).toThrow('outside the interpolated range');
	});
});

describe('pchipInterpolant', () => {
	it('reproduces linear data exactly, on a non-uniform grid', () => {
		const xs = [0.05, 0.1, 0.2, 0.22, 0.35, 0.6];
		const p = pchipInterpolant(xs, xs.map((x) => 3 - 7 * x));
		for (let x = 0.05; x <= 0.6; x += 0.01) {
			expect(p.value(x)).toBeCloseTo(3 - 7 * x, 13);
			expect(p.derivative(x)).toBeCloseTo(-7, 11);
		}
	});

	it('two nodes give the straight line', () => {
		const p = pchipInterpolant([1, 3], [2, 6]);
		expect(p.slopes).toEqual([2, 2]);
		expect(p.value(2)).toBeCloseTo(4, 14);
	});

	it('y = x^2 on 0..3: slopes [0, 1.5, 3.75, 6] and values (hand-derived; scipy agrees)', () => {
		// m = [1, 3, 5]; interior: w1 = w2 = 3, d1 = 6/(3/1 + 3/3) = 1.5, d2 = 6/(3/3 + 3/5) = 3.75;
		// ends: ((2+1)*1 - 3)/2 = 0 -> 0 ; ((2+1)*5 - 3)/2 = 6.
		// x = 0.5: basis h00 = h01 = 0.5, h10 = 0.125, h11 = -0.125 -> 0.5*1 - 0.125*1.5 = 0.3125.
		const p = pchipInterpolant([0, 1, 2, 3], [0, 1, 4, 9]);
		expect(p.slopes.map((d) => Number(d.toFixed(12)))).toEqual([0, 1.5, 3.75, 6]);
		expect(p.value(0.5)).toBeCloseTo(0.3125, 14);
		expect(p.value(1.5)).toBeCloseTo(2.21875, 14);
		expect(p.value(2.5)).toBeCloseTo(6.21875, 14);
	});

	it('non-uniform data with a maximum: flat slopes at extrema, end slopes by the three-point rule', () => {
		// x = [0, 0.5, 2, 3], y = [1, 3, 2, 2.5]: h = [0.5, 1.5, 1], m = [4, -2/3, 0.5].
		// d1 = d2 = 0 (slope signs change); d0 = ((2*0.5+1.5)*4 - 0.5*(-2/3))/2 = 31/6;
		// d3 = ((2*1+1.5)*0.5 - 1*(-2/3))/2.5 = 29/30.
		// x = 1: t = 1/3 on [0.5, 2], d = 0 at both ends -> 3*20/27 + 2*7/27 = 74/27.
		const p = pchipInterpolant([0, 0.5, 2, 3], [1, 3, 2, 2.5]);
		expect(p.slopes[0]).toBeCloseTo(31 / 6, 13);
		expect(p.slopes[1]).toBe(0);
		expect(p.slopes[2]).toBe(0);
		expect(p.slopes[3]).toBeCloseTo(29 / 30, 13);
		expect(p.value(1)).toBeCloseTo(74 / 27, 13);
		expect(p.value(0.25)).toBeCloseTo(2.32291667, 8); // scipy 1.17.1 printout
		expect(p.value(2.5)).toBeCloseTo(2.12916667, 8); // scipy 1.17.1 printout
	});

	it('end slope limited to 3*m0 when the first two slopes differ in sign', () => {
		// x = [0, 1, 2], y = [0, 1, -5]: m = [1, -6]; three-point d0 = (3*1 + 6)/2 = 4.5 > 3|m0| -> 3.
		// d2 = (3*(-6) - 1)/2 = -9.5 (|d| < 18, kept). x = 0.5: 0.125*3 + 0.5*1 = 0.875.
		const p = pchipInterpolant([0, 1, 2], [0, 1, -5]);
		expect(p.slopes).toEqual([3, 0, -9.5]);
		expect(p.value(0.5)).toBeCloseTo(0.875, 14);
		expect(p.value(1.5)).toBeCloseTo(-0.8125, 14);
	});

	it('interior slope is the weighted harmonic mean on a non-uniform grid', () => {
		// x = [0.1, 0.15, 0.25, 0.3, 0.4], node 1: m0 = -16, m1 = -9, h0 = 0.05, h1 = 0.1,
		// w1 = 2*0.1 + 0.05 = 0.25, w2 = 0.1 + 2*0.05 = 0.2, d1 = 0.45/(0.25/-16 + 0.2/-9) = -11.88990826.
		const p = pchipInterpolant([0.1, 0.15, 0.25, 0.3, 0.4], [2.0, 1.2, 0.3, 0.1, -0.5]);
		expect(p.slopes[1]).toBeCloseTo(0.45 / (0.25 / -16 + 0.2 / -9), 12);
		expect(p.slopes[1]).toBeCloseTo(-11.88990826, 7);
		// scipy 1.17.1 printouts for the remaining slopes and values:
		expect(p.slopes[0]).toBeCloseTo(-18.33333333, 7);
		expect(p.slopes[4]).toBeCloseTo(-7.33333333, 7);
		expect(p.value(0.12)).toBeCloseTo(1.64347156, 7);
		expect(p.value(0.35)).toBeCloseTo(-0.16702899, 7);
	});

	it('preserves monotonicity and never overshoots on step-like data', () => {
		// A natural cubic spline through these points would overshoot near the step.
		const xs = [0, 1, 2, 3, 4, 5, 6];
		const ys = [0, 0.01, 0.02, 1, 1.01, 1.02, 1.03];
		const p = pchipInterpolant(xs, ys);
		let prev = -Infinity;
		const violations: number[] = [];
		for (let x = 0; x <= 6; x += 0.001) {
			const v = p.value(x);
			const k = Math.min(5, Math.floor(x));
			if (v < prev - 1e-15 || v < ys[k] - 1e-15 || v > ys[k + 1] + 1e-15) violations.push(x);
			prev = v;
		}
		expect(violations).toEqual([]);
	});

	it('converges on a smooth monotone cubic (not exact for cubics: O(h^2) or better)', () => {
		const f = (x: number) => 1 - 2 * x + 0.4 * x ** 3; // decreasing on [0, 1]
		const maxError = (n: number) => {
			const xs = Array.from({ length: n + 1 }, (_, i) => i / n);
			const p = pchipInterpolant(xs, xs.map(f));
			let e = 0;
			for (let x = 0; x <= 1; x += 0.0005) e = Math.max(e, Math.abs(p.value(x) - f(x)));
			return e;
		};
		const e10 = maxError(10);
		const e20 = maxError(20);
		expect(e10).toBeLessThan(1e-3);
		expect(e10 / e20).toBeGreaterThan(3.5); // halving h cuts the error at least ~4x
	});

	it('rejects unsorted, duplicated or non-finite nodes with a TuningInputError', () => {
		expect(() => pchipInterpolant([0, 1, 1], [0, 1, 2])).toThrow(TuningInputError);
		expect(() => pchipInterpolant([0, 2, 1], [0, 1, 2])).toThrow('strictly increasing');
		expect(() => pchipInterpolant([0, 1, 2], [0, NaN, 2])).toThrow('value[1] is not a finite number');
		expect(() => pchipInterpolant([0], [0])).toThrow('at least 2 nodes');
	});
});
