// Benchmark (not a test): run bundles of 100 gamma values x 3 states (per-state layout) for both
// engines, NWChem and Psi4, planned (decks, scripts, README, manifest with SHA-256 of every file)
// and zipped, as the bundle page does per download. Baseline in the same run: joining the same
// number of deck texts into one string (the least work that yields those bytes).
// Target (issue 6): both engines together < 200 ms. Run with `npm run bench`.
import { performance } from 'node:perf_hooks';
import { buildBundle, planBundle } from '../src/lib/formats/bundle';
import { so2BundleInput } from '../src/lib/formats/bundle/so2.testdata';

const gammas = Array.from({ length: 100 }, (_, i) => Number((0.1 + 0.004 * i).toFixed(4)));
const inputs = [
	so2BundleInput({ tuning: { gammasBohrInv: gammas, layout: 'per-state' }, screened: null }),
	so2BundleInput({ engine: 'psi4', settings: { basis: 'aug-cc-pvdz' }, tuning: { gammasBohrInv: gammas, layout: 'per-state' }, screened: null })
];

/** Median wall time of an async `fn` over at least `minMs` and 10 runs, after a warm-up. */
async function timeAsync(fn: () => Promise<unknown>, minMs = 2000): Promise<{ medianMs: number; runs: number }> {
	for (let i = 0; i < 2; i++) await fn();
	const samples: number[] = [];
	const t0 = performance.now();
	while (performance.now() - t0 < minMs || samples.length < 10) {
		const t = performance.now();
		await fn();
		samples.push(performance.now() - t);
	}
	samples.sort((a, b) => a - b);
	return { medianMs: samples[Math.floor(samples.length / 2)], runs: samples.length };
}

const plans = await Promise.all(inputs.map((i) => planBundle(i)));
const decks = plans.flatMap((p) => p.files.filter((f) => f.role === 'deck').map((f) => f.text));
let sink = 0;
const base = await timeAsync(async () => {
	sink += decks.join('').length;
});
const plan = await timeAsync(() => Promise.all(inputs.map((i) => planBundle(i))));
const build = await timeAsync(() => Promise.all(inputs.map((i) => buildBundle(i))));
console.log(`run bundles, 100 gammas x 3 states x 2 engines = ${decks.length} decks (node ${process.version}):`);
console.log(`  baseline (join ${decks.length} deck texts):       ${base.medianMs.toFixed(3)} ms median of ${base.runs} runs`);
console.log(`  planBundle, both engines (texts + SHA-256): ${plan.medianMs.toFixed(1)} ms median of ${plan.runs} runs`);
console.log(`  buildBundle, both engines (plan + zip):     ${build.medianMs.toFixed(1)} ms median of ${build.runs} runs (target < 200 ms)`);
if (sink === 42) console.log('');
