import { describe, expect, it } from 'vitest';
import { BOHR3_A3, BOHR_A, COULOMB_EV_A, HARTREE_EV, bohrInvToAngInv } from './units';

describe('units (CODATA 2018, NIST)', () => {
	it('hartree in eV matches CODATA 2018', () => expect(HARTREE_EV).toBe(27.211386245988));
	it('bohr in Å matches CODATA 2018', () => expect(BOHR_A).toBe(0.529177210903));
	it('e^2/(4 pi eps0) is 14.399645478 eV·Å (CODATA 2018 derived)', () =>
		expect(COULOMB_EV_A).toBeCloseTo(14.399645478, 8));
	it('bohr^3 is 0.148184711 Å^3 (CODATA 2018 derived)', () => expect(BOHR3_A3).toBeCloseTo(0.148184711, 8));
	it('gamma 0.2 bohr^-1 is 0.37795 Å^-1', () => expect(bohrInvToAngInv(0.2)).toBeCloseTo(0.377945, 5));
});
