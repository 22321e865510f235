import { describe, expect, it } from 'vitest';
import so2TuningDeck from './fixtures/so2_g0p3000.nw?raw';
import so2ScreenedDeck from './fixtures/so2_g0p3000_e3p0000.nw?raw';
import { DeckInputError } from './errors';
import {
	type NwchemTuningJob,
	nwchemBasisType,
	nwchemFunctionalLines,
	writeNwchemScreenedJob,
	writeNwchemTuningJob,
	writeNwchemTuningScan,
	writeNwchemTuningStateDecks
} from './nwchem';
import { gasPhaseSrsh, screenedSrsh } from './srsh';

// References used below:
// [DOC]  NWChem documentation, "Density Functional Theory for Molecules", section Range-Separated
//        Functionals (nwchemgit.github.io/Density-Functional-Theory-for-Molecules.html): the cam line
//        "cam <real cam> cam_alpha <real cam_alpha> cam_beta <cam_beta>", the LRC-wPBEh example
//        "xc xwpbe 0.80 cpbe96 1.0 hfexch 1.00 / cam 0.2 cam_alpha 0.20 cam_beta 0.80", and the
//        sections ODFT and MULT, GRID, CONVERGENCE.
// [SRC]  NWChem source src/nwdft/input_dft/dft_input.F (directive 'cam'): reads the omega value, then
//        expects the keyword cam_alpha, then cam_beta, positionally.
// [RUN]  Real runs, NWChem 7.0.2 (Debian package nwchem 7.0.2-4), fixtures/ (see fixtures/README.md).

/** SO2 at its experimental geometry (r = 1.4308 Å, angle 119.33°): the fixture molecule. */
const r = 1.4308;
const half = ((119.33 / 2) * Math.PI) / 180;
const so2Atoms = [
	{ element: 'S', x: 0, y: 0, z: 0 },
	{ element: 'O', x: r * Math.sin(half), y: 0, z: -r * Math.cos(half) },
	{ element: 'O', x: -r * Math.sin(half), y: 0, z: -r * Math.cos(half) }
];
const so2Job = {
	jobName: 'so2',
	molecule: { atoms: so2Atoms, charge: 0, multiplicity: 1 },
	alpha: 0.2,
	provenance: { molecule: 'sulfur dioxide (SO2)', polymorph: null, study: 'deck fixture runs', appVersion: '0.1.0' },
	settings: { basis: 'aug-cc-pvdz', grid: 'fine' as const, energyConvergence: 1e-8, memoryMb: 1000 }
};
const tuning = (over: Partial<NwchemTuningJob> = {}): NwchemTuningJob => ({ ...so2Job, gammaBohrInv: 0.3, ...over });

