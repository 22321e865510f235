import { describe, expect, it } from 'vitest';
import { HARTREE_EV } from '$lib/science/units';
import so2G02 from './fixtures/so2_g0p2000.out?raw';
import so2G03 from './fixtures/so2_g0p3000.out?raw';
import so2G04 from './fixtures/so2_g0p4000.out?raw';
import so2Screened from './fixtures/so2_g0p3000_e3p0000.out?raw';
import waterPbe0Limit from './fixtures/water_pbe0_limit.out?raw';
import waterPbe0Reference from './fixtures/water_pbe0_reference.out?raw';
import waterLrcWriter from './fixtures/water_lrcwpbeh_writer.out?raw';
import waterLrcDoc from './fixtures/water_lrcwpbeh_doc.out?raw';
import waterNegativeBeta from './fixtures/water_negative_beta.out?raw';
import waterMisordered from './fixtures/water_cam_misordered.out?raw';
import waterNotConverged from './fixtures/water_not_converged.out?raw';
import waterBadBasis from './fixtures/water_bad_basis.out?raw';
import { EngineOutputError } from './errors';
import { type NwchemOutput, type NwchemTaskResult, frontierOrbitals, readNwchemOutput } from './nwchem-output';

// Every fixture is a real NWChem 7.0.2 run (Debian package nwchem 7.0.2-4) of the deck beside it,
// `mpirun --allow-run-as-root -np 2 nwchem <deck>.nw > <deck>.out`; see fixtures/README.md.

const scan = [
	{ gamma: 0.2, out: readNwchemOutput(so2G02) },
	{ gamma: 0.3, out: readNwchemOutput(so2G03) },
	{ gamma: 0.4, out: readNwchemOutput(so2G04) }
];
const screened = readNwchemOutput(so2Screened);

function states(o: NwchemOutput): { n: NwchemTaskResult; c: NwchemTaskResult; a: NwchemTaskResult } {
	const [n, c, a] = o.tasks;
	return { n, c, a };
}
const ev = (h: number | null) => (h as number) * HARTREE_EV;

