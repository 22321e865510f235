import { cellMatrix } from './cell-matrix';
import type { Matrix3, UnitCell, Vec3 } from './types';

function isMatrix(m: UnitCell | Matrix3): m is Matrix3 {
	return Array.isArray(m);
}

function assertVec(v: Vec3, what: string): void {
	if (!Array.isArray(v) || v.length !== 3 || !v.every((x) => typeof x === 'number' && Number.isFinite(x))) {
		throw new RangeError(`${what} must be three finite numbers, got ${JSON.stringify(v)}`);
	}
}

/** Resolves a cell or a cell matrix (rows = lattice vectors, Å) to a checked matrix. */
export function resolveCellMatrix(cellOrMatrix: UnitCell | Matrix3): Matrix3 {
	if (!isMatrix(cellOrMatrix)) return cellMatrix(cellOrMatrix);
	if (cellOrMatrix.length !== 3) throw new RangeError('cell matrix must have three rows');
	cellOrMatrix.forEach((row, i) => assertVec(row, `cell matrix row ${i + 1}`));
	return cellOrMatrix;
}

/**
 * Cartesian position (Å) of a fractional coordinate: r = f1·a + f2·b + f3·c, with the lattice
 * vectors from `cellMatrix` (or a matrix given directly, rows = lattice vectors).
 */
export function fractionalToCartesian(fractional: Vec3, cellOrMatrix: UnitCell | Matrix3): Vec3 {
	assertVec(fractional, 'fractional coordinate');
	const m = resolveCellMatrix(cellOrMatrix);
	const [u, v, w] = fractional;
	return [
		u * m[0][0] + v * m[1][0] + w * m[2][0],
		u * m[0][1] + v * m[1][1] + w * m[2][1],
		u * m[0][2] + v * m[1][2] + w * m[2][2]
	];
}
