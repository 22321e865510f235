import { describe, expect, it } from 'vitest';
import { cellVolumeA3 } from './cell-volume';
import { cellVolumeSuA3 } from './cell-volume-su';

describe('cellVolumeSuA3', () => {
	it('orthorhombic COD 2205750: su 0.06 Å³ as printed in _cell_volume 613.79(6) (tolerance 0.005)', () => {
		// cod-developers/cod-tools tests/inputs/2205750.cif (McBurney et al., Acta Cryst. E61 (2005) o1221):
		// a 11.4180(7), b 13.9536(8), c 3.8525(2) Å, all angles 90°
		const cell = { a: 11.418, b: 13.9536, c: 3.8525, alphaDeg: 90, betaDeg: 90, gammaDeg: 90 };
		expect(Math.abs(cellVolumeA3(cell) - 613.79)).toBeLessThan(0.005);
		expect(Math.abs(cellVolumeSuA3(cell, { a: 0.0007, b: 0.0008, c: 0.0002 }) - 0.06)).toBeLessThan(0.005);
	});
	it('monoclinic COD 1100117: angle term matches a central finite difference (relative 1e-6)', () => {
		const cell = { a: 7.8713, b: 5.4739, c: 20.898, alphaDeg: 90, betaDeg: 112.422, gammaDeg: 90 };
		const h = 1e-4;
		const numeric = (cellVolumeA3({ ...cell, betaDeg: cell.betaDeg + h }) - cellVolumeA3({ ...cell, betaDeg: cell.betaDeg - h })) / (2 * h);
		expect(cellVolumeSuA3(cell, { betaDeg: 0.003 }) / Math.abs(numeric * 0.003)).toBeCloseTo(1, 6);
	});
	it('triclinic: each angle term matches a central finite difference (relative 1e-6)', () => {
		const cell = { a: 7.9, b: 6.06, c: 16.01, alphaDeg: 101.9, betaDeg: 112.6, gammaDeg: 85.8 };
		const h = 1e-4;
		for (const key of ['alphaDeg', 'betaDeg', 'gammaDeg'] as const) {
			const numeric = (cellVolumeA3({ ...cell, [key]: cell[key] + h }) - cellVolumeA3({ ...cell, [key]: cell[key] - h })) / (2 * h);
			expect(cellVolumeSuA3(cell, { [key]: 0.01 }) / Math.abs(numeric * 0.01)).toBeCloseTo(1, 6);
		}
	});
	it('is 0 with no uncertainties and throws for negative ones', () => {
		const cell = { a: 5, b: 6, c: 7, alphaDeg: 90, betaDeg: 100, gammaDeg: 90 };
		expect(cellVolumeSuA3(cell, {})).toBe(0);
		expect(() => cellVolumeSuA3(cell, { a: -0.1 })).toThrow('standard uncertainty of a must be a finite number >= 0, got -0.1');
	});
});
