/** Fixed-precision display with tabular figures in mind; never shows NaN. */
export function fmt(x: number | null | undefined, digits = 3): string {
	if (x === null || x === undefined || !Number.isFinite(x)) return '—';
	return x.toFixed(digits);
}
