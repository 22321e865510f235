import { assertCell } from './cell-trig';
import type { UnitCell } from './types';

/**
 * Unit-cell volume in Å³: V = abc·sqrt(1 - cos²α - cos²β - cos²γ + 2 cosα cosβ cosγ)
 * (science notes sec. 4). Throws RangeError for non-physical lengths or angles.
 */
export function cellVolumeA3(cell: UnitCell): number {
	const factor = assertCell(cell);
	return cell.a * cell.b * cell.c * Math.sqrt(factor);
}
