/**
 * The scan points, checked: an array of objects with a finite, non-negative gamma, every energy a finite
 * number or null/undefined, `excluded` a boolean or undefined. Returns the same array (typed); throws
 * TuningInputError naming the row (0-based index) and field otherwise. Never mutates the input.
 */
import { TuningInputError } from './tuning-input-error';
import { SCAN_ENERGY_FIELDS, type ScanPoint } from './types';

export interface ValidatedScanPointsOptions {
	/** Name of the argument in messages (default 'points'). */
	name?: string;
}

export function validatedScanPoints(points: unknown, options: ValidatedScanPointsOptions = {}): readonly ScanPoint[] {
	const name = options.name ?? 'points';
	if (!Array.isArray(points)) throw new TuningInputError(`${name} must be an array of scan points`, name);
	points.forEach((p: unknown, row: number) => {
		if (typeof p !== 'object' || p === null)
			throw new TuningInputError(`${name}[${row}] must be an object`, name, row);
		const point = p as Record<string, unknown>;
		const g = point.gammaBohrInv;
		if (typeof g !== 'number' || !Number.isFinite(g))
			throw new TuningInputError(`${name}[${row}].gammaBohrInv must be a finite number, got ${String(g)}`, 'gammaBohrInv', row);
		if (g < 0)
			throw new TuningInputError(`${name}[${row}].gammaBohrInv must be >= 0, got ${g}`, 'gammaBohrInv', row);
		for (const field of SCAN_ENERGY_FIELDS) {
			const v = point[field];
			if (v === null || v === undefined) continue;
			if (typeof v !== 'number' || !Number.isFinite(v))
				throw new TuningInputError(
					`${name}[${row}].${field} must be a finite number or null, got ${String(v)}`,
					field,
					row
				);
		}
		if (point.excluded !== undefined && typeof point.excluded !== 'boolean')
			throw new TuningInputError(`${name}[${row}].excluded must be true, false or absent`, 'excluded', row);
	});
	return points as readonly ScanPoint[];
}