describe('readNwchemOutput: SO2 tuning runs (fixtures so2_g0p*.out)', () => {
	it('reads version, start name, process count and completion', () => {
		const o = scan[1].out;
		expect(o.engine).toBe('nwchem');
		expect(o.version).toBe('7.0.2');
		expect(o.prefix).toBe('so2_g0p3000');
		expect(o.nproc).toBe(2);
		expect(o.completed).toBe(true);
		expect(o.errors).toEqual([]);
		expect(o.warnings).toEqual([]);
		expect(o.totalWallSeconds).toBeGreaterThan(0);
	});

	it('finds three tasks: neutral, cation, anion with their charge, multiplicity and spin treatment', () => {
		for (const { out } of scan) {
			expect(out.tasks.map((t) => [t.charge, t.multiplicity, t.electrons, t.unrestricted, t.converged])).toEqual([
				[0, 1, 32, false, true],
				[1, 2, 31, true, true],
				[-1, 2, 33, true, true]
			]);
			expect(out.tasks.map((t) => t.title?.split(' ').at(-4))).toEqual(['neutral', 'cation', 'anion']);
		}
	});

	it('reads total energies exactly as printed', () => {
		const { n, c, a } = states(scan[1].out);
		expect(n.totalEnergyHartree).toBe(-548.351480344136);
		expect(c.totalEnergyHartree).toBe(-547.89250011974);
		expect(a.totalEnergyHartree).toBe(-548.392055264659);
	});

	it('keeps the geometry frozen: identical nuclear repulsion in all three states', () => {
		for (const { out } of scan) {
			const e = out.tasks.map((t) => t.nuclearRepulsionHartree);
			expect(e[0]).toBeGreaterThan(100);
			expect(new Set(e).size).toBe(1);
		}
	});

	it('reads the exact cam values from the echoed deck and the 2-decimal values NWChem prints', () => {
		for (const { gamma, out } of scan) {
			expect(out.echoedCam.map(({ gammaBohrInv, alpha, beta }) => ({ gammaBohrInv, alpha, beta }))).toEqual([
				{ gammaBohrInv: gamma, alpha: 0.2, beta: 0.8 }
			]);
			for (const t of out.tasks) expect(t.rangeSeparation).toEqual({ alpha: 0.2, beta: 0.8, gamma, shortRangeHf: false });
		}
	});

	it('reads the functional terms: exact exchange 1.0, full PBE 0.0, short-range PBE 0.8 = beta', () => {
		expect(scan[0].out.tasks[0].xc).toEqual([
			{ name: 'Hartree-Fock (Exact) Exchange', weight: 1, part: null },
			{ name: 'PerdewBurkeErnzerhof Exchange Functional', weight: 0, part: null },
			{ name: 'LC-wPBE(h)Exchange Functional', weight: 0.8, part: null },
			{ name: 'Perdew 1991 LDA Correlation Functional', weight: 1, part: 'local' },
			{ name: 'PerdewBurkeErnz. Correlation Functional', weight: 1, part: 'non-local' }
		]);
	});

	it('takes HOMO and LUMO from occupations: restricted neutral 16/17, cation alpha 16 and beta 15', () => {
		const { n, c, a } = states(scan[1].out);
		expect(n.betaOrbitals).toBeNull();
		expect(n.alphaOrbitals).toHaveLength(73);
		expect(n.alphaOrbitals.filter((o) => o.occupation === 2)).toHaveLength(16);
		expect(n.alphaFrontier).toMatchObject({ homoIndex: 16, lumoIndex: 17 });
		expect(n.homoHartree).toBe(n.alphaOrbitals[15].energyHartree);
		expect(c.alphaFrontier).toMatchObject({ homoIndex: 16, lumoIndex: 17 });
		expect(c.betaFrontier).toMatchObject({ homoIndex: 15, lumoIndex: 16 });
		expect(a.alphaFrontier).toMatchObject({ homoIndex: 17, lumoIndex: 18 });
		// Over both spins: the anion's HOMO is its extra alpha electron.
		expect(a.homoHartree).toBe(a.alphaFrontier.homoHartree);
		expect(c.lumoHartree).toBe(c.betaFrontier?.lumoHartree);
	});

	it('reads <S^2> of the ions (small spin contamination) and SCF iteration counts', () => {
		const { n, c, a } = states(scan[1].out);
		expect(n.s2).toBeNull();
		expect(c.s2).toEqual({ value: 0.7651, exact: 0.75 });
		expect(a.s2).toEqual({ value: 0.7568, exact: 0.75 });
		expect(n.iterations).toBe(8);
		expect(c.wallSeconds).toBeGreaterThan(0);
	});

	it('energies change with gamma, so the cam line was honoured (> 1 mHa between scan points)', () => {
		const e = scan.map(({ out }) => out.tasks.map((t) => t.totalEnergyHartree as number));
		for (let s = 0; s < 3; s++) {
			expect(Math.abs(e[1][s] - e[0][s])).toBeGreaterThan(1e-3);
			expect(Math.abs(e[2][s] - e[1][s])).toBeGreaterThan(1e-3);
		}
	});

	it('-eps_HOMO approaches IP = E(N-1) - E(N) as gamma grows: J_IP falls through zero (science notes sec. 3)', () => {
		const rows = scan.map(({ gamma, out }) => {
			const { n, c, a } = states(out);
			const ip = ev((c.totalEnergyHartree as number) - (n.totalEnergyHartree as number));
			const ea = ev((n.totalEnergyHartree as number) - (a.totalEnergyHartree as number));
			return { gamma, ip, ea, jIp: ev(n.homoHartree) + ip, jEa: ev(a.homoHartree) + ea };
		});
		// SO2: measured vertical IP 12.35 eV and EA 1.1 eV; a double-zeta SRSH estimate within ~0.5 eV.
		for (const r of rows) {
			expect(r.ip).toBeGreaterThan(11.8);
			expect(r.ip).toBeLessThan(13.0);
			expect(r.ea).toBeGreaterThan(0.5);
			expect(r.ea).toBeLessThan(1.6);
		}
		expect(rows[0].jIp).toBeGreaterThan(rows[1].jIp);
		expect(rows[1].jIp).toBeGreaterThan(rows[2].jIp);
		expect(rows[0].jIp).toBeGreaterThan(0);
		expect(rows[2].jIp).toBeLessThan(0);
		expect(rows[0].jEa).toBeGreaterThan(0);
		expect(rows[2].jEa).toBeLessThan(0);
		// Near the crossing (gamma 0.4) the orbital and total-energy IPs agree to ~0.1 eV.
		expect(Math.abs(rows[2].jIp)).toBeLessThan(0.1);
		expect(rows[1].ip).toBeCloseTo(12.489, 3);
	});
});

