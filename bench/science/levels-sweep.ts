// A 1,000-value epsilon sweep with both quick models (Born sphere plus a substrate image-charge term)
// and one solid-state estimate per value, as the levels page recomputes on every keystroke; baseline in
// the same run: a plain loop computing 1/epsilon for the same values. Target: within one frame (< 16 ms).
import { figure, time, type MicroFigure } from '../timing';
import { epsilonSweep, solidStateEstimate } from '../../src/lib/science/screening';

export function sweepBench(): MicroFigure[] {
	const N = 1000;
	const epsilons = Array.from({ length: N }, (_, i) => 1 + (5 * i) / (N - 1));
	const input = { alpha: 0.2, ipGasEv: 6.55, eaGasEv: 1.35, radiusA: 4.3, epsilons, imageCharge: { distanceA: 3.5, substrateEpsilon: 'metal' as const } };
	let sink = 0;
	const base = {
		name: 'plain loop, 1/epsilon - alpha',
		...time(() => {
			for (const e of epsilons) sink += 1 / e - 0.2;
		})
	};
	const out = [
		figure(`epsilon sweep, ${N} values, Born + image charge`, time(() => epsilonSweep(input)), { baseline: base, targetMs: 16 }),
		figure(
			`${N} solid-state estimates (the page's per-value path)`,
			time(() => {
				for (const e of epsilons) sink += solidStateEstimate({ alpha: 0.2, gammaBohrInv: 0.2, ipGasEv: 6.55, eaGasEv: 1.35, epsilon: e, cavity: { volumePerMoleculeA3: 338 }, substrate: { distanceA: 3.5, epsilon: 'metal' } }).gapSolidEv;
			}),
			{ baseline: base, targetMs: 16 }
		)
	];
	if (sink === 42) console.log('');
	return out;
}
