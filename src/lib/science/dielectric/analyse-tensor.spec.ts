import { describe, expect, it } from 'vitest';
import { analyseTensor } from './analyse-tensor';
import { DielectricError } from './dielectric-error';

type M3 = number[][];

// Rotation matrices (textbook linear algebra): R = Rz(gz) Ry(gy) Rx(gx).
function rotation(gx: number, gy: number, gz: number): M3 {
	const [cx, sx, cy, sy, cz, sz] = [Math.cos(gx), Math.sin(gx), Math.cos(gy), Math.sin(gy), Math.cos(gz), Math.sin(gz)];
	const rx = [[1, 0, 0], [0, cx, -sx], [0, sx, cx]];
	const ry = [[cy, 0, sy], [0, 1, 0], [-sy, 0, cy]];
	const rz = [[cz, -sz, 0], [sz, cz, 0], [0, 0, 1]];
	return mul(rz, mul(ry, rx));
}
function mul(a: M3, b: M3): M3 {
	return a.map((_, i) => [0, 1, 2].map((j) => a[i][0] * b[0][j] + a[i][1] * b[1][j] + a[i][2] * b[2][j]));
}
function transpose(a: M3): M3 {
	return [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[j][i]));
}
function diag(d: number[]): M3 {
	return [[d[0], 0, 0], [0, d[1], 0], [0, 0, d[2]]];
}
function det(m: M3): number {
	return (
		m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
		m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
		m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
	);
}
const dot = (a: number[], b: number[]) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

describe('analyseTensor: eigen-decomposition', () => {
	// Spectral theorem: R diag(l) R^T has eigenvalues l and eigenvectors the columns of R.
	const values = [2.5, 3.1, 4.2];
	const R = rotation(0.3, -0.7, 1.1);
	const eps = mul(mul(R, diag(values)), transpose(R));

	it('recovers known principal values of a rotated diagonal tensor (tolerance 1e-12)', () => {
		const a = analyseTensor(eps);
		a.principalValues.forEach((v, i) => expect(v).toBeCloseTo(values[i], 12));
	});

	it('recovers the principal axes up to sign (|cos| = 1 within 1e-10) as a right-handed orthonormal set', () => {
		const a = analyseTensor(eps);
		const columns = transpose(R);
		a.principalAxes.forEach((axis, i) => {
			expect(Math.abs(dot(axis, columns[i]))).toBeCloseTo(1, 10);
			expect(dot(axis, axis)).toBeCloseTo(1, 12);
		});
		expect(dot(a.principalAxes[0], a.principalAxes[1])).toBeCloseTo(0, 12);
		expect(det(a.principalAxes)).toBeCloseTo(1, 12);
	});

	it('invariants: trace/3 and det^(1/3) agree with the matrix itself (tolerance 1e-12)', () => {
		const a = analyseTensor(eps);
		expect(a.traceMean).toBeCloseTo((eps[0][0] + eps[1][1] + eps[2][2]) / 3, 12);
		expect(a.traceMean).toBeCloseTo((2.5 + 3.1 + 4.2) / 3, 12);
		expect(a.geometricMean).toBeCloseTo(Math.cbrt(det(eps)), 12);
	});

	it('an unrotated diagonal tensor gives the Cartesian axes with the sign convention', () => {
		const a = analyseTensor(diag([4, 2, 3]));
		expect(a.principalValues).toEqual([2, 3, 4]);
		expect(a.principalAxes[0].map(Math.abs)).toEqual([0, 1, 0]);
		expect(a.principalAxes[1].map(Math.abs)).toEqual([0, 0, 1]);
		expect(a.principalAxes[2].map(Math.abs)).toEqual([1, 0, 0]);
	});

	it('an isotropic tensor still yields an orthonormal set of axes', () => {
		const a = analyseTensor(diag([3, 3, 3]));
		expect(a.principalValues).toEqual([3, 3, 3]);
		expect(det(a.principalAxes)).toBeCloseTo(1, 12);
		expect(a.anisotropyRatio).toBe(1);
		expect(a.warnings).toEqual([]);
	});
});

describe('analyseTensor: scalar summaries on diag(2, 3, 6)', () => {
	// By hand: trace/3 = 11/3; harmonic 3/(1/2 + 1/3 + 1/6) = 3/1 = 3; geometric (2*3*6)^(1/3) = 36^(1/3)
	// = 3.301927...; anisotropy 6/2 = 3.
	const a = analyseTensor(diag([2, 3, 6]));
	it('trace/3 is the default scalar (common practice)', () => {
		expect(a.traceMean).toBeCloseTo(11 / 3, 14);
		expect(a.defaultEpsilon).toBe(a.traceMean);
		expect(a.defaultMethod).toBe('trace/3');
	});
	it('harmonic mean 3/tr(eps^-1) = 3', () => expect(a.harmonicMean).toBeCloseTo(3, 14));
	it('geometric mean det^(1/3) = 36^(1/3)', () => expect(a.geometricMean).toBeCloseTo(3.3019272488946263, 13));
	it('anisotropy max/min = 3, with a warning above the default 1.5', () => {
		expect(a.anisotropyRatio).toBeCloseTo(3, 14);
		expect(a.warnings.some((w) => w.startsWith('strongly anisotropic'))).toBe(true);
	});
	it('means are ordered harmonic <= geometric <= arithmetic (AM-GM-HM inequality)', () => {
		expect(a.harmonicMean).toBeLessThanOrEqual(a.geometricMean);
		expect(a.geometricMean).toBeLessThanOrEqual(a.traceMean);
	});
});