describe('readNwchemOutput: SO2 screened rerun (fixture so2_g0p3000_e3p0000.out, untrimmed)', () => {
	const t = screened.tasks[0];
	const gas = scan[1].out.tasks[0];

	it('has one converged closed-shell neutral task and took the screened parameters', () => {
		expect(screened.tasks).toHaveLength(1);
		expect(t).toMatchObject({ charge: 0, multiplicity: 1, unrestricted: false, converged: true });
		expect(screened.echoedCam.map(({ gammaBohrInv, alpha, beta }) => [gammaBohrInv, alpha, beta])).toEqual([[0.3, 0.2, 0.133333333333]]);
		expect(t.rangeSeparation).toEqual({ alpha: 0.2, beta: 0.13, gamma: 0.3, shortRangeHf: false });
		expect(t.xc.map((x) => x.weight).slice(0, 3)).toEqual([1, 0.667, 0.133]);
	});

	it('gives a higher HOMO, lower LUMO and smaller gap than the gas-phase run at the same gamma', () => {
		const shiftHomo = ev(t.homoHartree) - ev(gas.homoHartree);
		const shiftLumo = ev(gas.lumoHartree) - ev(t.lumoHartree);
		expect(shiftHomo).toBeGreaterThan(1);
		expect(shiftLumo).toBeGreaterThan(1);
		expect(ev(t.lumoHartree) - ev(t.homoHartree)).toBeLessThan(ev(gas.lumoHartree) - ev(gas.homoHartree) - 2);
		expect(ev(t.homoHartree)).toBeCloseTo(-9.652, 2);
		expect(ev(gas.homoHartree)).toBeCloseTo(-12.123, 2);
	});

	it('keeps the same geometry as the tuning run', () => {
		expect(t.nuclearRepulsionHartree).toBe(gas.nuclearRepulsionHartree);
	});

	it('reads the untrimmed output to the same result as a copy with Windows line ends', () => {
		expect(readNwchemOutput(so2Screened.replace(/\n/g, '\r\n'))).toEqual(screened);
	});
});

describe('readNwchemOutput: translation checks against NWChem itself (water, 6-31G*)', () => {
	it('beta = 0, alpha = 0.25 deck gives the energy of NWChem\'s built-in pbe0 (within 1e-9 Ha)', () => {
		const limit = readNwchemOutput(waterPbe0Limit).tasks[0].totalEnergyHartree as number;
		const pbe0 = readNwchemOutput(waterPbe0Reference).tasks[0].totalEnergyHartree as number;
		expect(Math.abs(limit - pbe0)).toBeLessThan(1e-9);
	});

	it('gas-phase deck at alpha 0.2, gamma 0.2 gives the energy of the documented LRC-wPBEh lines exactly', () => {
		const writer = readNwchemOutput(waterLrcWriter).tasks[0];
		const doc = readNwchemOutput(waterLrcDoc).tasks[0];
		expect(writer.totalEnergyHartree).toBe(doc.totalEnergyHartree);
		expect(writer.homoHartree).toBe(doc.homoHartree);
	});

	it('a negative beta runs and converges', () => {
		const o = readNwchemOutput(waterNegativeBeta);
		expect(o.tasks[0].converged).toBe(true);
		expect(o.echoedCam[0].beta).toBe(-0.033333333333);
		expect(o.tasks[0].rangeSeparation?.beta).toBe(-0.03);
	});

	it('flags a cam line in the wrong order, which NWChem runs with alpha = beta = 0', () => {
		const o = readNwchemOutput(waterMisordered);
		expect(o.echoedCam).toEqual([]);
		expect(o.warnings).toEqual([
			'output line 20 (echoed input): cam line "cam 0.2 cam_beta 0.8 cam_alpha 0.2" is not "cam <gamma> cam_alpha <alpha> cam_beta <beta>"; NWChem then uses cam_alpha = cam_beta = 0'
		]);
		expect(o.tasks[0].rangeSeparation).toEqual({ alpha: 0, beta: 0, gamma: 0.2, shortRangeHf: false });
		const good = readNwchemOutput(waterLrcWriter).tasks[0].totalEnergyHartree as number;
		expect(Math.abs((o.tasks[0].totalEnergyHartree as number) - good)).toBeGreaterThan(1);
	});
});

