import { describe, expect, it } from 'vitest';
import { AVOGADRO, BOHR3_A3 } from '../units';
import { clausiusMossottiEpsilon } from './clausius-mossotti-epsilon';
import { clausiusMossottiPolarizabilityA3 } from './clausius-mossotti-polarizability-a3';
import { PolarizationCatastropheError } from './dielectric-error';
import { polarizabilityVolumeA3 } from './polarizability-volume-a3';

describe('polarizabilityVolumeA3: unit conversions', () => {
	it('1 bohr^3 = 0.148184711 Å^3 (CODATA 2018 derived)', () => {
		expect(polarizabilityVolumeA3({ polarizability: 1, unit: 'bohr3' })).toBeCloseTo(0.148184711, 9);
	});

	it('the atomic unit of polarizability in SI, 1.64877727436e-41 C^2 m^2 J^-1 (CODATA 2018, recalled from memory), is 1 bohr^3 of volume', () => {
		// alpha / (4 pi eps0) = a0^3 by definition of the atomic unit; relative tolerance 1e-9.
		const a = polarizabilityVolumeA3({ polarizability: 1.64877727436e-41, unit: 'SI' });
		expect(Math.abs(a / BOHR3_A3 - 1)).toBeLessThan(1e-9);
	});

	it('cm^3 (CGS habit): 10.4e-24 cm^3 = 10.4 Å^3', () => {
		expect(polarizabilityVolumeA3({ polarizability: 10.4e-24, unit: 'cm3' })).toBeCloseTo(10.4, 12);
	});

	it('a tensor is averaged as trace/3', () => {
		const t = [
			[12, 0.5, 0],
			[0.5, 10, 0],
			[0, 0, 5]
		];
		expect(polarizabilityVolumeA3({ polarizability: t, unit: 'A3' })).toBeCloseTo(9, 14);
		expect(polarizabilityVolumeA3({ polarizability: t, unit: 'bohr3' })).toBeCloseTo(9 * BOHR3_A3, 14);
	});

	it('refuses non-positive values and unknown units', () => {
		expect(() => polarizabilityVolumeA3({ polarizability: 0, unit: 'A3' })).toThrow('polarizability must be > 0, got 0 A3');
		// @ts-expect-error deliberately wrong unit
		expect(() => polarizabilityVolumeA3({ polarizability: 1, unit: 'nm3' })).toThrow(
			"unknown polarizability unit 'nm3' (use A3, bohr3, cm3 or SI)"
		);
	});
});