function lines(text: string): string[] {
	return text.split('\n');
}
function codeLines(text: string): string[] {
	return lines(text)
		.map((l) => l.replace(/#.*$/, '').trim())
		.filter(Boolean);
}

describe('NWChem functional lines (science notes sec. 7)', () => {
	it('gas phase alpha = 0.2, gamma = 0.3: xwpbe beta, xpbe96 1-alpha-beta, then cam, cam_alpha, cam_beta [DOC]', () => {
		expect(nwchemFunctionalLines(gasPhaseSrsh(0.2, 0.3))).toEqual([
			'xc xwpbe 0.8 xpbe96 0.0 cpbe96 1.0 hfexch 1.0',
			'cam 0.3 cam_alpha 0.2 cam_beta 0.8'
		]);
	});

	it('gas phase at gamma 0.2 is the documented LRC-wPBEh up to the zero-weight xpbe96 term [DOC][RUN]', () => {
		// The run fixtures water_lrcwpbeh_writer.out and water_lrcwpbeh_doc.out give the same energy
		// (checked in nwchem-output.spec.ts), so "xpbe96 0.0" changes nothing.
		const [xc, cam] = nwchemFunctionalLines(gasPhaseSrsh(0.2, 0.2));
		expect(xc.replace(' xpbe96 0.0', '')).toBe('xc xwpbe 0.8 cpbe96 1.0 hfexch 1.0');
		expect(cam).toBe('cam 0.2 cam_alpha 0.2 cam_beta 0.8');
	});

	it('screened epsilon = 3, alpha = 0.2: beta = 1/3 - 0.2, long-range fraction 1/3 (science notes sec. 2)', () => {
		expect(nwchemFunctionalLines(screenedSrsh(0.2, 0.3, 3))).toEqual([
			'xc xwpbe 0.133333333333 xpbe96 0.666666666667 cpbe96 1.0 hfexch 1.0',
			'cam 0.3 cam_alpha 0.2 cam_beta 0.133333333333'
		]);
	});

	it('negative beta (1/epsilon < alpha) is written with its sign, not refused [RUN: fixtures/water_negative_beta.out converged]', () => {
		const p = screenedSrsh(0.2, 0.3, 6);
		expect(p.beta).toBeCloseTo(-1 / 30, 14);
		expect(nwchemFunctionalLines(p)).toEqual([
			'xc xwpbe -0.033333333333 xpbe96 0.833333333333 cpbe96 1.0 hfexch 1.0',
			'cam 0.3 cam_alpha 0.2 cam_beta -0.033333333333'
		]);
	});

	it('beta = 0 (epsilon = 1/alpha) is global PBE0 exchange [RUN: fixtures/water_pbe0_limit.out = water_pbe0_reference.out]', () => {
		expect(nwchemFunctionalLines(screenedSrsh(0.25, 0.3, 4))).toEqual([
			'xc xwpbe 0.0 xpbe96 0.75 cpbe96 1.0 hfexch 1.0',
			'cam 0.3 cam_alpha 0.25 cam_beta 0.0'
		]);
	});

	// [RUN] NWChem 7.0.2, water 6-31G*, alpha 0.2, beta 0.8: cam 0.31 gave E = -76.346807713235 Ha and
	// cam 0.314 gave E = -76.347231224541 Ha, both printed as "Gamma : 0.31", so the digits are used.
	it('keeps more than the 2 decimals NWChem echoes [RUN]', () => {
		expect(nwchemFunctionalLines(gasPhaseSrsh(0.2, 0.314159))[1]).toBe('cam 0.314159 cam_alpha 0.2 cam_beta 0.8');
	});
});

describe('writeNwchemTuningJob', () => {
	const deck = writeNwchemTuningJob(tuning());

	it('is byte-identical to the deck that produced the real run fixture so2_g0p3000.out [RUN]', () => {
		expect(deck.text + '\n').toBe(so2TuningDeck);
	});

	it('names the start after job and gamma, and the file and folder after it', () => {
		expect(deck.jobName).toBe('so2_g0p3000');
		expect(deck.fileName).toBe('so2_g0p3000.nw');
		expect(deck.folder).toBe('g0p3000');
		expect(codeLines(deck.text)).toContain('start so2_g0p3000');
		expect(codeLines(deck.text).filter((l) => l.startsWith('start '))).toHaveLength(1);
	});

	it('writes the cam line in the order cam, cam_alpha, cam_beta exactly once [SRC]', () => {
		const cam = codeLines(deck.text).filter((l) => /^cam\b/.test(l));
		expect(cam).toEqual(['cam 0.3 cam_alpha 0.2 cam_beta 0.8']);
		expect(codeLines(deck.text).filter((l) => /^xc\b/.test(l))).toEqual(['xc xwpbe 0.8 xpbe96 0.0 cpbe96 1.0 hfexch 1.0']);
	});

	it('has neutral, cation, anion in that order with charges, multiplicities and odft for the ions [DOC ODFT and MULT]', () => {
		expect(deck.states.map((s) => [s.label, s.charge, s.multiplicity, s.electrons, s.unrestricted])).toEqual([
			['neutral', 0, 1, 32, false],
			['cation', 1, 2, 31, true],
			['anion', -1, 2, 33, true]
		]);
		const code = codeLines(deck.text);
		const tasks = code.map((l, i) => (l === 'task dft energy' ? i : -1)).filter((i) => i >= 0);
		expect(tasks).toHaveLength(3);
		const block = (k: number) => code.slice(k === 0 ? 0 : tasks[k - 1] + 1, tasks[k]);
		expect(block(0)).toContain('charge 0');
		expect(block(0)).toContain('mult 1');
		expect(block(0)).not.toContain('odft');
		expect(block(1)).toEqual(expect.arrayContaining(['charge 1', 'odft', 'mult 2']));
		expect(block(2)).toEqual(expect.arrayContaining(['charge -1', 'odft', 'mult 2']));
	});

	it('gives every state its own orbital file and title', () => {
		const movecs = deck.states.map((s) => s.movecs);
		expect(movecs).toEqual(['so2_g0p3000_neutral.movecs', 'so2_g0p3000_cation.movecs', 'so2_g0p3000_anion.movecs']);
		expect(new Set(deck.states.map((s) => s.title)).size).toBe(3);
		for (const m of movecs) expect(deck.text).toContain(`vectors input atomic output ${m}`);
		for (const s of deck.states) expect(s.title.length).toBeLessThanOrEqual(72);
	});

	it('groups the editable settings at the top, before geometry and states', () => {
		const t = deck.text;
		const at = (s: string) => t.indexOf(s);
		expect(at('# ---- SETTINGS (editable)')).toBeGreaterThan(0);
		for (const s of ['memory total 1000 mb', 'basis spherical', '  * library aug-cc-pvdz', '  grid fine', '  convergence energy 1e-8', '  iterations 100']) {
			expect(at(s)).toBeGreaterThan(at('# ---- SETTINGS (editable)'));
			expect(at(s)).toBeLessThan(at('# ---- GEOMETRY'));
		}
		expect(at('# ---- GEOMETRY')).toBeLessThan(at('# ---- STATE 1 of 3'));
	});

	it('opens with a comment block: what it is, parameter meanings, gamma in bohr^-1 and Å^-1, provenance', () => {
		const head = lines(deck.text).slice(0, lines(deck.text).indexOf('echo'));
		expect(head.every((l) => l === '' || l.startsWith('#'))).toBe(true);
		const h = head.join('\n');
		expect(h).toContain('Kappaline deck for NWChem 7.x: SRSH-PBE gamma-tuning states at one gamma');
		expect(h).toContain('#   alpha        = 0.2   short-range exact-exchange fraction (r -> 0)');
		expect(h).toContain('#   alpha + beta = 1.0   long-range exact-exchange fraction (r -> infinity)');
		// 0.3 / 0.529177210903 = 0.566918 (CODATA 2018 bohr, science notes sec. 1)
		expect(h).toContain('#   gamma        = 0.3 bohr^-1 = 0.566918 Angstrom^-1   range-separation parameter');
		expect(h).toContain('#   molecule        : sulfur dioxide (SO2)');
		expect(h).toContain('#   polymorph       : (not given)');
		expect(h).toContain('#   study           : deck fixture runs');
		expect(h).toContain('#   epsilon source  : gas phase (epsilon = 1)');
		expect(h).toContain('#   app version     : Kappaline 0.1.0');
	});

	it('writes the geometry in Å with 10 decimals, unchanged for every state', () => {
		expect(deck.text).toContain('geometry units angstroms noautoz noautosym');
		expect(deck.text).toContain('  O        1.2349051531      0.0000000000     -0.7226326196');
		expect(deck.text.match(/^geometry /gm)).toHaveLength(1);
	});

	it('is deterministic and does not mutate the job', () => {
		const job = tuning();
		const before = JSON.stringify(job);
		expect(writeNwchemTuningJob(job).text).toBe(writeNwchemTuningJob(job).text);
		expect(JSON.stringify(job)).toBe(before);
	});

	it('uses odft for an open-shell neutral and singlet ions by parity (CH3 radical)', () => {
		const d = writeNwchemTuningJob({
			...tuning(),
			jobName: 'ch3',
			molecule: {
				charge: 0,
				multiplicity: 2,
				atoms: [
					{ element: 'C', x: 0, y: 0, z: 0 },
					{ element: 'H', x: 1.079, y: 0, z: 0 },
					{ element: 'H', x: -0.5395, y: 0.9344, z: 0 },
					{ element: 'H', x: -0.5395, y: -0.9344, z: 0 }
				]
			}
		});
		expect(d.states.map((s) => [s.label, s.electrons, s.multiplicity, s.unrestricted])).toEqual([
			['neutral', 9, 2, true],
			['cation', 8, 1, true],
			['anion', 10, 1, true]
		]);
		expect(codeLines(d.text).filter((l) => l === 'odft')).toHaveLength(3);
	});

	it('accepts ion multiplicity overrides that match parity (triplet anion of CH3)', () => {
		const d = writeNwchemTuningJob({
			...tuning(),
			jobName: 'ch3',
			anionMultiplicity: 3,
			molecule: {
				charge: 0,
				multiplicity: 2,
				atoms: [
					{ element: 'C', x: 0, y: 0, z: 0 },
					{ element: 'H', x: 1.079, y: 0, z: 0 },
					{ element: 'H', x: -0.5395, y: 0.9344, z: 0 },
					{ element: 'H', x: -0.5395, y: -0.9344, z: 0 }
				]
			}
		});
		expect(d.states[2].multiplicity).toBe(3);
	});

	it('chooses spherical functions for cc-/def2- sets and Cartesian for Pople sets', () => {
		expect(nwchemBasisType({ basis: 'aug-cc-pvdz', basisType: 'auto' })).toBe('spherical');
		expect(nwchemBasisType({ basis: 'def2-svpd', basisType: 'auto' })).toBe('spherical');
		expect(nwchemBasisType({ basis: '6-31+G*', basisType: 'auto' })).toBe('cartesian');
		expect(nwchemBasisType({ basis: '6-31G*', basisType: 'spherical' })).toBe('spherical');
	});

	it('derives the job name from the molecule when none is given', () => {
		const { jobName: _j, ...rest } = tuning();
		expect(writeNwchemTuningJob({ ...rest, provenance: { ...rest.provenance, molecule: 'Pentacene (α polymorph)' } }).jobName).toBe(
			'pentacene_polymorph_g0p3000'
		);
	});
});

describe('writeNwchemTuningJob refuses decks NWChem would get wrong', () => {
	const cases: [string, Partial<NwchemTuningJob>, string][] = [
		['alpha NaN', { alpha: Number.NaN }, 'alpha: alpha (short-range exact-exchange fraction) must be a finite number, got NaN'],
		['alpha > 1', { alpha: 1.2 }, 'alpha: alpha must lie in [0, 1], got 1.2'],
		['alpha < 0', { alpha: -0.1 }, 'alpha: alpha must lie in [0, 1], got -0.1'],
		['gamma 0', { gammaBohrInv: 0 }, 'gammaBohrInv: gamma must be > 0 bohr^-1, got 0'],
		['gamma negative', { gammaBohrInv: -0.3 }, 'gammaBohrInv: gamma must be > 0 bohr^-1, got -0.3'],
		['gamma infinite', { gammaBohrInv: Infinity }, 'gammaBohrInv: gamma (bohr^-1) must be a finite number, got Infinity'],
		['gamma in 1e-3 units', { gammaBohrInv: 300 }, 'gammaBohrInv: gamma = 300 bohr^-1 is outside [0.0001, 10]; is it in Å^-1 or scaled by 1e3?'],
		[
			'doublet SO2 (even electrons)',
			{ molecule: { atoms: so2Atoms, charge: 0, multiplicity: 2 } },
			'molecule.multiplicity: multiplicity 2 is impossible with 32 electrons (an even count needs an odd multiplicity: 1, 3, ...)'
		],
		['fractional charge', { molecule: { atoms: so2Atoms, charge: 0.5, multiplicity: 1 } }, 'molecule.charge: charge must be an integer, got 0.5'],
		[
			'unknown element',
			{ molecule: { atoms: [{ element: 'Xx', x: 0, y: 0, z: 0 }], charge: 0, multiplicity: 1 } },
			'molecule.atoms[0].element: unknown element symbol "Xx"'
		],
		[
			'non-finite coordinate',
			{ molecule: { atoms: [{ element: 'He', x: Number.NaN, y: 0, z: 0 }], charge: 0, multiplicity: 1 } },
			'molecule.atoms[0].x: coordinate must be a finite number in Å, got NaN'
		],
		[
			'duplicated atom',
			{ molecule: { atoms: [...so2Atoms, { ...so2Atoms[1] }], charge: 0, multiplicity: 1 } },
			'molecule.atoms[3]: atoms 2 and 4 are 0.0000 Å apart (< 0.1 Å): duplicated atom?'
		],
		[
			'hydrogen atom: cation without electrons',
			{ molecule: { atoms: [{ element: 'H', x: 0, y: 0, z: 0 }], charge: 0, multiplicity: 2 } },
			'cationMultiplicity: the state has 0 electrons; at least 1 is needed'
		],
		['ion multiplicity against parity', { cationMultiplicity: 1 }, 'cationMultiplicity: multiplicity 1 is impossible with 31 electrons (an odd count needs an even multiplicity: 2, 4, ...)'],
		['empty molecule', { molecule: { atoms: [], charge: 0, multiplicity: 1 } }, 'molecule.atoms: at least one atom is needed'],
		['basis with a space', { settings: { basis: 'aug cc pvdz' } }, 'settings.basis: basis must be one NWChem library name'],
		['basis with a semicolon (NWChem line separator)', { settings: { basis: 'sto-3g;task' } }, 'settings.basis: basis must be one NWChem library name'],
		['unknown grid', { settings: { grid: 'ultra' as never } }, 'settings.grid: grid must be one of xcoarse, coarse, medium, fine, xfine, huge, got "ultra"'],
		['convergence >= 1', { settings: { energyConvergence: 1 } }, 'settings.energyConvergence: threshold must be a finite number in (0, 1), got 1'],
		['memory too small', { settings: { memoryMb: 10 } }, 'settings.memoryMb: memoryMb must be an integer in [100, 10000000], got 10'],
		['job name with a space', { jobName: 'my job' }, 'jobName: job name must start with a letter'],
		['missing app version', { provenance: { molecule: 'SO2', appVersion: '' } }, 'provenance.appVersion: appVersion is required']
	];
	for (const [name, over, message] of cases) {
		it(`refuses ${name}`, () => {
			expect(() => writeNwchemTuningJob(tuning(over))).toThrow(DeckInputError);
			expect(() => writeNwchemTuningJob(tuning(over))).toThrow(message);
		});
	}

	it('names the offending field on the error', () => {
		try {
			writeNwchemTuningJob(tuning({ alpha: 2 }));
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(DeckInputError);
			expect((e as DeckInputError).field).toBe('alpha');
		}
	});
});

describe('writeNwchemTuningStateDecks', () => {
	it('writes one deck per state, each with its own start name', () => {
		const decks = writeNwchemTuningStateDecks(tuning());
		expect(decks.map((d) => d.jobName)).toEqual(['so2_g0p3000_neutral', 'so2_g0p3000_cation', 'so2_g0p3000_anion']);
		for (const d of decks) {
			expect(d.folder).toBe('g0p3000');
			expect(codeLines(d.text).filter((l) => l === 'task dft energy')).toHaveLength(1);
			expect(codeLines(d.text)).toContain(`start ${d.jobName}`);
		}
		expect(codeLines(decks[2].text)).toEqual(expect.arrayContaining(['charge -1', 'odft', 'mult 2']));
	});
});

describe('writeNwchemTuningScan', () => {
	const scan = { ...so2Job, gammasBohrInv: [0.1, 0.15, 0.2, 0.3125] };

	it('returns one deck per gamma with folder-friendly, unique names', () => {
		const decks = writeNwchemTuningScan(scan);
		expect(decks.map((d) => d.folder)).toEqual(['g0p1000', 'g0p1500', 'g0p2000', 'g0p3125']);
		expect(decks.map((d) => d.fileName)).toEqual(['so2_g0p1000.nw', 'so2_g0p1500.nw', 'so2_g0p2000.nw', 'so2_g0p3125.nw']);
		for (const d of decks) expect(d.folder).toMatch(/^[a-z0-9]+$/);
		expect(decks[3].text).toContain('cam 0.3125 cam_alpha 0.2 cam_beta 0.8');
	});

	it('per-state layout gives three decks per gamma and unique start names overall', () => {
		const decks = writeNwchemTuningScan(scan, { layout: 'per-state' });
		expect(decks).toHaveLength(12);
		expect(new Set(decks.map((d) => d.jobName)).size).toBe(12);
	});

	it('refuses duplicated gammas, empty scans and an unknown layout', () => {
		expect(() => writeNwchemTuningScan({ ...scan, gammasBohrInv: [0.2, 0.3, 0.2] })).toThrow(
			'gammasBohrInv[2]: gamma 0.2 duplicates gammasBohrInv[0] = 0.2 (tag g0p2000)'
		);
		expect(() => writeNwchemTuningScan({ ...scan, gammasBohrInv: [] })).toThrow('gammasBohrInv: at least one gamma is needed');
		expect(() => writeNwchemTuningScan({ ...scan, gammasBohrInv: [0.2, -1] })).toThrow('gammasBohrInv[1]: gamma must be > 0 bohr^-1, got -1');
		expect(() => writeNwchemTuningScan(scan, { layout: 'zip' as never })).toThrow('layout: layout must be combined or per-state, got "zip"');
	});
});

describe('writeNwchemScreenedJob', () => {
	const deck = writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: 3, provenance: { ...so2Job.provenance, epsilonSource: 'user scalar' } });

	it('is byte-identical to the deck that produced the real run fixture so2_g0p3000_e3p0000.out [RUN]', () => {
		const fixtureDeck = writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: 3 });
		expect(fixtureDeck.text + '\n').toBe(so2ScreenedDeck);
	});

	it('computes only the neutral, with beta = 1/epsilon - alpha and gamma unchanged', () => {
		expect(deck.kind).toBe('screened');
		expect(deck.jobName).toBe('so2_g0p3000_e3p0000');
		expect(deck.folder).toBe('screened_e3p0000');
		expect(deck.states.map((s) => [s.label, s.charge, s.multiplicity])).toEqual([['neutral', 0, 1]]);
		expect(codeLines(deck.text).filter((l) => l === 'task dft energy')).toHaveLength(1);
		expect(deck.parameters.beta).toBeCloseTo(1 / 3 - 0.2, 15);
		expect(deck.text).toContain('#   alpha + beta = 0.333333333333   long-range exact-exchange fraction (r -> infinity) = 1/epsilon');
		expect(deck.text).toContain('#   epsilon source  : user scalar');
		expect(deck.text).toContain('IP_s ~ -eps_HOMO');
	});

	it('notes a negative beta in the header', () => {
		const d = writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: 6 });
		expect(d.text).toContain('#   beta         = -0.033333333333   long-range minus short-range fraction (negative: 1/epsilon < alpha, legal)');
	});

	it('refuses epsilon < 1 and non-finite epsilon', () => {
		expect(() => writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: 0.8 })).toThrow('epsilon: epsilon must be >= 1, got 0.8');
		expect(() => writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: Number.NaN })).toThrow(
			'epsilon: epsilon (dielectric constant) must be a finite number, got NaN'
		);
	});
});

