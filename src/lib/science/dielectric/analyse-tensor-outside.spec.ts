import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { analyseTensor } from './analyse-tensor';

// Outside checks of the eigen-decomposition behind analyseTensor (which uses mathjs):
// 1. a symmetric matrix with closed-form eigenvalues (tridiagonal Toeplitz matrix, textbook linear algebra:
//    lambda_k = a + 2 b cos(k pi / (n + 1)), k = 1..n);
// 2. a second, independent linear-algebra package from the npm registry, ml-matrix 6.15.1 (its
//    EigenvalueDecomposition is a port of JAMA's symmetric Householder tridiagonalisation + QL), test-only;
// 3. the invariants of a 3x3 matrix (trace = sum of eigenvalues, det = product, second invariant
//    (tr(A)^2 - tr(A^2))/2 = sum of pairwise products) on random symmetric positive-definite tensors.

function det(m: number[][]): number {
	return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
}
const mul = (a: number[][], b: number[][]) => a.map((_, i) => [0, 1, 2].map((j) => a[i][0] * b[0][j] + a[i][1] * b[1][j] + a[i][2] * b[2][j]));
const transpose = (a: number[][]) => [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[j][i]));

/** Deterministic pseudo-random numbers (LCG, Numerical Recipes constants). */
function lcg(seed: number) {
	let s = seed;
	return () => (s = (1664525 * s + 1013904223) % 4294967296) / 4294967296;
}

/** A random SPD tensor B B^T + c I with entries of the size of molecular-crystal dielectric tensors. */
function randomSpd(rand: () => number): number[][] {
	const b = [0, 1, 2].map(() => [0, 1, 2].map(() => 2 * rand() - 1));
	const bbt = mul(b, transpose(b));
	const c = 1 + 3 * rand();
	return bbt.map((r, i) => r.map((v, j) => v + (i === j ? c : 0)));
}

describe('analyseTensor against outside references', () => {
	it('closed form: tridiagonal Toeplitz [[3,0.5,0],[0.5,3,0.5],[0,0.5,3]] has 3 - 0.5 sqrt 2, 3, 3 + 0.5 sqrt 2 (1e-13)', () => {
		const a = analyseTensor([
			[3, 0.5, 0],
			[0.5, 3, 0.5],
			[0, 0.5, 3]
		]);
		// lambda_k = 3 + 2 (0.5) cos(k pi / 4): k = 3, 2, 1 in ascending order.
		const expected = [3 + Math.cos((3 * Math.PI) / 4), 3 + Math.cos(Math.PI / 2), 3 + Math.cos(Math.PI / 4)];
		a.principalValues.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 13));
		// Eigenvector of the middle value is (1, 0, -1)/sqrt 2 (closed form, sin(j k pi / 4) with k = 2).
		expect(Math.abs(a.principalAxes[1][0])).toBeCloseTo(Math.SQRT1_2, 12);
		expect(a.principalAxes[1][1]).toBeCloseTo(0, 12);
		expect(a.principalAxes[1][0] * a.principalAxes[1][2]).toBeCloseTo(-0.5, 12);
	});

	it('agrees with ml-matrix EigenvalueDecomposition on 200 random SPD tensors (values 1e-11, axes |cos| 1e-8)', () => {
		const rand = lcg(2026);
		for (let k = 0; k < 200; k++) {
			const m = randomSpd(rand);
			const ours = analyseTensor(m);
			const theirs = new EigenvalueDecomposition(new Matrix(m), { assumeSymmetric: true });
			const order = theirs.realEigenvalues.map((v, i) => [v, i]).sort((x, y) => x[0] - y[0]);
			const vectors = theirs.eigenvectorMatrix;
			order.forEach(([value, col], i) => {
				expect(Math.abs(ours.principalValues[i] - value)).toBeLessThan(1e-11);
				const v = vectors.getColumn(col);
				const n = Math.hypot(...v);
				const cos = (ours.principalAxes[i][0] * v[0] + ours.principalAxes[i][1] * v[1] + ours.principalAxes[i][2] * v[2]) / n;
				// Well separated values only: degenerate axes are not unique.
				const gap = Math.min(...order.filter((_, j) => j !== i).map(([w]) => Math.abs(w - value)));
				if (gap > 1e-3) expect(Math.abs(Math.abs(cos) - 1)).toBeLessThan(1e-8);
			});
			expect(theirs.imaginaryEigenvalues.every((x) => x === 0)).toBe(true);
		}
	});

	it('invariants on 500 random SPD tensors: trace, second invariant and determinant (relative 1e-12)', () => {
		const rand = lcg(17);
		for (let k = 0; k < 500; k++) {
			const m = randomSpd(rand);
			const [l1, l2, l3] = analyseTensor(m).principalValues;
			const trace = m[0][0] + m[1][1] + m[2][2];
			const m2 = mul(m, m);
			const second = (trace * trace - (m2[0][0] + m2[1][1] + m2[2][2])) / 2;
			expect(Math.abs((l1 + l2 + l3) / trace - 1)).toBeLessThan(1e-12);
			expect(Math.abs((l1 * l2 + l1 * l3 + l2 * l3) / second - 1)).toBeLessThan(1e-12);
			expect(Math.abs((l1 * l2 * l3) / det(m) - 1)).toBeLessThan(1e-11);
			expect(l1).toBeGreaterThan(0);
		}
	});
});
