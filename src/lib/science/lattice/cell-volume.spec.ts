import { describe, expect, it } from 'vitest';
import { cellVolumeA3 } from './cell-volume';

// Published cells (values as printed):
// - pentacene, triclinic P-1, CSD refcode PENCEN: README of repository afonari/emc, Test-Pentacene/README.md
//   (a 7.900, b 6.060, c 16.010 Å; alpha 101.90, beta 112.60, gamma 85.80°; _cell_volume 692.384 Å³)
// - COD 1100117, monoclinic P 1 21 1 (cod-developers/cod-tools tests/inputs/1100117.cif):
//   a 7.8713(3), b 5.4739(4), c 20.898(2) Å, beta 112.422(3)°, _cell_volume 832.354 Å³
// - COD 1100772, hexagonal setting R -3 :H (cod-developers/cod-tools tests/inputs/1100772.cif):
//   a = b 22.2714(16), c 9.8838(11) Å, gamma 120°, _cell_volume 4245.7(6) Å³
// - rubrene, orthorhombic, cell as quoted from its CIF in repository sheridanfew/pythonpolarisation,
//   Crystals/Morpurgo_sp_outer/mol_specific_parts/Rubrene.py (7.184, 14.433, 26.897 Å; 2788.86 Å³)
describe('cellVolumeA3', () => {
	it('triclinic pentacene (PENCEN) gives the printed 692.384 Å³ (tolerance 0.001 Å³)', () => {
		const v = cellVolumeA3({ a: 7.9, b: 6.06, c: 16.01, alphaDeg: 101.9, betaDeg: 112.6, gammaDeg: 85.8 });
		expect(Math.abs(v - 692.384)).toBeLessThan(0.001);
	});
	it('monoclinic COD 1100117 gives the printed 832.354 Å³ (tolerance 0.001 Å³)', () => {
		const v = cellVolumeA3({ a: 7.8713, b: 5.4739, c: 20.898, alphaDeg: 90, betaDeg: 112.422, gammaDeg: 90 });
		expect(Math.abs(v - 832.354)).toBeLessThan(0.001);
	});
	it('monoclinic organic COD 2000724 gives the printed 763.9(4) Å³ (tolerance 0.05 Å³)', () => {
		// cod-developers/cod-tools tests/inputs/2000724.cif (Mizuguchi & Rihs, Acta Cryst. C48 (1992) 1553):
		// a 10.6570(10), b 5.1200(10), c 14.813(2) Å, beta 109.060(10)°
		const v = cellVolumeA3({ a: 10.657, b: 5.12, c: 14.813, alphaDeg: 90, betaDeg: 109.06, gammaDeg: 90 });
		expect(Math.abs(v - 763.9)).toBeLessThan(0.05);
	});
	it('hexagonal COD 1100772 gives the printed 4245.7 Å³ (tolerance 0.05 Å³, one printed decimal)', () => {
		const v = cellVolumeA3({ a: 22.2714, b: 22.2714, c: 9.8838, alphaDeg: 90, betaDeg: 90, gammaDeg: 120 });
		expect(Math.abs(v - 4245.7)).toBeLessThan(0.05);
	});
	it('orthorhombic rubrene gives the printed 2788.86 Å³ (tolerance 0.005 Å³)', () => {
		const v = cellVolumeA3({ a: 7.184, b: 14.433, c: 26.897, alphaDeg: 90, betaDeg: 90, gammaDeg: 90 });
		expect(Math.abs(v - 2788.86)).toBeLessThan(0.005);
	});
	it('a cube of 2 Å is exactly 8 Å³ (geometry)', () =>
		expect(cellVolumeA3({ a: 2, b: 2, c: 2, alphaDeg: 90, betaDeg: 90, gammaDeg: 90 })).toBe(8));

	it('throws RangeError for non-physical lengths', () => {
		const ok = { a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 100, gammaDeg: 90 };
		expect(() => cellVolumeA3({ ...ok, a: 0 })).toThrow(new RangeError('cell length a must be a finite number > 0 Å, got 0'));
		expect(() => cellVolumeA3({ ...ok, b: -1 })).toThrow(RangeError);
		expect(() => cellVolumeA3({ ...ok, c: Number.NaN })).toThrow(/cell length c/);
		expect(() => cellVolumeA3({ ...ok, c: Infinity })).toThrow(/cell length c/);
	});
	it('throws RangeError for angles outside (0, 180)', () => {
		const ok = { a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 100, gammaDeg: 90 };
		expect(() => cellVolumeA3({ ...ok, alphaDeg: 0 })).toThrow(
			new RangeError('cell angle alphaDeg must be a finite number strictly between 0 and 180 degrees, got 0')
		);
		expect(() => cellVolumeA3({ ...ok, betaDeg: 180 })).toThrow(/betaDeg/);
		expect(() => cellVolumeA3({ ...ok, gammaDeg: Number.NaN })).toThrow(/gammaDeg/);
	});
	it('throws RangeError when the angles cannot close a cell (square-root argument <= 0)', () => {
		// three coplanar vectors at 120° to each other: factor exactly 0
		expect(() => cellVolumeA3({ a: 5, b: 5, c: 5, alphaDeg: 120, betaDeg: 120, gammaDeg: 120 })).toThrow(/do not form a cell/);
		// gamma larger than alpha + beta
		expect(() => cellVolumeA3({ a: 5, b: 5, c: 5, alphaDeg: 10, betaDeg: 10, gammaDeg: 100 })).toThrow(RangeError);
	});
});
