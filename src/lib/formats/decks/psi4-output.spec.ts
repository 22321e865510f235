import { describe, expect, it } from 'vitest';
import crossOut from './fixtures/psi4_water_cross_g0p1100_e3p0000.out?raw';
import omegaOut from './fixtures/psi4_water_g0p3000_e3p0000.out?raw';
import notConvergedOut from './fixtures/psi4_water_not_converged.out?raw';
import tuningOut from './fixtures/psi4_water_tuning_g0p1100.out?raw';
import nwchemTuningOut from './fixtures/water_tuning_g0p1100.out?raw';
import { detectEngine, echoedParameters, readEngineOutput } from './engine-output';
import { EngineOutputError } from './errors';
import { readNwchemOutput } from './nwchem-output';
import { readPsi4Output } from './psi4-output';

// Real Psi4 1.3.2 outputs (Debian 12, fixtures/README.md): the three tuning states of water at gamma
// 0.11 bohr^-1 (neutral RKS, cation and anion UKS doublets), the screened cross-check run, an SCF
// stopped after 3 iterations, and a run stopped by "set_omega not implemented". Values below are
// transcribed from those files; the NWChem 7.0.2 run of the same tuning job is the outside check.

function refusal(text: string, read: (t: string) => unknown = readPsi4Output): EngineOutputError {
	try {
		read(text);
	} catch (e) {
		expect(e).toBeInstanceOf(EngineOutputError);
		return e as EngineOutputError;
	}
	throw new Error('the text was read');
}

