/**
 * Cartesian unit normal of the lattice plane (hkl): n ∝ h a* + k b* + l c*, with the reciprocal vectors
 * a* = (b × c)/V, b* = (c × a)/V, c* = (a × b)/V (textbook crystallography, without the 2 pi factor).
 * Useful for films: the out-of-plane direction of a film grown with (hkl) parallel to the substrate.
 * Rows of the cell matrix are the Cartesian lattice vectors a, b, c in Å.
 */
import { DielectricError } from './dielectric-error';
import { type Matrix3Input, type Vec3, checkedMatrix3, checkedVec3, cross, det3, norm } from './matrix3';

/** Unit Cartesian normal of the plane (h k l). */
export function normalFromHkl(cellMatrix: Matrix3Input, hkl: readonly number[]): Vec3 {
	const cell = checkedMatrix3(cellMatrix, 'cellMatrix');
	const [h, k, l] = checkedVec3(hkl, 'hkl');
	const rowNorms = cell.map(norm);
	const volume = det3(cell);
	if (rowNorms.some((n) => n === 0) || Math.abs(volume) <= 1e-10 * rowNorms[0] * rowNorms[1] * rowNorms[2]) {
		throw new DielectricError('cellMatrix', 'cell matrix is singular: the lattice vectors must be linearly independent');
	}
	if (h === 0 && k === 0 && l === 0) throw new DielectricError('hkl', 'plane (0 0 0) does not exist');
	const [a, b, c] = cell;
	const aStar = cross(b, c);
	const bStar = cross(c, a);
	const cStar = cross(a, b);
	const r = [0, 1, 2].map((i) => (h * aStar[i] + k * bStar[i] + l * cStar[i]) / volume);
	const length = norm(r);
	return [r[0] / length, r[1] / length, r[2] / length];
}
