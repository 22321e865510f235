import { describe, expect, it } from 'vitest';
import { bornPolarizationEv } from './born-polarization-ev';
import { epsilonSweep } from './epsilon-sweep';
import { imageChargePolarizationEv } from './image-charge-polarization-ev';

const base = { alpha: 0.2, ipGasEv: 7.5, eaGasEv: 0.8, radiusA: 5 };

describe('epsilonSweep', () => {
	it('grid 1..4 by 0.5 gives 7 rows ending exactly at 4', () => {
		const s = epsilonSweep({ ...base, epsilons: { from: 1, to: 4, step: 0.5 } });
		expect(s.rows.map((r) => r.epsilon)).toEqual([1, 1.5, 2, 2.5, 3, 3.5, 4]);
		expect(s.gapGasEv).toBeCloseTo(6.7, 14);
	});

	it('grid 1..4 by 0.1 includes 4 despite floating-point steps (31 rows, clean values)', () => {
		const s = epsilonSweep({ ...base, epsilons: { from: 1, to: 4, step: 0.1 } });
		expect(s.rows).toHaveLength(31);
		expect(s.rows[30].epsilon).toBe(4);
		expect(s.rows[3].epsilon).toBe(1.3);
	});

	it('rows agree with the single-value routines (Born a = 5 Å, eps = 3: P = 0.9599763652 eV by hand)', () => {
		const s = epsilonSweep({ ...base, epsilons: [3] });
		const r = s.rows[0];
		expect(r.bornEv).toBeCloseTo(0.9599763652, 9);
		expect(r.pEv).toBe(r.bornEv);
		expect(r.imageChargeEv).toBeNull();
		expect(r.beta).toBeCloseTo(1 / 3 - 0.2, 15);
		expect(r.longRange).toBeCloseTo(1 / 3, 15);
		expect(r.ipSolidEv).toBeCloseTo(7.5 - 0.9599763652, 9);
		expect(r.eaSolidEv).toBeCloseTo(0.8 + 0.9599763652, 9);
		expect(r.gapSolidEv).toBeCloseTo(6.7 - 2 * 0.9599763652, 9);
	});

	it('an image-charge term adds a constant to P for every row', () => {
		const image = { distanceA: 3.5, substrateEpsilon: 'metal' as const };
		const s = epsilonSweep({ ...base, epsilons: [1, 2.5, 4], imageCharge: image });
		const pImage = imageChargePolarizationEv(image);
		for (const r of s.rows) {
			expect(r.imageChargeEv).toBe(pImage);
			expect(r.pEv).toBeCloseTo(bornPolarizationEv({ radiusA: 5, epsilon: r.epsilon }) + pImage, 14);
		}
	});

	it('keeps the order of an explicit list and flags negative beta (eps > 1/alpha = 5)', () => {
		const s = epsilonSweep({ ...base, epsilons: [6, 2, 4] });
		expect(s.rows.map((r) => r.epsilon)).toEqual([6, 2, 4]);
		expect(s.rows.map((r) => r.betaNegative)).toEqual([true, false, false]);
		expect(s.warnings).toEqual(['beta is negative where 1/epsilon < alpha (epsilon > 5); this is legal']);
	});

	it('warns where the estimate closes the gap', () => {
		const s = epsilonSweep({ alpha: 0, ipGasEv: 5, eaGasEv: 3, radiusA: 3, epsilons: [1, 2, 10] });
		expect(s.warnings[0]).toMatch(/closes the gap at 2 epsilon value\(s\) \(first: 2\)/);
	});

	it('validates the grid and caps the number of rows', () => {
		expect(() => epsilonSweep({ ...base, epsilons: { from: 1, to: 4, step: 0 } })).toThrow('epsilons.step must be > 0, got 0');
		expect(() => epsilonSweep({ ...base, epsilons: { from: 1, to: 4, step: -0.5 } })).toThrow(
			'epsilons.step must be > 0, got -0.5'
		);
		expect(() => epsilonSweep({ ...base, epsilons: { from: 4, to: 1, step: 0.5 } })).toThrow(
			'epsilons.to (1) must not be below epsilons.from (4)'
		);
		expect(() => epsilonSweep({ ...base, epsilons: { from: 0.5, to: 4, step: 0.5 } })).toThrow(
			'epsilons.from must be >= 1, got 0.5'
		);
		expect(() => epsilonSweep({ ...base, epsilons: { from: 1, to: 1000, step: 0.001 } })).toThrow(
			'the grid 1..1000 by 0.001 has 999001 rows; at most 2000 are allowed (use a larger step)'
		);
		expect(epsilonSweep({ ...base, epsilons: { from: 1, to: 2.999, step: 0.001 } }).rows).toHaveLength(2000);
		expect(() => epsilonSweep({ ...base, epsilons: { from: 1, to: 5, step: 1 } }, { maxRows: 3 })).toThrow(
			'at most 3 are allowed'
		);
		expect(() => epsilonSweep({ ...base, epsilons: [] })).toThrow('epsilons must not be empty');
		expect(() => epsilonSweep({ ...base, epsilons: [2, 0.9] })).toThrow('epsilons[1] must be >= 1, got 0.9');
	});

	it('never returns NaN', () => {
		const s = epsilonSweep({ ...base, epsilons: { from: 1, to: 50, step: 0.25 } });
		for (const r of s.rows) for (const v of Object.values(r)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
	});
});