describe('deck file names (option fileNames)', () => {
	it('default: named after the start name, as before', () => {
		expect(writeNwchemTuningJob(tuning()).fileName).toBe('so2_g0p3000.nw');
		expect(writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: 3 }).fileName).toBe('so2_g0p3000_e3p0000.nw');
	});

	it("'state': named after the states, start names unchanged, run line follows the file name", () => {
		const combined = writeNwchemTuningJob(tuning(), { fileNames: 'state' });
		expect(combined.fileName).toBe('neutral-cation-anion.nw');
		expect(codeLines(combined.text)).toContain('start so2_g0p3000');
		expect(combined.text).toContain('#   Run: mpirun -np 2 nwchem neutral-cation-anion.nw > neutral-cation-anion.out');
		const perState = writeNwchemTuningStateDecks(tuning(), { fileNames: 'state' });
		expect(perState.map((d) => [d.fileName, d.jobName])).toEqual([
			['neutral.nw', 'so2_g0p3000_neutral'],
			['cation.nw', 'so2_g0p3000_cation'],
			['anion.nw', 'so2_g0p3000_anion']
		]);
		const scan = writeNwchemTuningScan({ ...so2Job, gammasBohrInv: [0.2, 0.3] }, { layout: 'per-state', fileNames: 'state' });
		expect(scan.map((d) => `${d.folder}/${d.fileName}`)).toEqual([
			'g0p2000/neutral.nw',
			'g0p2000/cation.nw',
			'g0p2000/anion.nw',
			'g0p3000/neutral.nw',
			'g0p3000/cation.nw',
			'g0p3000/anion.nw'
		]);
		expect(writeNwchemScreenedJob({ ...so2Job, gammaBohrInv: 0.3, epsilon: 3 }, { fileNames: 'state' }).fileName).toBe('neutral.nw');
	});

	it('refuses an unknown naming', () => {
		expect(() => writeNwchemTuningJob(tuning(), { fileNames: 'gamma' as 'state' })).toThrow(DeckInputError);
		expect(() => writeNwchemTuningJob(tuning(), { fileNames: 'gamma' as 'state' })).toThrow('fileNames: fileNames must be start or state, got "gamma"');
	});
});
