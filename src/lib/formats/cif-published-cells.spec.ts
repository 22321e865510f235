import { describe, expect, it } from 'vitest';
import tricliniCif from './fixtures/cod-1501936.cif?raw';
import dithioneCif from './fixtures/cod-2000724.cif?raw';
import nitrothiopheneCif from './fixtures/cod-2205750.cif?raw';
import { polymorphFromCif } from './cif';

// Cell volume and density computed from the cell and formula against the values the authors printed in
// their CIFs (outside references; see fixtures/README.md):
// - cod-1501936.cif, triclinic P -1: Stewart, McDonald & West, Org. Lett. 13 (2011) 720 (COD 1501936):
//   _cell_volume 860.57(5) Å³, _exptl_crystal_density_diffrn 1.321 g/cm³, Z = 2, C21 H26 O4.
// - cod-2000724.cif, monoclinic P 1 21/c 1: Mizuguchi & Rihs, Acta Cryst. C48 (1992) 1553 (COD 2000724):
//   _cell_volume 763.9(4) Å³, _exptl_crystal_density_meas 1.497 g/cm³ (its printed diffraction density 1.470
//   disagrees with its own cell and formula, see fixtures/README.md).
// - cod-2205750.cif, orthorhombic P n a 21: McBurney et al., Acta Cryst. E61 (2005) o1221 (COD 2205750):
//   _cell_volume 613.79(6) Å³, _exptl_crystal_density_diffrn 1.701 g/cm³.
describe('published CIFs: computed volume and density match the printed values', () => {
	it('triclinic COD 1501936: V = 860.57(5) Å³ within its su, V/Z = V/2, density 1.321 g/cm³ (printed to 3 decimals; tolerance 0.001 for the atomic weights the refinement program used)', () => {
		const p = polymorphFromCif(tricliniCif);
		expect(p.spaceGroup).toEqual({ hermannMauguin: 'P -1', hall: '-P 1', number: 2 });
		expect(Math.abs(p.volumeA3 - 860.57)).toBeLessThan(0.05);
		expect(p.volumeSuA3).toBeCloseTo(0.05, 2);
		expect(p.volumePerMoleculeA3).toBeCloseTo(p.volumeA3 / 2, 12);
		expect(Math.abs((p.densityGPerCm3 as number) - 1.321)).toBeLessThan(0.001);
		expect(p.formula?.molarMassGPerMol).toBeCloseTo(342.42, 1);
		expect(p.temperatureK).toEqual({ value: 173, su: 2 });
		expect(p.atomSites).toHaveLength(51);
		expect(p.warnings).toEqual([]);
	});
	it('monoclinic COD 2000724: V = 763.9(4) Å³ and density 1.497 g/cm³', () => {
		const p = polymorphFromCif(dithioneCif);
		expect(Math.abs(p.volumeA3 - 763.9)).toBeLessThan(0.4);
		expect(Math.abs((p.densityGPerCm3 as number) - 1.497)).toBeLessThan(0.0005);
	});
	it('orthorhombic COD 2205750: V = 613.79(6) Å³ and density 1.701 g/cm³', () => {
		const p = polymorphFromCif(nitrothiopheneCif);
		expect(Math.abs(p.volumeA3 - 613.79)).toBeLessThan(0.06);
		expect(Math.abs((p.densityGPerCm3 as number) - 1.701)).toBeLessThan(0.0005);
	});
	it('a cell angle of 0° or 200° is refused naming the line of the cell', () => {
		for (const bad of ['0', '200']) {
			const text = tricliniCif.replace('_cell_angle_beta                 82.2194(4)', `_cell_angle_beta                 ${bad}`);
			expect(() => polymorphFromCif(text)).toThrow(/^line \d+: the cell is not physical: .*beta/);
		}
	});
});
