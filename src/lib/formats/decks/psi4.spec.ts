import { describe, expect, it } from 'vitest';
import crossDeck from './fixtures/psi4_water_cross_g0p1100_e3p0000.in?raw';
import crossOut from './fixtures/psi4_water_cross_g0p1100_e3p0000.out?raw';
import failingDeck from './fixtures/psi4_water_g0p3000_e3p0000.in?raw';
import failingOut from './fixtures/psi4_water_g0p3000_e3p0000.out?raw';
import nwchemCross from './fixtures/water_cross_g0p1100_e3p0000.out?raw';
import { DeckInputError } from './errors';
import { readNwchemOutput } from './nwchem-output';
import { psi4FunctionalDict, writePsi4ScreenedJob, writePsi4TuningJob } from './psi4';
import { gasPhaseSrsh, screenedSrsh } from './srsh';

// References used below:
// [DICT] Psi4 source psi4/driver/procrouting/dft/dft_builder.py (docstring of the dictionary format:
//        x_functionals entries take "alpha" = weight and "omega"; x_hf takes "alpha" = global HF,
//        "beta" = long-range HF, "omega"), and psi4/driver/procrouting/dft/hyb_functionals.py, entry
//        wPBE0: GGA_X_HJS_PBE {omega 0.3, alpha 0.75} with x_hf {alpha 0.25, beta 0.75, omega 0.3}.
// [RUN]  Psi4 1.3.2 (Debian 12 package psi4 1:1.3.2+dfsg-5): see fixtures/README.md.

const water = {
	jobName: 'water',
	molecule: {
		charge: 0,
		multiplicity: 1,
		atoms: [
			{ element: 'O', x: 0, y: 0, z: 0.1173 },
			{ element: 'H', x: 0.7572, y: 0, z: -0.4692 },
			{ element: 'H', x: -0.7572, y: 0, z: -0.4692 }
		]
	},
	alpha: 0.2,
	gammaBohrInv: 0.3,
	provenance: { molecule: 'water', appVersion: '0.1.0' }
};

describe('psi4FunctionalDict', () => {
	it('gas phase reduces to the wPBE0 pattern: HJS weight 1 - alpha = beta, full PBE weight 0 [DICT]', () => {
		expect(psi4FunctionalDict(gasPhaseSrsh(0.25, 0.3))).toEqual([
			'srsh_pbe = {',
			'    "name": "kappaline_srsh_pbe",',
			'    "x_functionals": {',
			'        "GGA_X_HJS_PBE": {"alpha": 0.75, "omega": 0.3},',
			'        "GGA_X_PBE": {"alpha": 0.0},',
			'    },',
			'    "x_hf": {"alpha": 0.25, "beta": 0.75, "omega": 0.3},',
			'    "c_functionals": {',
			'        "GGA_C_PBE": {"alpha": 1.0},',
			'    },',
			'}'
		]);
	});

	it('screened epsilon = 3, alpha = 0.2: HJS weight beta, full-range PBE 1 - alpha - beta (science notes sec. 7)', () => {
		const d = psi4FunctionalDict(screenedSrsh(0.2, 0.3, 3)).join('\n');
		expect(d).toContain('"GGA_X_HJS_PBE": {"alpha": 0.133333333333, "omega": 0.3}');
		expect(d).toContain('"GGA_X_PBE": {"alpha": 0.666666666667}');
		expect(d).toContain('"x_hf": {"alpha": 0.2, "beta": 0.133333333333, "omega": 0.3}');
	});
});

