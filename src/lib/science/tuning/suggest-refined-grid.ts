/**
 * A finer gamma grid around gamma* for a rerun: gamma* rounded to the step, plus and minus
 * `halfWidthBohrInv` in steps of `stepBohrInv` (defaults 0.05 and 0.01 bohr^-1, common practice for a
 * second pass), keeping only gamma > 0 (and >= minGammaBohrInv) and, by default, leaving out gammas the
 * scan already has (non-excluded points). Ascending, rounded to the step's decimals.
 */
import type { OptimalGammaResult } from './optimal-gamma';
import { TuningInputError } from './tuning-input-error';
import type { ScanPoint } from './types';
import { validatedScanPoints } from './validated-scan-points';

export interface SuggestRefinedGridOptions {
	/** Half width of the refined window, bohr^-1 (default 0.05). */
	halfWidthBohrInv?: number;
	/** Grid step, bohr^-1 (default 0.01). */
	stepBohrInv?: number;
	/** Smallest gamma to propose, bohr^-1 (default: any value > 0). */
	minGammaBohrInv?: number;
	/** Leave out gammas already in the scan (default true). */
	skipExisting?: boolean;
}

export function suggestRefinedGrid(
	result: Pick<OptimalGammaResult, 'optimum'>,
	points: readonly ScanPoint[],
	options: SuggestRefinedGridOptions = {}
): number[] {
	const half = options.halfWidthBohrInv ?? 0.05;
	const step = options.stepBohrInv ?? 0.01;
	const minGamma = options.minGammaBohrInv ?? 0;
	const skipExisting = options.skipExisting ?? true;
	if (!(Number.isFinite(half) && half > 0))
		throw new TuningInputError(`halfWidthBohrInv must be a positive number, got ${half}`, 'halfWidthBohrInv');
	if (!(Number.isFinite(step) && step > 0 && step <= half))
		throw new TuningInputError(`stepBohrInv must be positive and at most halfWidthBohrInv, got ${step}`, 'stepBohrInv');
	if (!(Number.isFinite(minGamma) && minGamma >= 0))
		throw new TuningInputError(`minGammaBohrInv must be >= 0, got ${minGamma}`, 'minGammaBohrInv');
	const gStar = result?.optimum?.gammaBohrInv;
	if (typeof gStar !== 'number' || !Number.isFinite(gStar))
		throw new TuningInputError('the result has no optimum to refine around (see its error diagnostics)', 'result');
	const valid = validatedScanPoints(points);

	// Decimals enough to show the step exactly (0.01 -> 2, 0.005 -> 3), used to remove round-off.
	const decimals = Math.min(12, Math.max(0, Math.ceil(-Math.log10(step) - 1e-9)) + 1);
	const round = (v: number): number => Number(v.toFixed(decimals));
	const centre = Math.round(gStar / step) * step;
	const n = Math.floor(half / step + 1e-9);
	const existing = valid.filter((p) => !p.excluded).map((p) => p.gammaBohrInv);
	const out: number[] = [];
	for (let k = -n; k <= n; k++) {
		const g = round(centre + k * step);
		if (!(g > 0) || g < minGamma) continue;
		if (skipExisting && existing.some((e) => Math.abs(e - g) < step * 1e-3)) continue;
		out.push(g);
	}
	return out;
}
