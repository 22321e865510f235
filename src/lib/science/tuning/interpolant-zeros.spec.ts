import { describe, expect, it } from 'vitest';
import { cubicHermiteInterpolant } from './cubic-hermite-interpolant';
import { interpolantZeros } from './interpolant-zeros';
import { pchipInterpolant } from './pchip-interpolant';

describe('interpolantZeros', () => {
	it('finds the root of linear data exactly (analytic: 0.2137)', () => {
		const xs = [0.1, 0.15, 0.2, 0.25, 0.3];
		const p = pchipInterpolant(xs, xs.map((x) => -0.3 * (x - 0.2137)));
		const z = interpolantZeros(p);
		expect(z).toHaveLength(1);
		expect(z[0]).toBeCloseTo(0.2137, 11);
	});

	it('reports a node that is exactly zero once', () => {
		const p = pchipInterpolant([0, 1, 2], [-1, 0, 1]);
		expect(interpolantZeros(p)).toEqual([1]);
	});

	it('finds two roots inside one Hermite piece (cubic with exact slopes: roots 0.25 and 0.75)', () => {
		// f = (x - 0.25)(x - 0.75) = x^2 - x + 0.1875 on [0, 1]; f(0) = f(1) = 0.1875 > 0.
		const f = (x: number) => (x - 0.25) * (x - 0.75);
		const df = (x: number) => 2 * x - 1;
		const h = cubicHermiteInterpolant([0, 1], [f(0), f(1)], [df(0), df(1)]);
		const z = interpolantZeros(h);
		expect(z).toHaveLength(2);
		expect(z[0]).toBeCloseTo(0.25, 11);
		expect(z[1]).toBeCloseTo(0.75, 11);
	});

	it('returns [] when the data stay positive', () => {
		expect(interpolantZeros(pchipInterpolant([0, 1, 2, 3], [3, 2, 1.5, 1.2]))).toEqual([]);
	});
});
