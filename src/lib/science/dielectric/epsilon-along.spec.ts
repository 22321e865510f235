import { describe, expect, it } from 'vitest';
import { analyseTensor } from './analyse-tensor';
import { directionFromUvw } from './direction-from-uvw';
import { epsilonAlong } from './epsilon-along';
import { normalFromHkl } from './normal-from-hkl';

const eps = [
	[3.0, 0.4, 0.1],
	[0.4, 3.5, -0.2],
	[0.1, -0.2, 4.1]
];

describe('epsilonAlong: n^T eps n', () => {
	it('Cartesian axes give the diagonal entries (exact)', () => {
		expect(epsilonAlong(eps, [1, 0, 0])).toBe(3.0);
		expect(epsilonAlong(eps, [0, 2, 0])).toBe(3.5); // the direction is normalised
		expect(epsilonAlong(eps, [0, 0, -1])).toBe(4.1);
	});

	it('a principal axis gives its principal value (tolerance 1e-12)', () => {
		const a = analyseTensor(eps);
		a.principalAxes.forEach((axis, i) => expect(epsilonAlong(eps, axis)).toBeCloseTo(a.principalValues[i], 12));
	});

	it('[1,1,0]/sqrt2 gives (xx + yy)/2 + xy (quadratic form by hand)', () => {
		expect(epsilonAlong(eps, [1, 1, 0])).toBeCloseTo((3.0 + 3.5) / 2 + 0.4, 14);
	});

	it('refuses a zero or non-finite direction', () => {
		expect(() => epsilonAlong(eps, [0, 0, 0])).toThrow('direction must be a non-zero vector');
		expect(() => epsilonAlong(eps, [1, NaN, 0])).toThrow('direction component 2 must be a finite number, got NaN');
		expect(() => epsilonAlong(eps, [1, 0])).toThrow('direction must have 3 components');
	});
});

describe('directionFromUvw and normalFromHkl', () => {
	const cubic = [
		[5, 0, 0],
		[0, 5, 0],
		[0, 0, 5]
	];
	// Hexagonal cell a = 3, c = 7: a = (3,0,0), b = (-1.5, 3 sqrt3/2, 0), c = (0,0,7) (textbook setting).
	const hex = [
		[3, 0, 0],
		[-1.5, (3 * Math.sqrt(3)) / 2, 0],
		[0, 0, 7]
	];
	// Monoclinic cell a = 8.5, b = 6.0, c = 11.2, beta = 124.7 deg (made-up numbers, b unique axis).
	const beta = (124.7 * Math.PI) / 180;
	const mono = [
		[8.5, 0, 0],
		[0, 6.0, 0],
		[11.2 * Math.cos(beta), 0, 11.2 * Math.sin(beta)]
	];

	it('[111] in a cubic cell is (1,1,1)/sqrt3', () => {
		directionFromUvw(cubic, [1, 1, 1]).forEach((x) => expect(x).toBeCloseTo(1 / Math.sqrt(3), 14));
	});

	it('[110] in a hexagonal cell is a + b = (1.5, 3 sqrt3/2, 0), i.e. 60 degrees from x', () => {
		const d = directionFromUvw(hex, [1, 1, 0]);
		expect(d[0]).toBeCloseTo(0.5, 14);
		expect(d[1]).toBeCloseTo(Math.sqrt(3) / 2, 14);
		expect(d[2]).toBeCloseTo(0, 14);
	});

	it('the (001) normal of a monoclinic cell is perpendicular to a and b, and differs from [001]', () => {
		const n = normalFromHkl(mono, [0, 0, 1]);
		expect(n[0] * mono[0][0] + n[1] * mono[0][1] + n[2] * mono[0][2]).toBeCloseTo(0, 12);
		expect(n[0] * mono[1][0] + n[1] * mono[1][1] + n[2] * mono[1][2]).toBeCloseTo(0, 12);
		expect(n.map(Math.abs)[2]).toBeCloseTo(1, 12);
		const c = directionFromUvw(mono, [0, 0, 1]);
		expect(c[0]).toBeCloseTo(Math.cos(beta), 12);
	});

	it('the (hkl) normal of a cubic cell is parallel to [hkl]', () => {
		const n = normalFromHkl(cubic, [1, 2, 0]);
		const d = directionFromUvw(cubic, [1, 2, 0]);
		n.forEach((x, i) => expect(x).toBeCloseTo(d[i], 14));
	});

	it('refuses a singular cell and a null direction', () => {
		const flat = [
			[1, 0, 0],
			[0, 1, 0],
			[1, 1, 0]
		];
		expect(() => directionFromUvw(flat, [1, 0, 0])).toThrow('cell matrix is singular');
		expect(() => normalFromHkl(flat, [1, 0, 0])).toThrow('cell matrix is singular');
		expect(() => directionFromUvw(cubic, [0, 0, 0])).toThrow('direction [0 0 0] is not a direction');
		expect(() => normalFromHkl(cubic, [0, 0, 0])).toThrow('plane (0 0 0) does not exist');
	});
});