describe('clausiusMossottiEpsilon: (eps - 1)/(eps + 2) = 4 pi alpha\' / (3 V_m) (Jackson, sec. 4.5)', () => {
	it('worked example by hand: alpha\' = 3 Å^3, V_m = 16 pi Å^3 -> x = 4 pi 3/(3 16 pi) = 1/4, eps = (1 + 1/2)/(3/4) = 2', () => {
		const r = clausiusMossottiEpsilon({ polarizability: 3, unit: 'A3', volumePerMoleculeA3: 16 * Math.PI });
		expect(r.x).toBeCloseTo(0.25, 14);
		expect(r.epsilon).toBeCloseTo(2, 14);
		expect(r.warnings).toEqual([]);
	});

	it('algebraic round trip eps -> alpha\' -> eps for many eps (tolerance 1e-12 relative)', () => {
		for (const eps of [1, 1.0001, 1.5, 2.2, 3, 3.7, 4.5, 8, 30]) {
			const alpha = clausiusMossottiPolarizabilityA3({ epsilon: eps, volumePerMoleculeA3: 250 });
			if (eps === 1) {
				expect(alpha).toBe(0);
				continue;
			}
			const back = clausiusMossottiEpsilon({ polarizability: alpha, unit: 'A3', volumePerMoleculeA3: 250 });
			expect(Math.abs(back.epsilon / eps - 1)).toBeLessThan(1e-12);
		}
	});

	it('Lorentz–Lorenz check on liquid benzene predicts n_D within 1%', () => {
		// Published values (recalled from memory): benzene at 20 °C, n_D (589 nm) = 1.5011, density 0.8765 g/cm^3,
		// molar mass 78.11 g/mol, gas-phase mean polarizability volume about 10.3 Å^3 (handbook tables).
		// V_m = M / (rho N_A) = 78.11 / (0.8765 * 6.02214076e23) cm^3 = 1.4798e-22 cm^3 = 147.98 Å^3.
		// x = 4 pi 10.3 / (3 * 147.98) = 0.2915; eps = 1.5831/0.7085 = 2.234; n = 1.4947 (measured 1.5011).
		const vm = (78.11 / (0.8765 * AVOGADRO)) * 1e24;
		expect(vm).toBeCloseTo(147.98, 1);
		const r = clausiusMossottiEpsilon({ polarizability: 10.3, unit: 'A3', volumePerMoleculeA3: vm });
		expect(Math.abs(Math.sqrt(r.epsilon) / 1.5011 - 1)).toBeLessThan(0.01);
		// Inverse: alpha' from n_D; molar refraction R = (4 pi / 3) N_A alpha' is about 26.2 cm^3/mol for benzene
		// (recalled from memory), here 26.26 cm^3/mol.
		const alpha = clausiusMossottiPolarizabilityA3({ epsilon: 1.5011 ** 2, volumePerMoleculeA3: vm });
		const molarRefraction = ((4 * Math.PI) / 3) * AVOGADRO * alpha * 1e-24;
		expect(molarRefraction).toBeCloseTo(26.26, 1);
	});

	it('x >= 1 throws PolarizationCatastropheError explaining that there is no solution', () => {
		// alpha' = 3 V_m / (4 pi) gives x = 1 exactly.
		const input = { polarizability: 30, unit: 'A3' as const, volumePerMoleculeA3: 100 }; // x = 1.2566
		expect(() => clausiusMossottiEpsilon(input)).toThrow(PolarizationCatastropheError);
		expect(() => clausiusMossottiEpsilon(input)).toThrow(
			"Clausius–Mossotti has no solution: x = 4 pi alpha' / (3 V_m) = 1.257 >= 1 (alpha' = 30 Å^3, V_m = 100 Å^3). " +
				'The local-field model diverges (polarization catastrophe): check the polarizability unit and that the ' +
				'volume is per molecule (cell volume divided by Z).'
		);
		try {
			clausiusMossottiEpsilon(input);
		} catch (e) {
			expect((e as PolarizationCatastropheError).field).toBe('polarizability');
			expect((e as PolarizationCatastropheError).x).toBeCloseTo((4 * Math.PI * 30) / 300, 14);
		}
		expect(() =>
			clausiusMossottiEpsilon({ polarizability: (3 * 100) / (4 * Math.PI), unit: 'A3', volumePerMoleculeA3: 100 })
		).toThrow(PolarizationCatastropheError);
	});

	it('warns when x is close to 1', () => {
		const r = clausiusMossottiEpsilon({ polarizability: 20, unit: 'A3', volumePerMoleculeA3: 100 }); // x = 0.8378
		expect(r.epsilon).toBeGreaterThan(10);
		expect(r.warnings).toHaveLength(1);
	});

	it('uncertainty: 3/(1-x)^2 u(x) matches a central finite difference (tolerance 1e-6 relative)', () => {
		const base = { polarizability: 40, unit: 'A3' as const, volumePerMoleculeA3: 300 };
		const r = clausiusMossottiEpsilon({ ...base, polarizabilityUncertainty: 1 });
		const h = 1e-4;
		const up = clausiusMossottiEpsilon({ ...base, polarizability: 40 + h }).epsilon;
		const down = clausiusMossottiEpsilon({ ...base, polarizability: 40 - h }).epsilon;
		const slope = (up - down) / (2 * h);
		expect(Math.abs((r.epsilonUncertainty as number) / slope - 1)).toBeLessThan(1e-6);
		// Volume uncertainty adds in quadrature (relative): u(x)/x = hypot(1/40, 6/300).
		const both = clausiusMossottiEpsilon({ ...base, polarizabilityUncertainty: 1, volumePerMoleculeUncertaintyA3: 6 });
		const x = (4 * Math.PI * 40) / 900;
		expect(both.epsilonUncertainty).toBeCloseTo((3 / (1 - x) ** 2) * x * Math.hypot(1 / 40, 6 / 300), 12);
	});

	it('refuses a non-positive volume', () => {
		expect(() => clausiusMossottiEpsilon({ polarizability: 10, unit: 'A3', volumePerMoleculeA3: 0 })).toThrow(
			'volume per molecule must be a finite number > 0 Å^3, got 0'
		);
	});
});
