import { describe, expect, it } from 'vitest';
import { HARTREE_EV } from '../units';
import { CAUTIONS } from './cautions';
import { rerunLevels } from './rerun-levels';
import { solidStateLevels } from './solid-state-levels';

describe('solidStateLevels: IP_s = IP_g - P+, EA_s = EA_g + P-, gap_s = gap_g - (P+ + P-) (science notes, section 5)', () => {
	it('arithmetic by hand: IP 7.0, EA 1.0, P+ 1.1, P- 0.9 -> IP_s 5.9, EA_s 1.9, gap 6.0 -> 4.0', () => {
		const r = solidStateLevels({ ipGasEv: 7.0, eaGasEv: 1.0, pPlusEv: 1.1, pMinusEv: 0.9 });
		expect(r.ipSolidEv).toBeCloseTo(5.9, 14);
		expect(r.eaSolidEv).toBeCloseTo(1.9, 14);
		expect(r.gapGasEv).toBeCloseTo(6.0, 14);
		expect(r.gapSolidEv).toBeCloseTo(4.0, 14);
		expect(r.renormalizationEv).toBeCloseTo(2.0, 14);
		expect(r.gapSolidEv).toBeCloseTo(r.ipSolidEv - r.eaSolidEv, 14);
		expect(r.warnings).toEqual([]);
	});

	it('accepts a negative gas-phase EA (unbound anion)', () => {
		expect(solidStateLevels({ ipGasEv: 9, eaGasEv: -0.5, pPlusEv: 1, pMinusEv: 1 }).eaSolidEv).toBeCloseTo(0.5, 14);
	});

	it('warns when the polarization closes the gap', () => {
		const r = solidStateLevels({ ipGasEv: 5, eaGasEv: 2, pPlusEv: 2, pMinusEv: 2 });
		expect(r.gapSolidEv).toBeCloseTo(-1, 14);
		expect(r.warnings[0]).toMatch(/^the polarization energies \(4.00 eV\) close the gas-phase gap \(3.00 eV\)/);
	});

	it('validates inputs', () => {
		expect(() => solidStateLevels({ ipGasEv: 7, eaGasEv: 1, pPlusEv: -0.1, pMinusEv: 1 })).toThrow('pPlusEv must be >= 0, got -0.1');
		expect(() => solidStateLevels({ ipGasEv: 3, eaGasEv: 3, pPlusEv: 1, pMinusEv: 1 })).toThrow(
			'eaGasEv (3) must be below ipGasEv (3): the gas-phase gap IP - EA must be > 0'
		);
		expect(() => solidStateLevels({ ipGasEv: -1, eaGasEv: -3, pPlusEv: 1, pMinusEv: 1 })).toThrow(
			'ipGasEv must be > 0 (IP is a positive energy), got -1'
		);
	});
});

describe('rerunLevels: IP_s = -eps_HOMO, EA_s = -eps_LUMO of the screened run', () => {
	it('HOMO -0.25 Eh, LUMO -0.05 Eh -> 6.8028 eV, 1.3606 eV, gap 5.4423 eV (1 Eh = 27.211386245988 eV, CODATA 2018)', () => {
		// By hand: 0.25 x 27.211386245988 = 6.802846561497; 0.05 x 27.211386245988 = 1.360569312299.
		const r = rerunLevels({ homoSolidHartree: -0.25, lumoSolidHartree: -0.05 });
		expect(r.ipSolidEv).toBeCloseTo(6.802846561497, 11);
		expect(r.eaSolidEv).toBeCloseTo(1.360569312299, 11);
		expect(r.gapSolidEv).toBeCloseTo(0.2 * HARTREE_EV, 11);
		expect(r.impliedPPlusEv).toBeNull();
		expect(r.warnings).toEqual([]);
	});

	it('implied polarization energies from gas-phase values', () => {
		const r = rerunLevels({ homoSolidHartree: -0.25, lumoSolidHartree: -0.05, ipGasEv: 7.8, eaGasEv: 0.4 });
		expect(r.impliedPPlusEv).toBeCloseTo(7.8 - 6.802846561497, 11);
		expect(r.impliedPMinusEv).toBeCloseTo(1.360569312299 - 0.4, 11);
	});

	it('warns for a positive LUMO and refuses LUMO <= HOMO', () => {
		expect(rerunLevels({ homoSolidHartree: -0.2, lumoSolidHartree: 0.01 }).warnings).toEqual([
			'LUMO is above zero: the predicted solid-state EA is negative'
		]);
		expect(() => rerunLevels({ homoSolidHartree: -0.2, lumoSolidHartree: -0.3 })).toThrow(
			'LUMO (-0.3 Eh) must lie above HOMO (-0.2 Eh)'
		);
		expect(() => rerunLevels({ homoSolidHartree: NaN, lumoSolidHartree: -0.3 })).toThrow(
			'homoSolidHartree must be a finite number, got NaN'
		);
	});
});

describe('CAUTIONS (science notes, section 6)', () => {
	it('names the neglected effects and the check against measurement', () => {
		for (const word of ['estimates', 'dispersion', 'relaxation', 'disorder', 'interfaces', 'photoemission']) {
			expect(CAUTIONS).toContain(word);
		}
	});
});
