import { describe, expect, it } from 'vitest';
import { bracketedRoot } from './bracketed-root';
import { brentMinimum } from './brent-minimum';
import { TuningInputError } from './tuning-input-error';

describe('brentMinimum', () => {
	it('finds the vertex of a parabola (analytic: x = 0.3)', () => {
		// A smooth minimum can only be located to ~sqrt(machine epsilon) relative (Brent 1973, ch. 5).
		const r = brentMinimum((x) => (x - 0.3) ** 2 + 1, 0, 1, { tolerance: 1e-10 });
		expect(Math.abs(r.x - 0.3)).toBeLessThan(2e-8);
		expect(r.value).toBeCloseTo(1, 14);
	});

	it('finds the minimum of cos on [3, 4] (analytic: pi)', () => {
		const r = brentMinimum(Math.cos, 3, 4, { tolerance: 1e-10 });
		expect(Math.abs(r.x - Math.PI)).toBeLessThan(1e-7);
	});

	it('converges to a kink, |x - 0.2137| + 0.5 |x - 0.25| (analytic: 0.2137)', () => {
		const r = brentMinimum((x) => Math.abs(x - 0.2137) + 0.5 * Math.abs(x - 0.25), 0.1, 0.4, { tolerance: 1e-11 });
		expect(Math.abs(r.x - 0.2137)).toBeLessThan(1e-8);
	});

	it('ends near an edge for a monotone function (caller compares with the ends)', () => {
		const r = brentMinimum((x) => x, 0, 1, { tolerance: 1e-10 });
		expect(r.x).toBeLessThan(1e-8);
	});

	it('rejects a bad interval', () => {
		expect(() => brentMinimum((x) => x, 1, 0)).toThrow(TuningInputError);
	});
});

describe('bracketedRoot', () => {
	it('finds sqrt(2) as the root of x^2 - 2 on [1, 2]', () => {
		expect(bracketedRoot((x) => x * x - 2, 1, 2, { tolerance: 1e-14 })).toBeCloseTo(Math.SQRT2, 13);
	});
	it('requires a sign change', () => {
		expect(() => bracketedRoot((x) => x * x + 1, -1, 1)).toThrow('no sign change');
	});
});
