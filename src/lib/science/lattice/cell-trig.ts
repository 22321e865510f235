import type { UnitCell } from './types';

const SNAP = [0, 0.5, -0.5, 1, -1];

/** cos of an angle in degrees, snapped to 0, ±1/2, ±1 when within 1e-15 (so 90° gives exactly 0). */
export function cosDeg(deg: number): number {
	const c = Math.cos((deg * Math.PI) / 180);
	for (const s of SNAP) if (Math.abs(c - s) < 1e-15) return s;
	return c;
}

/** sin of an angle in degrees, snapped like `cosDeg`. */
export function sinDeg(deg: number): number {
	const s = Math.sin((deg * Math.PI) / 180);
	for (const t of SNAP) if (Math.abs(s - t) < 1e-15) return t;
	return s;
}

/**
 * Checks a cell and returns the dimensionless volume factor
 * 1 - cos²α - cos²β - cos²γ + 2 cosα cosβ cosγ (= (V/abc)²).
 * Throws RangeError for non-finite or non-positive lengths, angles outside (0°, 180°), or angles
 * that cannot close a cell (factor <= 0).
 */
export function assertCell(cell: UnitCell): number {
	if (cell === null || typeof cell !== 'object') throw new RangeError('cell must be an object with a, b, c, alphaDeg, betaDeg, gammaDeg');
	for (const key of ['a', 'b', 'c'] as const) {
		const v = cell[key];
		if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
			throw new RangeError(`cell length ${key} must be a finite number > 0 Å, got ${v}`);
		}
	}
	for (const key of ['alphaDeg', 'betaDeg', 'gammaDeg'] as const) {
		const v = cell[key];
		if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0 || v >= 180) {
			throw new RangeError(`cell angle ${key} must be a finite number strictly between 0 and 180 degrees, got ${v}`);
		}
	}
	const ca = cosDeg(cell.alphaDeg);
	const cb = cosDeg(cell.betaDeg);
	const cg = cosDeg(cell.gammaDeg);
	const factor = 1 - ca * ca - cb * cb - cg * cg + 2 * ca * cb * cg;
	if (!(factor > 0)) {
		throw new RangeError(
			`cell angles alpha=${cell.alphaDeg}, beta=${cell.betaDeg}, gamma=${cell.gammaDeg} degrees do not form a cell ` +
				`(1 - cos²α - cos²β - cos²γ + 2cosα·cosβ·cosγ = ${factor.toPrecision(4)} <= 0)`
		);
	}
	return factor;
}
