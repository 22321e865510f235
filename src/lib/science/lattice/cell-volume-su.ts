import { assertCell, cosDeg } from './cell-trig';
import type { UnitCell } from './types';

/** Standard uncertainties of the cell parameters (Å and degrees); missing entries count as exact. */
export type UnitCellSu = Partial<UnitCell>;

/**
 * Standard uncertainty (Å³) of the cell volume from the standard uncertainties of the cell
 * parameters, by first-order propagation for uncorrelated parameters:
 * σ_V² = Σ (∂V/∂p · σ_p)², with ∂V/∂a = V/a (same for b, c) and
 * ∂V/∂α = abc · sinα (cosα - cosβ cosγ) / sqrt(1 - cos²α - cos²β - cos²γ + 2 cosα cosβ cosγ) per radian
 * (cyclic for β, γ). Throws RangeError for a non-physical cell or a negative/non-finite uncertainty.
 */
export function cellVolumeSuA3(cell: UnitCell, su: UnitCellSu): number {
	const factor = assertCell(cell);
	for (const [key, v] of Object.entries(su)) {
		if (v !== undefined && (typeof v !== 'number' || !Number.isFinite(v) || v < 0)) {
			throw new RangeError(`standard uncertainty of ${key} must be a finite number >= 0, got ${v}`);
		}
	}
	const { a, b, c } = cell;
	const root = Math.sqrt(factor);
	const volume = a * b * c * root;
	const rad = Math.PI / 180;
	const ca = cosDeg(cell.alphaDeg);
	const cb = cosDeg(cell.betaDeg);
	const cg = cosDeg(cell.gammaDeg);
	const sin = (deg: number) => Math.sin(deg * rad);
	const dAlpha = ((a * b * c) / root) * sin(cell.alphaDeg) * (ca - cb * cg);
	const dBeta = ((a * b * c) / root) * sin(cell.betaDeg) * (cb - ca * cg);
	const dGamma = ((a * b * c) / root) * sin(cell.gammaDeg) * (cg - ca * cb);
	const terms = [
		(volume / a) * (su.a ?? 0),
		(volume / b) * (su.b ?? 0),
		(volume / c) * (su.c ?? 0),
		dAlpha * (su.alphaDeg ?? 0) * rad,
		dBeta * (su.betaDeg ?? 0) * rad,
		dGamma * (su.gammaDeg ?? 0) * rad
	];
	return Math.sqrt(terms.reduce((s, t) => s + t * t, 0));
}
