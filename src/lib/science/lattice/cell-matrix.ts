import { assertCell, cosDeg, sinDeg } from './cell-trig';
import type { Matrix3, UnitCell } from './types';

/**
 * Lattice vectors as matrix rows (Å), in the standard crystallographic orientation:
 * a along x, b in the xy plane, c completing a right-handed set:
 *   a = (a, 0, 0)
 *   b = (b cosγ, b sinγ, 0)
 *   c = (c cosβ, c (cosα - cosβ cosγ)/sinγ, V/(a b sinγ))
 * Throws RangeError for non-physical cells.
 */
export function cellMatrix(cell: UnitCell): Matrix3 {
	const factor = assertCell(cell);
	const { a, b, c } = cell;
	const ca = cosDeg(cell.alphaDeg);
	const cb = cosDeg(cell.betaDeg);
	const cg = cosDeg(cell.gammaDeg);
	const sg = sinDeg(cell.gammaDeg);
	const volume = a * b * c * Math.sqrt(factor);
	return [
		[a, 0, 0],
		[b * cg, b * sg, 0],
		[c * cb, (c * (ca - cb * cg)) / sg, volume / (a * b * sg)]
	];
}
