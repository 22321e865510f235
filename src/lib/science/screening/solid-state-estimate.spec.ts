import { describe, expect, it } from 'vitest';
import { solidStateEstimate } from './solid-state-estimate';

// Reference values: hand arithmetic with CODATA 2018 e^2/(4 pi eps0) = 14.399645478 eV·Å.
describe('solidStateEstimate', () => {
	const base = { alpha: 0.2, gammaBohrInv: 0.25, ipGasEv: 7.0, eaGasEv: 1.0, epsilon: 3 };

	it('Born sphere a = 5 Å, epsilon = 3: P = 14.399645478/10 × (2/3) = 0.959976 eV for each carrier', () => {
		const r = solidStateEstimate({ ...base, cavity: { radiusA: 5 } });
		expect(r.pPlusEv).toBeCloseTo(0.9599763652, 9);
		expect(r.ipSolidEv).toBeCloseTo(7 - 0.9599763652, 9);
		expect(r.eaSolidEv).toBeCloseTo(1 + 0.9599763652, 9);
		expect(r.renormalizationEv).toBeCloseTo(2 * 0.9599763652, 9);
		expect(r.gapSolidEv).toBeCloseTo(6 - 2 * 0.9599763652, 9);
	});

	it('screened parameters: long-range 1/3, beta = 1/3 - 0.2, gamma unchanged', () => {
		const r = solidStateEstimate({ ...base, cavity: { radiusA: 5 } });
		expect(r.longRangeFraction).toBeCloseTo(1 / 3, 12);
		expect(r.beta).toBeCloseTo(1 / 3 - 0.2, 12);
		expect(r.alpha + r.beta).toBeCloseTo(1 / 3, 12);
		expect(r.gammaBohrInv).toBe(0.25);
		expect(r.betaNegative).toBe(false);
	});

	it('beta < 0 is legal for epsilon > 1/alpha and flagged', () => {
		const r = solidStateEstimate({ ...base, epsilon: 6, cavity: { radiusA: 5 } });
		expect(r.beta).toBeCloseTo(1 / 6 - 0.2, 12);
		expect(r.betaNegative).toBe(true);
		expect(r.betaNote).toBeTruthy();
	});

	it('radius from V/Z: V = 4/3 pi 5^3 = 523.599 Å^3 gives a = 5 Å', () => {
		const r = solidStateEstimate({ ...base, cavity: { volumePerMoleculeA3: (4 / 3) * Math.PI * 125 } });
		expect(r.radiusA).toBeCloseTo(5, 12);
		expect(r.radiusSource).toBe('volume-per-molecule');
	});

	it('adds an image-charge term: metal at z = 3 Å gives 14.399645478/12 = 1.199970 eV', () => {
		const r = solidStateEstimate({ ...base, cavity: { radiusA: 5 }, substrate: { distanceA: 3, epsilon: 'metal' } });
		expect(r.imageChargeEv).toBeCloseTo(1.1999704565, 9);
		expect(r.pPlusEv).toBeCloseTo(0.9599763652 + 1.1999704565, 9);
	});

	it('eps_s = 3 half-space at z = 3 Å: 14.399645478/12 × (2/4) = 0.599985 eV', () => {
		const r = solidStateEstimate({ ...base, cavity: { radiusA: 5 }, substrate: { distanceA: 3, epsilon: 3 } });
		expect(r.imageChargeEv).toBeCloseTo(0.5999852283, 9);
	});

	it('acene-like cavity (V/Z ≈ 240 Å^3, eps 3) gives a polarization energy within the 1-2 eV range of condensed aromatics (common practice)', () => {
		const r = solidStateEstimate({ ...base, cavity: { volumePerMoleculeA3: 240 } });
		expect(r.pPlusEv).toBeGreaterThan(1);
		expect(r.pPlusEv).toBeLessThan(2);
	});

	it('refuses epsilon < 1, alpha outside [0, 1], radius <= 0 and gamma <= 0 with specific messages', () => {
		expect(() => solidStateEstimate({ ...base, epsilon: 0.8, cavity: { radiusA: 5 } })).toThrow(/epsilon/);
		expect(() => solidStateEstimate({ ...base, alpha: 1.2, cavity: { radiusA: 5 } })).toThrow(/alpha/);
		expect(() => solidStateEstimate({ ...base, cavity: { radiusA: 0 } })).toThrow(/radius/);
		expect(() => solidStateEstimate({ ...base, gammaBohrInv: 0, cavity: { radiusA: 5 } })).toThrow(/gamma/);
	});
});