describe('writePsi4TuningJob', () => {
	const deck = writePsi4TuningJob(water);

	it('writes three molecules (charges 0, +1, -1) with rks for the neutral and uks for the ions', () => {
		expect(deck.fileName).toBe('water_g0p3000.in');
		expect(deck.text).toContain('molecule water_neutral {\n0 1\n');
		expect(deck.text).toContain('molecule water_cation {\n1 2\n');
		expect(deck.text).toContain('molecule water_anion {\n-1 2\n');
		const refs = deck.text.match(/^set reference \w+$/gm);
		expect(refs).toEqual(['set reference rks', 'set reference uks', 'set reference uks']);
		expect(deck.text.match(/energy\("scf", dft_functional=srsh_pbe, molecule=water_\w+, return_wfn=True\)/g)).toHaveLength(3);
	});

	it('freezes the geometry (no reorientation, no centring, no symmetry)', () => {
		expect(deck.text.match(/^no_reorient$/gm)).toHaveLength(3);
		expect(deck.text.match(/^no_com$/gm)).toHaveLength(3);
		expect(deck.text.match(/^symmetry c1$/gm)).toHaveLength(3);
	});

	it('opens with the shared comment block and warns about Psi4 1.3.2 [RUN]', () => {
		expect(deck.text.startsWith('# ====')).toBe(true);
		expect(deck.text).toContain('#   gamma        = 0.3 bohr^-1 = 0.566918 Angstrom^-1');
		const prose = deck.text.replace(/\n#\s+/g, ' ');
		expect(prose).toContain('Needs Psi4 1.4 or newer, which can set omega (gamma) on LibXC exchange functionals: Psi4 1.3.2 (Debian 12) stops with "set_omega not implemented".');
	});

	it('groups the editable settings at the top', () => {
		const t = deck.text;
		expect(t.indexOf('memory 2000 mb')).toBeLessThan(t.indexOf('srsh_pbe = {'));
		expect(t).toContain('  basis aug-cc-pvdz\n  scf_type df\n  e_convergence 1e-8\n  d_convergence 1e-6\n  maxiter 100');
	});

	it('makes Python identifiers from job names with dashes', () => {
		expect(writePsi4TuningJob({ ...water, jobName: 'pc-61' }).text).toContain('molecule pc_61_neutral {');
	});

	it('refuses a grid that is not a Lebedev order and a doublet water', () => {
		expect(() => writePsi4TuningJob({ ...water, settings: { sphericalPoints: 500 } })).toThrow(DeckInputError);
		expect(() => writePsi4TuningJob({ ...water, molecule: { ...water.molecule, multiplicity: 2 } })).toThrow(
			'molecule.multiplicity: multiplicity 2 is impossible with 10 electrons'
		);
	});
});

describe('writePsi4ScreenedJob', () => {
	it('computes the neutral alone with beta = 1/epsilon - alpha, negative allowed', () => {
		const d = writePsi4ScreenedJob({ ...water, epsilon: 6 });
		expect(d.fileName).toBe('water_g0p3000_e6p0000.in');
		expect(d.text).toContain('"x_hf": {"alpha": 0.2, "beta": -0.033333333333, "omega": 0.3}');
		expect(d.text.match(/energy\("scf"/g)).toHaveLength(1);
		expect(d.states).toHaveLength(1);
	});
});

/** The header's comment lines about the Psi4 release needed (from "Needs" to the next note). */
function withoutVersionNote(text: string): string {
	return text.replace(/^# {3}Needs (a Psi4|Psi4 1\.4)[^\n]*\n(# {3}"set_omega[^\n]*\n|# {3}[^A-Z\n][^\n]*\n)*/m, '');
}

describe('Psi4 real runs (fixtures psi4_*.in / psi4_*.out, Psi4 1.3.2 from Debian 12)', () => {
	const small = { ...water, settings: { basis: '6-31G*', memoryMb: 500 } };

	it('the fixture input is what the writer produces, and Psi4 1.3.2 refuses its omega [RUN]', () => {
		// Equal apart from the header's version note, reworded after the run (a comment: Psi4 ignores it).
		expect(withoutVersionNote(writePsi4ScreenedJob({ ...small, epsilon: 3 }).text)).toBe(withoutVersionNote(failingDeck));
		expect(failingOut).toContain('Psi4 1.3.2 release');
		expect(failingOut).toContain('Fatal Error: LibXCfunctional: set_omega not implemented');
		expect(failingOut).toContain('x_func.set_omega(x_params["omega"])');
	});

	it('at the HJS default omega (0.11) Psi4 1.3.2 runs the deck and matches NWChem [RUN]', () => {
		// The only hand edit: the HJS omega removed (the value 0.11 is libxc's default), so 1.3.2 can run it.
		const written = writePsi4ScreenedJob({
			...water,
			gammaBohrInv: 0.11,
			epsilon: 3,
			jobName: 'water_cross',
			provenance: { molecule: 'water', study: 'cross-check NWChem vs Psi4 at gamma 0.11', appVersion: '0.1.0' },
			settings: { basis: '6-31G*', memoryMb: 500, scfType: 'pk', energyConvergence: 1e-9, densityConvergence: 1e-8 }
		}).text;
		expect(withoutVersionNote(written).replace('"GGA_X_HJS_PBE": {"alpha": 0.133333333333, "omega": 0.11}', '"GGA_X_HJS_PBE": {"alpha": 0.133333333333}')).toBe(withoutVersionNote(crossDeck));
		// Psi4 echoes the composite functional: HJS 0.1333, PBE 0.6667, long-range HF 0.1333 at omega 0.11, HF 0.2.
		expect(crossOut).toMatch(/0\.1333\s+XC_GGA_X_HJS_PBE/);
		expect(crossOut).toMatch(/0\.6667\s+XC_GGA_X_PBE/);
		expect(crossOut).toMatch(/0\.1333\s+HF,LR \[omega = 0\.1100\]/);
		expect(crossOut).toMatch(/0\.2000\s+HF \n/);
		const m = /KAPPALINE neutral\s+E = (\S+)\s+HOMO = (\S+)\s+LUMO = (\S+)/.exec(crossOut);
		expect(m).not.toBeNull();
		const [e, homo, lumo] = (m as RegExpExecArray).slice(1).map(Number);
		const nw = readNwchemOutput(nwchemCross).tasks[0];
		// Different grids and integral codes: agreement to 1e-6 hartree in energy and orbital energies.
		expect(Math.abs(e - (nw.totalEnergyHartree as number))).toBeLessThan(1e-6);
		expect(Math.abs(homo - (nw.homoHartree as number))).toBeLessThan(1e-6);
		expect(Math.abs(lumo - (nw.lumoHartree as number))).toBeLessThan(1e-6);
	});
});