describe('readPsi4Output: the three tuning states (psi4_water_tuning_g0p1100.out)', () => {
	const out = readPsi4Output(tuningOut);
	const [n, c, a] = out.tasks;

	it('version, completion, one task per energy() call with its molecule as title', () => {
		expect(out.engine).toBe('psi4');
		expect(out.version).toBe('1.3.2');
		expect(out.completed).toBe(true);
		expect(out.errors).toEqual([]);
		expect(out.tasks.map((t) => [t.title, t.reference, t.unrestricted])).toEqual([
			['water tuning neutral', 'RKS', false],
			['water tuning cation', 'UKS', true],
			['water tuning anion', 'UKS', true]
		]);
		expect(out.wallSeconds).toBeCloseTo(12.29, 6);
	});

	it('charge, multiplicity and electron counts per state', () => {
		expect(out.tasks.map((t) => [t.charge, t.multiplicity, t.electrons, t.alphaElectrons, t.betaElectrons, t.basisFunctions])).toEqual([
			[0, 1, 10, 5, 5, 19],
			[1, 2, 9, 5, 4, 19],
			[-1, 2, 11, 6, 5, 19]
		]);
	});

	it('total energies from the "@RKS/@UKS Final Energy" lines, converged, iterations counted', () => {
		expect(out.tasks.map((t) => t.totalEnergyHartree)).toEqual([-76.32766459142536, -75.87542259883396, -76.15748106811162]);
		expect(out.tasks.every((t) => t.converged)).toBe(true);
		expect(out.tasks.map((t) => t.iterations)).toEqual([9, 9, 10]);
	});

	it('orbital energies per spin with occupations: 2/0 restricted, 1/0 per spin unrestricted', () => {
		expect(n.alphaOrbitals).toHaveLength(19);
		expect(n.betaOrbitals).toBeNull();
		expect(n.alphaOrbitals.slice(0, 6).map((o) => [o.index, o.symmetry, o.occupation])).toEqual([
			[1, 'A', 2],
			[2, 'A', 2],
			[3, 'A', 2],
			[4, 'A', 2],
			[5, 'A', 2],
			[6, 'A', 0]
		]);
		expect(c.alphaOrbitals.filter((o) => o.occupation === 1)).toHaveLength(5);
		expect(c.betaOrbitals!.filter((o) => o.occupation === 1)).toHaveLength(4);
		expect(a.alphaOrbitals.filter((o) => o.occupation === 1)).toHaveLength(6);
		// Cation: "5A -0.922677" alpha HOMO, "6A -0.220702" alpha LUMO, "4A -0.891125" beta HOMO, "5A -0.559255" beta LUMO.
		expect(c.alphaFrontier).toEqual({ homoHartree: -0.922677, lumoHartree: -0.220702, homoIndex: 5, lumoIndex: 6 });
		expect(c.betaFrontier).toEqual({ homoHartree: -0.891125, lumoHartree: -0.559255, homoIndex: 4, lumoIndex: 5 });
		expect([c.homoHartree, c.lumoHartree]).toEqual([-0.891125, -0.559255]);
	});

	it('HOMO, LUMO and energy agree with what Psi4 itself computed from the wavefunction (the KAPPALINE lines)', () => {
		expect(out.summary.map((s) => s.label)).toEqual(['neutral', 'cation', 'anion']);
		out.summary.forEach((s, i) => {
			const t = out.tasks[i];
			expect(Math.abs(s.totalEnergyHartree - t.totalEnergyHartree!)).toBeLessThan(1e-9);
			expect(Math.abs(s.homoHartree - t.homoHartree!)).toBeLessThan(1e-6);
			expect(Math.abs(s.lumoHartree - t.lumoHartree!)).toBeLessThan(1e-6);
		});
	});

	it('the exact x_hf entry echoed from the input and the fractions Psi4 printed for each task', () => {
		expect(out.echoedRangeSeparation).toEqual([{ alpha: 0.2, beta: 0.8, gammaBohrInv: 0.11, hjsOmega: null, line: 95 }]);
		expect(echoedParameters(out)).toMatchObject({ alpha: 0.2, beta: 0.8, gammaBohrInv: 0.11, text: 'x_hf alpha 0.2, beta 0.8, omega 0.11' });
		for (const t of out.tasks) expect(t.printedExchange).toEqual({ hf: 0.2, hfLr: 0.8, omega: 0.11 });
		expect(out.warnings).toEqual([]);
	});

	it('agrees with NWChem 7.0.2 on the same job (water_tuning_g0p1100.out): energies to 1e-6, orbitals to 1e-5 hartree', () => {
		// Measured: |dE| = 6.9e-8, 2.7e-7, 8.0e-8 hartree; |dHOMO| <= 2.1e-6, |dLUMO| <= 4.3e-6 (cation), different grids.
		const nw = readNwchemOutput(nwchemTuningOut);
		expect(nw.tasks).toHaveLength(3);
		nw.tasks.forEach((t, i) => {
			const p = out.tasks[i];
			expect([p.charge, p.multiplicity]).toEqual([t.charge, t.multiplicity]);
			expect(Math.abs(p.totalEnergyHartree! - t.totalEnergyHartree!)).toBeLessThan(1e-6);
			expect(Math.abs(p.homoHartree! - t.homoHartree!)).toBeLessThan(1e-5);
			expect(Math.abs(p.lumoHartree! - t.lumoHartree!)).toBeLessThan(1e-5);
		});
	});
});

describe('readPsi4Output: failed runs are told apart', () => {
	it('SCF stopped after 3 iterations: not converged, the error with its line, run not completed', () => {
		const out = readPsi4Output(notConvergedOut);
		expect(out.completed).toBe(false);
		expect(out.tasks).toHaveLength(1);
		const t = out.tasks[0];
		expect(t.converged).toBe(false);
		expect(t.iterations).toBe(3);
		expect(t.totalEnergyHartree).toBeNull();
		expect(t.errors).toEqual([{ message: 'Could not converge SCF iterations in 3 iterations.', line: 301 }]);
		expect(out.errors).toEqual(t.errors);
	});

	it('set_omega refused by Psi4 1.3.2 before any SCF: no task, the fatal error, the HJS omega echoed', () => {
		const out = readPsi4Output(omegaOut);
		expect(out.tasks).toEqual([]);
		expect(out.completed).toBe(false);
		expect(out.errors).toEqual([{ message: 'LibXCfunctional: set_omega not implemented in Fedora package for input functional', line: 166 }]);
		expect(out.echoedRangeSeparation).toEqual([{ alpha: 0.2, beta: 0.133333333333, gammaBohrInv: 0.3, hjsOmega: 0.3, line: 94 }]);
	});

	it('the screened cross-check run: one RKS task, converged, HOMO/LUMO from the table', () => {
		const out = readPsi4Output(crossOut);
		expect(out.tasks.map((t) => [t.title, t.converged, t.totalEnergyHartree, t.homoHartree, t.lumoHartree])).toEqual([
			['water cross screened', true, -76.3252522788935, -0.297655, 0.08394]
		]);
		expect(out.tasks[0].printedExchange).toEqual({ hf: 0.2, hfLr: 0.1333, omega: 0.11 });
	});
});

