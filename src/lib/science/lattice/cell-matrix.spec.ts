import { describe, expect, it } from 'vitest';
import { cellMatrix } from './cell-matrix';
import { cellVolumeA3 } from './cell-volume';
import type { Vec3 } from './types';

const dot = (p: Vec3, q: Vec3) => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
const norm = (p: Vec3) => Math.sqrt(dot(p, p));
const angleDeg = (p: Vec3, q: Vec3) => (Math.acos(dot(p, q) / (norm(p) * norm(q))) * 180) / Math.PI;
const det = ([a, b, c]: readonly [Vec3, Vec3, Vec3]) =>
	a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);

// Pentacene PENCEN cell (afonari/emc, Test-Pentacene/README.md); check is geometric self-consistency:
// rows reproduce a, b, c and alpha = angle(b, c), beta = angle(a, c), gamma = angle(a, b).
const pentacene = { a: 7.9, b: 6.06, c: 16.01, alphaDeg: 101.9, betaDeg: 112.6, gammaDeg: 85.8 };

describe('cellMatrix', () => {
	it('puts a along x and b in the xy plane', () => {
		const [a, b] = cellMatrix(pentacene);
		expect(a[1]).toBe(0);
		expect(a[2]).toBe(0);
		expect(b[2]).toBe(0);
		expect(b[1]).toBeGreaterThan(0);
	});
	it('rows reproduce lengths (1e-12 Å) and angles (1e-10°) of a triclinic cell', () => {
		const [a, b, c] = cellMatrix(pentacene);
		expect(norm(a)).toBeCloseTo(7.9, 12);
		expect(norm(b)).toBeCloseTo(6.06, 12);
		expect(norm(c)).toBeCloseTo(16.01, 12);
		expect(angleDeg(b, c)).toBeCloseTo(101.9, 10);
		expect(angleDeg(a, c)).toBeCloseTo(112.6, 10);
		expect(angleDeg(a, b)).toBeCloseTo(85.8, 10);
	});
	it('is right-handed with determinant equal to the cell volume (relative 1e-12)', () => {
		const m = cellMatrix(pentacene);
		expect(det(m) / cellVolumeA3(pentacene)).toBeCloseTo(1, 12);
	});
	it('is exactly diagonal for an orthorhombic cell', () => {
		expect(cellMatrix({ a: 7.184, b: 14.433, c: 26.897, alphaDeg: 90, betaDeg: 90, gammaDeg: 90 })).toEqual([
			[7.184, 0, 0],
			[0, 14.433, 0],
			[0, 0, 26.897]
		]);
	});
	it('gives b = (-b/2, b·√3/2, 0) for a hexagonal cell', () => {
		const [, b] = cellMatrix({ a: 4, b: 4, c: 6, alphaDeg: 90, betaDeg: 90, gammaDeg: 120 });
		expect(b[0]).toBe(-2);
		expect(b[1]).toBeCloseTo(2 * Math.sqrt(3), 14);
	});
	it('throws RangeError for a non-physical cell', () =>
		expect(() => cellMatrix({ ...pentacene, gammaDeg: 200 })).toThrow(RangeError));
});
