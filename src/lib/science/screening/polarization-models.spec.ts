import { describe, expect, it } from 'vitest';
import { COULOMB_EV_A } from '../units';
import { bornPolarizationEv } from './born-polarization-ev';
import { bornRadiusA } from './born-radius-a';
import { imageChargePolarizationEv } from './image-charge-polarization-ev';

describe('bornPolarizationEv: P = e^2/(4 pi eps0)/(2a) (1 - 1/eps) (Born 1920 solvation energy)', () => {
	it('a = 5 Å, eps = 3 -> 0.96 eV', () => {
		// By hand: 14.399645478 eV·Å / (2 x 5 Å) = 1.4399645478 eV; x (1 - 1/3) = x 0.6666667 -> 0.9599763652 eV.
		expect(bornPolarizationEv({ radiusA: 5, epsilon: 3 })).toBeCloseTo(0.9599763652, 9);
	});

	it('uses e^2/(4 pi eps0) = 14.399645478 eV·Å (CODATA 2018 derived)', () => {
		expect(COULOMB_EV_A).toBeCloseTo(14.399645478, 8);
		// Conductor limit (eps -> infinity): e^2/(8 pi eps0 a); a = 7.2 Å gives 14.399645478/14.4 = 0.99997538 eV.
		expect(bornPolarizationEv({ radiusA: 7.2, epsilon: 1e12 })).toBeCloseTo(0.99997538, 7);
	});

	it('vanishes in vacuum (eps = 1) and grows with eps', () => {
		expect(bornPolarizationEv({ radiusA: 5, epsilon: 1 })).toBe(0);
		expect(bornPolarizationEv({ radiusA: 5, epsilon: 4 })).toBeGreaterThan(bornPolarizationEv({ radiusA: 5, epsilon: 3 }));
	});

	it('validates inputs', () => {
		expect(() => bornPolarizationEv({ radiusA: 0, epsilon: 3 })).toThrow('radiusA must be > 0, got 0');
		expect(() => bornPolarizationEv({ radiusA: 5, epsilon: 0.8 })).toThrow('epsilon must be >= 1, got 0.8');
	});
});

describe('bornRadiusA: a = (3 V_m / (4 pi))^(1/3)', () => {
	it('a sphere of radius 5 Å has volume 4/3 pi 125 = 523.599 Å^3 (sphere volume formula)', () => {
		expect(bornRadiusA({ volumePerMoleculeA3: (4 / 3) * Math.PI * 125 })).toBeCloseTo(5, 13);
	});
	it('refuses a non-positive volume', () => {
		expect(() => bornRadiusA({ volumePerMoleculeA3: -1 })).toThrow('volumePerMoleculeA3 must be > 0, got -1');
	});
});

describe('imageChargePolarizationEv: P = e^2/(4 pi eps0)/(4z) (eps_s - 1)/(eps_s + 1) (image charge, Jackson sec. 4.4)', () => {
	it('metal at z = 3.5 Å -> 1.0285 eV', () => {
		// By hand: 14.399645478 / (4 x 3.5) = 14.399645478 / 14 = 1.0285461056 eV (factor 1 for a metal).
		expect(imageChargePolarizationEv({ distanceA: 3.5, substrateEpsilon: 'metal' })).toBeCloseTo(1.0285461056, 9);
	});

	it('dielectric eps_s = 3 at z = 3.5 Å: factor (3 - 1)/(3 + 1) = 1/2 -> 0.5142730528 eV', () => {
		expect(imageChargePolarizationEv({ distanceA: 3.5, substrateEpsilon: 3 })).toBeCloseTo(0.5142730528, 9);
	});

	it('approaches the metal value as eps_s grows, vanishes for eps_s = 1', () => {
		const metal = imageChargePolarizationEv({ distanceA: 4, substrateEpsilon: 'metal' });
		expect(imageChargePolarizationEv({ distanceA: 4, substrateEpsilon: 1e9 })).toBeCloseTo(metal, 8);
		expect(imageChargePolarizationEv({ distanceA: 4, substrateEpsilon: 1 })).toBe(0);
	});

	it('validates inputs', () => {
		expect(() => imageChargePolarizationEv({ distanceA: 0, substrateEpsilon: 'metal' })).toThrow('distanceA must be > 0, got 0');
		expect(() => imageChargePolarizationEv({ distanceA: 3, substrateEpsilon: 0.5 })).toThrow(
			'substrateEpsilon must be >= 1, got 0.5'
		);
		// @ts-expect-error deliberately wrong substrate
		expect(() => imageChargePolarizationEv({ distanceA: 3, substrateEpsilon: 'gold' })).toThrow(
			"substrateEpsilon must be a number >= 1 or 'metal', got gold"
		);
	});
});
