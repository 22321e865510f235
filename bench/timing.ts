import { performance } from 'node:perf_hooks';

/** Median wall time of `fn` over at least `minMs` and 20 runs, after a JIT warm-up. */
export function time(fn: () => unknown, minMs = 1000): { medianMs: number; runs: number } {
	for (let i = 0; i < 5; i++) fn();
	const samples: number[] = [];
	const t0 = performance.now();
	while (performance.now() - t0 < minMs || samples.length < 20) {
		const t = performance.now();
		fn();
		samples.push(performance.now() - t);
	}
	samples.sort((a, b) => a - b);
	return { medianMs: samples[Math.floor(samples.length / 2)], runs: samples.length };
}
