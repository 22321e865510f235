import { describe, expect, it } from 'vitest';
import { screenedFractions } from './screened-fractions';
import { ScreeningError } from './screening-error';
import { semilocalExchangeWeights } from './semilocal-exchange-weights';

describe('screenedFractions (science notes, section 2: alpha + beta = 1/epsilon)', () => {
	it('gas phase epsilon = 1: beta = 1 - alpha', () => {
		const f = screenedFractions({ alpha: 0.2, epsilon: 1 });
		expect(f.beta).toBeCloseTo(0.8, 15);
		expect(f.longRange).toBe(1);
		expect(f.betaNegative).toBe(false);
		expect(f.note).toBe('epsilon = 1 is the gas phase: alpha + beta = 1 (full long-range exact exchange).');
	});

	it('alpha = 0.2, epsilon = 3.5: beta = 1/3.5 - 0.2 = 0.0857142857...', () => {
		const f = screenedFractions({ alpha: 0.2, epsilon: 3.5 });
		expect(f.beta).toBeCloseTo(0.08571428571428572, 15);
		expect(f.longRange).toBeCloseTo(0.2857142857142857, 15);
		expect(f.note).toBeNull();
	});

	it('beta < 0 is legal and flagged with a note (alpha = 0.25, epsilon = 5: beta = -0.05)', () => {
		const f = screenedFractions({ alpha: 0.25, epsilon: 5 });
		expect(f.beta).toBeCloseTo(-0.05, 15);
		expect(f.betaNegative).toBe(true);
		expect(f.note).toMatch(/^beta = 1\/epsilon - alpha = -0.05 is negative/);
		expect(f.semilocal.srPbeX).toBeCloseTo(-0.05, 15);
	});

	it('alpha = 1/epsilon gives beta exactly 0, not a rounding-noise negative', () => {
		const f = screenedFractions({ alpha: 0.25, epsilon: 4 });
		expect(f.beta).toBe(0);
		expect(f.betaNegative).toBe(false);
	});

	it('property: alpha + beta = 1/epsilon and the semilocal weights sum with exact exchange to 1 (2000 cases, 1e-14)', () => {
		// Deterministic pseudo-random grid (linear congruential generator, Numerical Recipes constants).
		let seed = 12345;
		const rand = () => ((seed = (1664525 * seed + 1013904223) % 4294967296) / 4294967296);
		for (let i = 0; i < 2000; i++) {
			const alpha = rand();
			const epsilon = 1 + 20 * rand();
			const f = screenedFractions({ alpha, epsilon });
			expect(Math.abs(f.alpha + f.beta - 1 / epsilon)).toBeLessThan(1e-14);
			expect(f.longRange).toBe(1 / epsilon);
			expect(f.betaNegative).toBe(f.beta < 0);
			expect(Number.isFinite(f.beta)).toBe(true);
			// Long-range limit: exact (alpha + beta) + semilocal full-range (1 - alpha - beta) = 1.
			expect(Math.abs(f.alpha + f.beta + f.semilocal.fullPbeX - 1)).toBeLessThan(1e-14);
			// Short-range limit (erf -> 0): exact alpha + semilocal (beta SR + (1 - alpha - beta) full) = 1.
			expect(Math.abs(f.alpha + f.semilocal.srPbeX + f.semilocal.fullPbeX - 1)).toBeLessThan(1e-14);
		}
	});

	it('propagates u(epsilon) to u(1/epsilon) = u(epsilon)/epsilon^2', () => {
		expect(screenedFractions({ alpha: 0.2, epsilon: 4, epsilonUncertainty: 0.4 }).longRangeUncertainty).toBeCloseTo(0.025, 15);
		expect(screenedFractions({ alpha: 0.2, epsilon: 4 }).longRangeUncertainty).toBeNull();
	});

	it('validates alpha and epsilon with field-named errors', () => {
		expect(() => screenedFractions({ alpha: 0.2, epsilon: 0.8 })).toThrow(ScreeningError);
		expect(() => screenedFractions({ alpha: 0.2, epsilon: 0.8 })).toThrow('epsilon must be >= 1, got 0.8');
		expect(() => screenedFractions({ alpha: 1.2, epsilon: 3 })).toThrow('alpha must be between 0 and 1, got 1.2');
		expect(() => screenedFractions({ alpha: -0.1, epsilon: 3 })).toThrow('alpha must be between 0 and 1, got -0.1');
		expect(() => screenedFractions({ alpha: 0.2, epsilon: Infinity })).toThrow('epsilon must be a finite number, got Infinity');
		expect(() => screenedFractions({ alpha: NaN, epsilon: 3 })).toThrow('alpha must be a finite number, got NaN');
		try {
			screenedFractions({ alpha: 0.2, epsilon: 0.8 });
		} catch (e) {
			expect((e as ScreeningError).field).toBe('epsilon');
			expect(e).toBeInstanceOf(RangeError);
		}
	});
});

describe('semilocalExchangeWeights (science notes, sections 2 and 7)', () => {
	it('srPbeX = beta, fullPbeX = 1 - alpha - beta, pbeC = 1', () => {
		expect(semilocalExchangeWeights({ alpha: 0.2, beta: 0.8 })).toEqual({ srPbeX: 0.8, fullPbeX: 0, pbeC: 1 });
		const w = semilocalExchangeWeights({ alpha: 0.2, beta: 0.1 });
		expect(w.srPbeX).toBe(0.1);
		expect(w.fullPbeX).toBeCloseTo(0.7, 15);
	});
	it('refuses a long-range fraction outside [0, 1]', () => {
		expect(() => semilocalExchangeWeights({ alpha: 0.2, beta: 0.9 })).toThrow(
			'alpha + beta (the long-range fraction) must be between 0 and 1'
		);
	});
});
