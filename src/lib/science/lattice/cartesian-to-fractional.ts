import { resolveCellMatrix } from './fractional-to-cartesian';
import type { Matrix3, UnitCell, Vec3 } from './types';

/**
 * Fractional coordinate of a Cartesian position (Å): solves r = f1·a + f2·b + f3·c.
 * Throws RangeError for a singular (zero-volume) matrix or non-finite input.
 */
export function cartesianToFractional(cartesian: Vec3, cellOrMatrix: UnitCell | Matrix3): Vec3 {
	if (!Array.isArray(cartesian) || cartesian.length !== 3 || !cartesian.every((x) => Number.isFinite(x))) {
		throw new RangeError(`cartesian position must be three finite numbers, got ${JSON.stringify(cartesian)}`);
	}
	const [a, b, c] = resolveCellMatrix(cellOrMatrix);
	// r = M^T f with M rows a, b, c; solve by Cramer's rule on the columns a, b, c.
	const det =
		a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);
	if (!Number.isFinite(det) || Math.abs(det) < 1e-12) {
		throw new RangeError(`cell matrix is singular (volume ${det} Å³)`);
	}
	const [x, y, z] = cartesian;
	const cross = (p: Vec3, q: Vec3): Vec3 => [p[1] * q[2] - p[2] * q[1], p[2] * q[0] - p[0] * q[2], p[0] * q[1] - p[1] * q[0]];
	const dot = (p: Vec3, q: Vec3) => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
	const r: Vec3 = [x, y, z];
	// Reciprocal-vector form: f1 = r·(b×c)/V, f2 = r·(c×a)/V, f3 = r·(a×b)/V.
	return [dot(r, cross(b, c)) / det, dot(r, cross(c, a)) / det, dot(r, cross(a, b)) / det];
}
