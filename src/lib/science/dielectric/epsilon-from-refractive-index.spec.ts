import { describe, expect, it } from 'vitest';
import { DielectricError } from './dielectric-error';
import { epsilonFromRefractiveIndex } from './epsilon-from-refractive-index';
import { epsilonUncertaintyFromRefractiveIndex } from './epsilon-uncertainty-from-refractive-index';

describe('epsilonFromRefractiveIndex: eps = n^2 (Maxwell relation for a non-magnetic, non-absorbing medium)', () => {
	it('n = 1.5 gives 2.25 (by hand: 1.5^2)', () => {
		const r = epsilonFromRefractiveIndex(1.5);
		expect(r.epsilon).toBeCloseTo(2.25, 14);
		expect(r.wavelengthNm).toBeNull();
		expect(r.epsilonUncertainty).toBeNull();
		expect(r.note).toMatch(/dispersion/);
	});

	it('carries the wavelength and propagates u(n): u(eps) = 2 n u(n) (linear propagation, GUM)', () => {
		const r = epsilonFromRefractiveIndex({ refractiveIndex: 1.8, wavelengthNm: 633, refractiveIndexUncertainty: 0.02 });
		expect(r.epsilon).toBeCloseTo(3.24, 14);
		expect(r.wavelengthNm).toBe(633);
		expect(r.epsilonUncertainty).toBeCloseTo(2 * 1.8 * 0.02, 14); // 0.072
		// Check against the exact spread: ((n+dn)^2 - (n-dn)^2)/2 = 2 n dn exactly for a square.
		expect(r.epsilonUncertainty).toBeCloseTo((1.82 ** 2 - 1.78 ** 2) / 2, 14);
	});

	it('refuses n < 1, bad wavelengths and negative uncertainties', () => {
		expect(() => epsilonFromRefractiveIndex(0.9)).toThrow(DielectricError);
		expect(() => epsilonFromRefractiveIndex(0.9)).toThrow('refractive index must be a finite number >= 1, got 0.9');
		expect(() => epsilonFromRefractiveIndex({ refractiveIndex: 1.5, wavelengthNm: 0 })).toThrow(
			'wavelength must be a finite number > 0 nm, got 0'
		);
		expect(() => epsilonUncertaintyFromRefractiveIndex({ refractiveIndex: 1.5, refractiveIndexUncertainty: -0.1 })).toThrow(
			'refractive index uncertainty must be a finite number >= 0, got -0.1'
		);
		expect(() => epsilonFromRefractiveIndex(NaN)).toThrow('refractive index must be a finite number >= 1, got NaN');
	});
});
