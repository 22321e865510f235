/**
 * Dielectric constant along a direction: eps_n = n^T eps n for a unit vector n (science notes, section 4).
 * Only the symmetric part of eps contributes. Pass the analysed (symmetrised, positive-definite) tensor.
 */
import { DielectricError } from './dielectric-error';
import { type Matrix3Input, checkedMatrix3, checkedVec3, norm } from './matrix3';

/** n^T eps n with n normalised first; `direction` is a Cartesian vector (any non-zero length). */
export function epsilonAlong(m: Matrix3Input, direction: readonly number[]): number {
	const eps = checkedMatrix3(m, 'tensor');
	const d = checkedVec3(direction, 'direction');
	const length = norm(d);
	if (!(length > 0)) throw new DielectricError('direction', 'direction must be a non-zero vector');
	const n = d.map((x) => x / length);
	let sum = 0;
	for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) sum += n[i] * eps[i][j] * n[j];
	return sum;
}