describe('readPsi4Output: refusals and warnings', () => {
	it('a truncated output (cut inside the cation task) is refused with its last line', () => {
		const lines = tuningOut.split('\n');
		const cut = lines.slice(0, 500).join('\n');
		const e = refusal(cut);
		// Line 500 is blank: the error points at the last line with text, "0.2000 HF" of the cation task.
		expect(e.line).toBe(499);
		expect(e.message).toContain('the Psi4 output ends without Psi4\'s closing line ("*** Psi4 exiting successfully" or "*** Psi4 encountered an error"): it is truncated, or the run was killed or is still going');
	});

	it('an NWChem output, an empty text and other text are not Psi4 outputs', () => {
		expect(refusal(nwchemTuningOut).message).toBe('not a Psi4 output: no "Psi4: An Open-Source Ab Initio Electronic Structure Package" banner');
		expect(refusal('  \n').message).toBe('the output is empty');
	});

	it('warns when the short-range PBE exchange and the exact exchange use different omegas', () => {
		const edited = tuningOut.replace('"GGA_X_HJS_PBE": {"alpha": 0.8}', '"GGA_X_HJS_PBE": {"alpha": 0.8, "omega": 0.3}');
		expect(edited).not.toBe(tuningOut);
		expect(readPsi4Output(edited).warnings).toEqual([
			'line 95: the short-range PBE exchange (GGA_X_HJS_PBE) uses omega 0.3 but the exact exchange uses omega 0.11: the functional is not the SRSH the input describes'
		]);
		// Without an HJS omega libxc's default 0.11 applies: a warning whenever x_hf's omega differs.
		const other = tuningOut.replace('"omega": 0.11}', '"omega": 0.25}');
		expect(readPsi4Output(other).warnings[0]).toContain("uses omega 0.11 (libxc's default: the input sets none) but the exact exchange uses omega 0.25");
	});
});

describe('readEngineOutput: engine detection', () => {
	it('reads NWChem and Psi4 outputs with their own readers', () => {
		expect(detectEngine(tuningOut)).toBe('psi4');
		expect(detectEngine(nwchemTuningOut)).toBe('nwchem');
		expect(readEngineOutput(tuningOut).engine).toBe('psi4');
		expect(readEngineOutput(nwchemTuningOut).engine).toBe('nwchem');
		expect(readEngineOutput(nwchemTuningOut).tasks.map((t) => t.totalEnergyHartree)).toEqual(readNwchemOutput(nwchemTuningOut).tasks.map((t) => t.totalEnergyHartree));
	});

	it('refuses other programs by name and unknown text with the engines it reads', () => {
		expect(refusal(' Entering Gaussian System, Link 0=g16\n SCF Done:  E(RB3LYP) =  -76.4\n', readEngineOutput).message).toBe(
			'this looks like a Gaussian output; Kappaline reads NWChem 7.x and Psi4 outputs only'
		);
		expect(refusal('hello\n', readEngineOutput).message).toBe(
			"not an NWChem or Psi4 output: neither engine's banner was found (Kappaline reads NWChem 7.x and Psi4 outputs)"
		);
		expect(refusal('', readEngineOutput).message).toBe('the output is empty');
	});
});
