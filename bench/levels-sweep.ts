// Benchmark (not a test): a 1,000-value epsilon sweep with both quick models (Born sphere plus a
// substrate image-charge term) and one solid-state estimate per value, as the levels page recomputes on
// every keystroke; baseline in the same run: a plain loop computing 1/epsilon for the same values.
// Target: well within one frame (< 16 ms). Run with `npm run bench`.
import { time } from './timing';
import { epsilonSweep, solidStateEstimate } from '../src/lib/science/screening';

const N = 1000;
const epsilons = Array.from({ length: N }, (_, i) => 1 + (5 * i) / (N - 1));
const input = { alpha: 0.2, ipGasEv: 6.55, eaGasEv: 1.35, radiusA: 4.3, epsilons, imageCharge: { distanceA: 3.5, substrateEpsilon: 'metal' as const } };

let sink = 0;
const base = time(() => {
	for (const e of epsilons) sink += 1 / e - 0.2;
});
const sweep = time(() => epsilonSweep(input));
const estimates = time(() => {
	for (const e of epsilons) sink += solidStateEstimate({ alpha: 0.2, gammaBohrInv: 0.2, ipGasEv: 6.55, eaGasEv: 1.35, epsilon: e, cavity: { volumePerMoleculeA3: 338 }, substrate: { distanceA: 3.5, epsilon: 'metal' } }).gapSolidEv;
});
console.log(`epsilon sweep, ${N} values (node ${process.version}):`);
console.log(`  baseline loop (1/epsilon - alpha):          ${(base.medianMs * 1000).toFixed(1)} µs median of ${base.runs} runs`);
console.log(`  epsilonSweep, Born + image charge:          ${sweep.medianMs.toFixed(3)} ms median of ${sweep.runs} runs (${(sweep.medianMs / base.medianMs).toFixed(0)} x baseline)`);
console.log(`  ${N} x solidStateEstimate (page's per-value path): ${estimates.medianMs.toFixed(3)} ms median of ${estimates.runs} runs`);
if (sink === 42) console.log('');
