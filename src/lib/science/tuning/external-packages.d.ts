// Minimal types for the test-only numerical packages used to check the tuning module from outside.
declare module 'numeric' {
	interface Spline {
		at(x: number): number;
		roots(): number[];
		diff(): Spline;
	}
	const numeric: {
		Spline: new (x: number[], yl: number[], yr: number[], kl: number[], kr: number[]) => Spline;
		/** Cubic spline through (x, y); natural end conditions when k1 and kn are omitted. */
		spline(x: number[], y: number[], k1?: number, kn?: number): Spline;
	};
	export default numeric;
}
declare module 'minimize-golden-section-1d' {
	export default function minimize(
		f: (x: number) => number,
		options?: { tolerance?: number; lowerBound?: number; upperBound?: number; maxIterations?: number },
		status?: { converged?: boolean; iterations?: number; minimum?: number; argmin?: number }
	): number;
}
