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

/** The same for an async function (each run awaited before the next). */
export async function timeAsync(fn: () => Promise<unknown>, minMs = 1000, minRuns = 10): Promise<{ medianMs: number; runs: number }> {
	for (let i = 0; i < 2; i++) await fn();
	const samples: number[] = [];
	const t0 = performance.now();
	while (performance.now() - t0 < minMs || samples.length < minRuns) {
		const t = performance.now();
		await fn();
		samples.push(performance.now() - t);
	}
	samples.sort((a, b) => a - b);
	return { medianMs: samples[Math.floor(samples.length / 2)], runs: samples.length };
}

/** One measured figure of a science micro-benchmark. */
export interface MicroFigure {
	name: string;
	medianMs: number;
	runs: number;
	/** Median of the plain baseline measured in the same run, and the ratio to it. */
	baseline?: { name: string; medianMs: number };
	ratio?: number;
	targetMs?: number;
	met?: boolean;
}

export function figure(name: string, t: { medianMs: number; runs: number }, opts: { baseline?: { name: string; medianMs: number }; targetMs?: number } = {}): MicroFigure {
	return {
		name,
		...t,
		...(opts.baseline ? { baseline: opts.baseline, ratio: t.medianMs / opts.baseline.medianMs } : {}),
		...(opts.targetMs !== undefined ? { targetMs: opts.targetMs, met: t.medianMs < opts.targetMs } : {})
	};
}
