import { describe, expect, it } from 'vitest';
import { cartesianToFractional } from './cartesian-to-fractional';
import { cellMatrix } from './cell-matrix';
import { fractionalToCartesian } from './fractional-to-cartesian';
import type { Vec3 } from './types';

// Monoclinic cell of COD 1100117 (cod-developers/cod-tools tests/inputs/1100117.cif).
const cell = { a: 7.8713, b: 5.4739, c: 20.898, alphaDeg: 90, betaDeg: 112.422, gammaDeg: 90 };

describe('fractionalToCartesian / cartesianToFractional', () => {
	it('maps the unit vectors to the lattice vectors', () => {
		const m = cellMatrix(cell);
		expect(fractionalToCartesian([1, 0, 0], cell)).toEqual(m[0]);
		expect(fractionalToCartesian([0, 1, 0], cell)).toEqual(m[1]);
		expect(fractionalToCartesian([0, 0, 1], m)).toEqual(m[2]);
	});
	it('monoclinic: (0, 0, 1) is c·(cosβ, 0, sinβ) (geometry, 1e-12 Å)', () => {
		const beta = (112.422 * Math.PI) / 180;
		const [x, y, z] = fractionalToCartesian([0, 0, 1], cell);
		expect(x).toBeCloseTo(20.898 * Math.cos(beta), 12);
		expect(y).toBe(0);
		expect(z).toBeCloseTo(20.898 * Math.sin(beta), 12);
	});
	it('round-trips fractional -> Cartesian -> fractional (1e-12)', () => {
		const tri = { a: 7.9, b: 6.06, c: 16.01, alphaDeg: 101.9, betaDeg: 112.6, gammaDeg: 85.8 };
		const f: Vec3 = [0.3244, -0.0223, 0.8649];
		const back = cartesianToFractional(fractionalToCartesian(f, tri), tri);
		back.forEach((v, i) => expect(v).toBeCloseTo(f[i], 12));
	});
	it('throws RangeError for bad coordinates or a singular matrix', () => {
		expect(() => fractionalToCartesian([0, Number.NaN, 0], cell)).toThrow(/fractional coordinate must be three finite numbers/);
		expect(() => fractionalToCartesian([0, 0] as unknown as Vec3, cell)).toThrow(RangeError);
		expect(() => cartesianToFractional([1, 2, 3], [[1, 0, 0], [0, 1, 0], [1, 1, 0]])).toThrow(/singular/);
		expect(() => fractionalToCartesian([0, 0, 0], { ...cell, a: -1 })).toThrow(/cell length a/);
	});
});
