/**
 * Cartesian unit vector of a lattice direction [uvw]: r = u a + v b + w c, with a, b, c the rows of the
 * cell matrix (Cartesian lattice vectors in Å, as built from the cell parameters).
 */
import { DielectricError } from './dielectric-error';
import { type Matrix3Input, type Vec3, checkedMatrix3, checkedVec3, det3, norm } from './matrix3';

/** Unit Cartesian vector along the direct-lattice direction [u v w]. */
export function directionFromUvw(cellMatrix: Matrix3Input, uvw: readonly number[]): Vec3 {
	const cell = checkedMatrix3(cellMatrix, 'cellMatrix');
	const [u, v, w] = checkedVec3(uvw, 'uvw');
	const rowNorms = cell.map(norm);
	if (rowNorms.some((n) => n === 0) || Math.abs(det3(cell)) <= 1e-10 * rowNorms[0] * rowNorms[1] * rowNorms[2]) {
		throw new DielectricError('cellMatrix', 'cell matrix is singular: the lattice vectors must be linearly independent');
	}
	if (u === 0 && v === 0 && w === 0) throw new DielectricError('uvw', 'direction [0 0 0] is not a direction');
	const r = [0, 1, 2].map((k) => u * cell[0][k] + v * cell[1][k] + w * cell[2][k]);
	const length = norm(r);
	return [r[0] / length, r[1] / length, r[2] / length];
}