describe('analyseTensor: symmetry handling', () => {
	const base = [
		[3, 0.2, 0.1],
		[0.2, 3.5, 0],
		[0.1, 0, 4]
	];
	function withXy(xy: number, yx: number) {
		return base.map((r, i) => r.map((v, j) => (i === 0 && j === 1 ? xy : i === 1 && j === 0 ? yx : v)));
	}

	it('exactly symmetric: no symmetrisation, no warning', () => {
		const a = analyseTensor(base);
		expect(a.symmetrised).toBe(false);
		expect(a.asymmetryRel).toBe(0);
		expect(a.warnings).toEqual([]);
	});

	it('noise below 1e-3 (relative to the largest entry) is symmetrised silently', () => {
		const a = analyseTensor(withXy(0.2, 0.2 + 0.002)); // 0.002 / 4 = 5e-4
		expect(a.symmetrised).toBe(true);
		expect(a.asymmetryRel).toBeCloseTo(5e-4, 12);
		expect(a.symmetric[0][1]).toBeCloseTo(0.201, 14);
		expect(a.symmetric[1][0]).toBe(a.symmetric[0][1]);
		expect(a.warnings).toEqual([]);
	});

	it('between 1e-3 and 0.05: symmetrised with a warning', () => {
		const a = analyseTensor(withXy(0.2, 0.24)); // 0.04 / 4 = 1%
		expect(a.symmetrised).toBe(true);
		expect(a.symmetric[0][1]).toBeCloseTo(0.22, 14);
		expect(a.warnings).toEqual([
			'tensor was symmetrised: max|m_ij - m_ji| is 1% of the largest entry (warning above 0.1%)'
		]);
	});

	it('beyond 0.05: refused with a DielectricError on field "tensor"', () => {
		const m = withXy(0.2, 0.6); // 0.4 / 4 = 10%
		expect(() => analyseTensor(m)).toThrow(DielectricError);
		expect(() => analyseTensor(m)).toThrow(
			'tensor is not symmetric: max|m_ij - m_ji| is 10% of the largest entry (limit 5%); check the row/column layout and the source'
		);
	});

	it('tolerances are options', () => {
		const m = withXy(0.2, 0.6);
		expect(analyseTensor(m, { asymmetryMaxRel: 0.2 }).symmetric[0][1]).toBeCloseTo(0.4, 14);
		expect(analyseTensor(withXy(0.2, 0.24), { asymmetryWarnRel: 0.02 }).warnings).toEqual([]);
		expect(() => analyseTensor(base, { asymmetryWarnRel: 0.1, asymmetryMaxRel: 0.05 })).toThrow(
			'asymmetryWarnRel (0.1) must not exceed asymmetryMaxRel (0.05)'
		);
		expect(() => analyseTensor(base, { asymmetryMaxRel: -1 })).toThrow('asymmetryMaxRel must be a finite number >= 0, got -1');
	});

	it('does not mutate its input', () => {
		const m = withXy(0.2, 0.24);
		const copy = m.map((r) => [...r]);
		analyseTensor(m);
		expect(m).toEqual(copy);
	});
});

describe('analyseTensor: refusals and warnings', () => {
	it('refuses a tensor that is not positive definite', () => {
		const indefinite = [
			[1, 2, 0],
			[2, 1, 0],
			[0, 0, 3]
		]; // eigenvalues -1, 3, 3
		expect(() => analyseTensor(indefinite)).toThrow(
			'tensor is not positive definite: smallest principal value is -1; a dielectric tensor must have all principal values > 0 (physically >= 1)'
		);
		expect(() => analyseTensor(diag([0, 0, 0]))).toThrow('tensor is all zeros: not positive definite');
	});

	it('warns (does not refuse) when values are below 1', () => {
		const a = analyseTensor(diag([0.8, 2, 2]));
		expect(a.warnings[0]).toBe(
			'diagonal xx = 0.8; principal value(s) 0.8 below 1: an electronic dielectric constant of an insulator is >= 1; ' +
				'check that the tensor is eps (not chi = eps - 1) and its units'
		);
	});

	it('refuses wrong shapes and non-finite entries', () => {
		expect(() => analyseTensor([[1, 0], [0, 1]])).toThrow('tensor must be a 3x3 matrix');
		expect(() => analyseTensor([[1, 0, 0], [0, Infinity, 0], [0, 0, 1]])).toThrow(
			'tensor entry yy must be a finite number, got Infinity'
		);
	});
});

describe('analyseTensor: eigen-pairs satisfy eps v = lambda v', () => {
	it('residual |eps v - lambda v| < 1e-9 for 300 random rotated tensors, a third of them with a double value', () => {
		// Definition of an eigen-pair (textbook linear algebra); deterministic LCG (Numerical Recipes constants).
		let seed = 7;
		const rand = () => ((seed = (1664525 * seed + 1013904223) % 4294967296) / 4294967296);
		for (let k = 0; k < 300; k++) {
			const l = k % 3 === 0 ? [3, 3, 2 + rand()] : [1 + 4 * rand(), 1 + 4 * rand(), 1 + 4 * rand()];
			const R = rotation(2 * Math.PI * rand(), 2 * Math.PI * rand(), 2 * Math.PI * rand());
			const m = mul(mul(R, diag(l)), transpose(R));
			const a = analyseTensor(m);
			a.principalAxes.forEach((axis, t) => {
				const mv = [0, 1, 2].map((i) => dot(m[i], axis));
				expect(Math.hypot(...mv.map((c, i) => c - a.principalValues[t] * axis[i]))).toBeLessThan(1e-9);
			});
			expect(det(a.principalAxes)).toBeCloseTo(1, 10);
		}
	});
});