describe('readNwchemOutput: failed runs', () => {
	it('an SCF stopped at its iteration limit is not converged, the error is reported and later states are missing', () => {
		const o = readNwchemOutput(waterNotConverged);
		expect(o.completed).toBe(false);
		expect(o.tasks).toHaveLength(1);
		expect(o.tasks[0].converged).toBe(false);
		expect(o.tasks[0].iterations).toBe(3);
		expect(o.tasks[0].totalEnergyHartree).toBe(-76.345408399332);
		expect(o.tasks[0].errors.map((e) => [e.message, e.code])).toEqual([['dft energy failed', 0]]);
		expect(o.errors.map((e) => e.message)).toEqual(['dft energy failed']);
		expect(o.hints).toEqual(['This type of error is most commonly associated with calculations not reaching convergence criteria']);
	});

	it('a basis set missing from the library is reported with NWChem\'s message', () => {
		const o = readNwchemOutput(waterBadBasis);
		expect(o.completed).toBe(false);
		expect(o.errors.map((e) => e.message)).toEqual(['bas_tag_lib: failed opening basis file']);
		expect(o.hints).toEqual(['There is an error in the specified basis set']);
		expect(o.tasks.every((t) => !t.converged && t.totalEnergyHartree === null)).toBe(true);
	});
});

describe('readNwchemOutput: input checks', () => {
	it('refuses empty text', () => {
		expect(() => readNwchemOutput('  \n')).toThrow(new EngineOutputError('the output is empty'));
	});

	it('refuses text that is not NWChem output', () => {
		expect(() => readNwchemOutput('  Psi4: An Open-Source Ab Initio Electronic Structure Package\n')).toThrow(
			'not an NWChem output: no "Northwest Computational Chemistry Package (NWChem)" banner'
		);
	});

	it('reads a truncated output (killed run) without throwing', () => {
		const cut = so2G03.slice(0, so2G03.indexOf('Total DFT energy'));
		const o = readNwchemOutput(cut);
		expect(o.completed).toBe(false);
		expect(o.tasks).toHaveLength(1);
		expect(o.tasks[0]).toMatchObject({ converged: false, totalEnergyHartree: null, charge: 0 });
	});
});

describe('frontierOrbitals', () => {
	it('uses occupations, not positions, and handles fractional occupations', () => {
		expect(
			frontierOrbitals([
				{ index: 1, occupation: 1, energyHartree: -0.5, symmetry: null },
				{ index: 2, occupation: 0.5, energyHartree: -0.3, symmetry: null },
				{ index: 3, occupation: 0, energyHartree: -0.1, symmetry: null },
				{ index: 4, occupation: 0, energyHartree: -0.2, symmetry: null }
			])
		).toEqual({ homoHartree: -0.3, lumoHartree: -0.2, homoIndex: 2, lumoIndex: 4 });
		expect(frontierOrbitals([])).toEqual({ homoHartree: null, lumoHartree: null, homoIndex: null, lumoIndex: null });
	});
});
