// Benchmark (not a test): the full gas-phase tuning analysis (gamma*, crossings, levels, diagnostics,
// chart curves, refined grid, input fingerprint) of a 1,000-point synthetic scan, against a baseline in
// the same run: one plain loop over the points computing the J terms. Target: well under one frame
// (< 5 ms) on the browser's main thread. Run with `npm run bench`.
import { time } from './timing';
import { tuningAnalysis } from '../src/lib/science/tuning/tuning-analysis';
import { syntheticScan } from '../src/lib/science/tuning/synthetic-scan.testdata';

const N = 1000;
const gammas = Array.from({ length: N }, (_, i) => 0.05 + (0.45 * i) / (N - 1));
const points = syntheticScan(gammas); // synthetic model data (see synthetic-scan.testdata.ts), not engine output

function baseline(): number {
	let s = 0;
	for (const p of points) s += Math.abs(p.homoNeutralHartree! + p.eCationHartree! - p.eNeutralHartree!) + Math.abs(p.homoAnionHartree! + p.eNeutralHartree! - p.eAnionHartree!);
	return s;
}

const a = tuningAnalysis(points);
if (!a.result.optimum || Math.abs(a.result.optimum.gammaBohrInv - 0.213) > 1e-4) throw new Error('benchmark scan gave a wrong gamma*');
const base = time(baseline);
const full = time(() => tuningAnalysis(points));
const objectiveOnly = time(() => tuningAnalysis(points, { objective: 'square-sum' }));
console.log(`tuning analysis, ${N}-point scan (node ${process.version}):`);
console.log(`  baseline loop over the points (J terms only): ${(base.medianMs * 1000).toFixed(1)} µs median of ${base.runs} runs`);
console.log(`  full analysis, abs-sum:                       ${full.medianMs.toFixed(3)} ms median of ${full.runs} runs (${(full.medianMs / base.medianMs).toFixed(0)} x baseline)`);
console.log(`  full analysis, square-sum:                    ${objectiveOnly.medianMs.toFixed(3)} ms median of ${objectiveOnly.runs} runs`);
console.log(`  target < 5 ms: ${full.medianMs < 5 ? 'met' : 'NOT met'}`);
