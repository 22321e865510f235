// The full gas-phase tuning analysis (gamma*, crossings, levels, diagnostics, chart curves, refined
// grid, input fingerprint) of a 1,000-point synthetic scan, against a baseline in the same run: one plain
// loop over the points computing the J terms. Target: well under one frame (< 5 ms) on the browser's
// main thread.
import { figure, time, type MicroFigure } from '../timing';
import { tuningAnalysis } from '../../src/lib/science/tuning/tuning-analysis';
import { syntheticScan } from '../../src/lib/science/tuning/synthetic-scan.testdata';

export function tuningBench(): MicroFigure[] {
	const N = 1000;
	const gammas = Array.from({ length: N }, (_, i) => 0.05 + (0.45 * i) / (N - 1));
	const points = syntheticScan(gammas); // synthetic model data (see synthetic-scan.testdata.ts), not engine output
	const baseline = () => {
		let s = 0;
		for (const p of points) s += Math.abs(p.homoNeutralHartree! + p.eCationHartree! - p.eNeutralHartree!) + Math.abs(p.homoAnionHartree! + p.eNeutralHartree! - p.eAnionHartree!);
		return s;
	};
	const a = tuningAnalysis(points);
	if (!a.result.optimum || Math.abs(a.result.optimum.gammaBohrInv - 0.213) > 1e-4) throw new Error('benchmark scan gave a wrong gamma*');
	const base = { name: 'plain loop over the J terms', ...time(baseline) };
	return [
		figure(`tuning analysis, ${N} points, abs-sum (all diagnostics)`, time(() => tuningAnalysis(points)), { baseline: base, targetMs: 5 }),
		figure(`tuning analysis, ${N} points, square-sum`, time(() => tuningAnalysis(points, { objective: 'square-sum' })), { baseline: base, targetMs: 5 })
	];
}
