import { describe, expect, it } from 'vitest';
import { bornRadiusA } from './born-radius';
import { cellVolumeA3 } from './cell-volume';
import { densityGPerCm3 } from './density';
import { volumePerMoleculeA3 } from './volume-per-molecule';
import { molarMassGPerMol, parseFormula } from '../elements';

// Printed values from COD CIFs in cod-developers/cod-tools (tests/inputs):
// - 1100117.cif (monoclinic, C12 H30 Al F5 N2, Z = 2, _cell_volume 832.354, _exptl_crystal_density_diffrn 1.29)
// - 1100772.cif (R -3 :H, C18 H33 Gd N3 O18 P3, Z = 6, _cell_volume 4245.7(6),
//   _chemical_formula_weight 829.63, _exptl_crystal_density_diffrn 1.947)
describe('densityGPerCm3', () => {
	it('monoclinic COD 1100117: 1.29 g/cm³ as printed (tolerance 0.005, two printed decimals)', () => {
		const v = cellVolumeA3({ a: 7.8713, b: 5.4739, c: 20.898, alphaDeg: 90, betaDeg: 112.422, gammaDeg: 90 });
		const m = molarMassGPerMol(parseFormula('C12 H30 Al F5 N2'));
		expect(Math.abs(densityGPerCm3(m, 2, v) - 1.29)).toBeLessThan(0.005);
	});
	it('monoclinic organic COD 2000724 (C20 H12 N2 S2, Z = 2): 1.497 g/cm³ (tolerance 0.0005)', () => {
		// cod-developers/cod-tools tests/inputs/2000724.cif prints _exptl_crystal_density_meas 1.497 and
		// _exptl_crystal_density_diffrn 1.470; the cell and formula give 1.497, so the printed diffrn value
		// looks like a transposition in the source.
		const v = cellVolumeA3({ a: 10.657, b: 5.12, c: 14.813, alphaDeg: 90, betaDeg: 109.06, gammaDeg: 90 });
		const m = molarMassGPerMol(parseFormula('C20 H12 N2 S2'));
		expect(Math.abs(m - 344.45)).toBeLessThan(0.005); // _chemical_formula_weight 344.45
		expect(Math.abs(densityGPerCm3(m, 2, v) - 1.497)).toBeLessThan(0.0005);
	});
	it('hexagonal COD 1100772: 1.947 g/cm³ as printed (tolerance 0.0005)', () => {
		const v = cellVolumeA3({ a: 22.2714, b: 22.2714, c: 9.8838, alphaDeg: 90, betaDeg: 90, gammaDeg: 120 });
		expect(Math.abs(densityGPerCm3(829.63, 6, v) - 1.947)).toBeLessThan(0.0005);
	});
	it('is Z·M/(N_A·V·1e-24) with N_A = 6.02214076e23 (SI 2019): 1 mol of 1 g in 1 cm³/N_A', () =>
		expect(densityGPerCm3(6.02214076e23 * 1e-24, 1, 1)).toBeCloseTo(1, 14));
	it('throws RangeError for non-positive or non-finite inputs', () => {
		expect(() => densityGPerCm3(0, 2, 500)).toThrow(new RangeError('molar mass must be a finite number > 0 g/mol, got 0'));
		expect(() => densityGPerCm3(178, 0, 500)).toThrow(/Z \(formula units per cell\)/);
		expect(() => densityGPerCm3(178, 2, Number.NaN)).toThrow(/cell volume/);
	});
});

describe('volumePerMoleculeA3', () => {
	it('divides by Z: pentacene PENCEN 692.384 Å³ / 2 (afonari/emc Test-Pentacene/README.md; Z = 2 recalled from memory)', () =>
		expect(volumePerMoleculeA3(692.384, 2)).toBeCloseTo(346.192, 10));
	it('throws RangeError for bad volume or Z', () => {
		expect(() => volumePerMoleculeA3(-1, 2)).toThrow(/cell volume/);
		expect(() => volumePerMoleculeA3(100, 0)).toThrow(/Z \(formula units per cell\) must be a finite number > 0, got 0/);
		expect(() => volumePerMoleculeA3(100, Infinity)).toThrow(RangeError);
	});
});

describe('bornRadiusA', () => {
	it('is 1 Å for a volume of 4π/3 Å³ and 2 Å for 32π/3 Å³ (sphere volume formula, 1e-14)', () => {
		expect(bornRadiusA((4 * Math.PI) / 3)).toBeCloseTo(1, 14);
		expect(bornRadiusA((32 * Math.PI) / 3)).toBeCloseTo(2, 14);
	});
	it('throws RangeError for non-positive volume', () => {
		expect(() => bornRadiusA(0)).toThrow(new RangeError('volume per molecule must be a finite number > 0 Å³, got 0'));
		expect(() => bornRadiusA(Number.NaN)).toThrow(RangeError);
	});
});
