import { describe, expect, it } from 'vitest';
import gasOut from './fixtures/series_water_gas.out?raw';
import eps1 from './fixtures/series_water_eps1.out?raw';
import eps2 from './fixtures/series_water_eps2.out?raw';
import eps3 from './fixtures/series_water_eps3.out?raw';
import eps4 from './fixtures/series_water_eps4.out?raw';
import { readNwchemOutput } from './nwchem-output';

// Real NWChem 7.0.2 runs of decks written by this module (fixtures/README.md, "Screened series"):
// water, aug-cc-pVDZ, alpha 0.2, gamma 0.3 bohr^-1, screened neutral at epsilon 1..4.
const HARTREE_EV = 27.211386245988; // CODATA 2018
const runs = [eps1, eps2, eps3, eps4].map((t) => readNwchemOutput(t).tasks[0]);
const gap = (t: (typeof runs)[number]) => (t.lumoHartree! - t.homoHartree!) * HARTREE_EV;

describe('screened reruns through the real engine', () => {
	it('all runs converged', () => runs.forEach((t) => expect(t.converged).toBe(true)));

	it('at epsilon = 1 the screened neutral is the gas-phase tuned one (same energy and orbitals)', () => {
		const gasNeutral = readNwchemOutput(gasOut).tasks[0];
		expect(runs[0].totalEnergyHartree).toBeCloseTo(gasNeutral.totalEnergyHartree!, 9);
		expect(runs[0].homoHartree).toBeCloseTo(gasNeutral.homoHartree!, 6);
		expect(runs[0].lumoHartree).toBeCloseTo(gasNeutral.lumoHartree!, 6);
	});

	it('the HOMO-LUMO gap shrinks monotonically as epsilon grows from 1 to 4 (12.71 -> 8.55 eV)', () => {
		const gaps = runs.map(gap);
		for (let i = 1; i < gaps.length; i++) expect(gaps[i]).toBeLessThan(gaps[i - 1]);
		expect(gaps[0]).toBeCloseTo(12.714, 2);
		expect(gaps[3]).toBeCloseTo(8.552, 2);
	});

	it('the HOMO rises (IP_s = -eps_HOMO falls) and the LUMO falls (EA_s rises) with screening', () => {
		for (let i = 1; i < runs.length; i++) {
			expect(runs[i].homoHartree!).toBeGreaterThan(runs[i - 1].homoHartree!);
			expect(runs[i].lumoHartree!).toBeLessThan(runs[i - 1].lumoHartree!);
		}
	});
});
