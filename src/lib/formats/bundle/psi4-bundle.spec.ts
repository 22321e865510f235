import JSZip from 'jszip';
import { describe, expect, it } from 'vitest';
import psi4CrossOut from '../decks/fixtures/psi4_water_cross_g0p1100_e3p0000.out?raw';
import psi4NotConvergedOut from '../decks/fixtures/psi4_water_not_converged.out?raw';
import psi4TuningOut from '../decks/fixtures/psi4_water_tuning_g0p1100.out?raw';
import { DeckInputError, readPsi4Output, writePsi4ScreenedJob, writePsi4TuningJob } from '../decks';
import { type BundleInput, buildBundle, planBundle } from './build';
import { BundleInputError } from './errors';
import { ingestOutputs } from './ingest';
import { readManifest } from './manifest';
import { zipBundle } from './build';
import { pbsScript, runLocalScript, slurmScript } from './scripts';
import { sha256Hex } from './sha256';
import { BUNDLE_TOP_FILES, SO2_ATOMS, scanPointOf, so2BundleInput } from './so2.testdata';

// Psi4 bundles: the same layout as NWChem's with `.in` inputs written by writePsi4TuningJob /
// writePsi4ScreenedJob. Psi4 command line: `psi4 -n THREADS input -o output`, `-o stdout` writes the
// output to standard output (checked by hand with Debian's Psi4 1.3.2, `psi4 -n 1 x.in -o stdout > x.out`;
// its last line is "*** Psi4 exiting successfully. Buy a developer a beer!", as in the fixtures).

const psi4Settings = { basis: 'aug-cc-pvdz', scfType: 'df' as const, energyConvergence: 1e-8, memoryMb: 1000 };
const input = (over: Partial<BundleInput> = {}): BundleInput => so2BundleInput({ engine: 'psi4', settings: psi4Settings, ...over });

// The scripts themselves are run by tests/engine (bash run-local.sh of a real bundle, `bash -n` on all).

describe('planBundle with engine psi4: layout and decks', () => {
	it('one folder per gamma with one .in per state, one folder per epsilon, scripts and README at the top', async () => {
		const plan = await planBundle(input());
		expect(plan.files.map((f) => f.path)).toEqual([
			...BUNDLE_TOP_FILES,
			...['g0p2000', 'g0p3000', 'g0p4000'].flatMap((g) => ['neutral', 'cation', 'anion'].map((s) => `tuning/${g}/${s}.in`)),
			'screened/eps3p000/neutral.in',
			'screened/eps6p000/neutral.in'
		]);
	});

	it('each deck is exactly what the Psi4 writer gives for that job (combined layout and screened)', async () => {
		const plan = await planBundle(input({ tuning: { gammasBohrInv: [0.3], layout: 'combined' }, screened: { gammaBohrInv: 0.3, epsilons: [3], epsilonSource: 'user scalar' } }));
		const provenance = { molecule: 'sulfur dioxide (SO2)', polymorph: null, study: 'deck fixture runs', appVersion: '0.1.0', generatedAt: '2026-12-01T12:00:00.000Z' };
		const molecule = { atoms: SO2_ATOMS, charge: 0, multiplicity: 1 };
		const tuning = writePsi4TuningJob({ jobName: 'so2', molecule, alpha: 0.2, gammaBohrInv: 0.3, provenance, settings: psi4Settings }, { fileNames: 'state' });
		const screened = writePsi4ScreenedJob(
			{ jobName: 'so2', molecule, alpha: 0.2, gammaBohrInv: 0.3, epsilon: 3, provenance: { ...provenance, epsilonSource: 'user scalar' }, settings: psi4Settings },
			{ fileNames: 'state' }
		);
		expect(tuning.fileName).toBe('neutral-cation-anion.in');
		expect(plan.files.find((f) => f.path === 'tuning/g0p3000/neutral-cation-anion.in')?.text).toBe(tuning.text + '\n');
		expect(plan.files.find((f) => f.path === 'screened/eps3p000/neutral.in')?.text).toBe(screened.text + '\n');
	});

	it('every deck states that Psi4 >= 1.4 is needed to set omega, and sets omega = gamma', async () => {
		const plan = await planBundle(input());
		const decks = plan.files.filter((f) => f.role === 'deck');
		expect(decks).toHaveLength(11);
		for (const d of decks) {
			const prose = d.text.replace(/\n#\s+/g, ' ');
			expect(prose).toContain('Needs Psi4 1.4 or newer, which can set omega (gamma) on LibXC exchange functionals');
			expect(d.text).toContain(`"omega": ${d.deck?.gammaBohrInv}}`);
			expect(d.purpose).toMatch(/^Psi4 input \(Psi4 >= 1\.4\), /);
		}
		const screened6 = decks.find((d) => d.path === 'screened/eps6p000/neutral.in')!;
		expect(screened6.text).toContain('"x_hf": {"alpha": 0.2, "beta": -0.033333333333, "omega": 0.3}');
	});

	it('refuses NWChem-only settings by name, and unknown engines', async () => {
		await expect(planBundle(input({ settings: { basis: 'def2-svpd', grid: 'fine' } }))).rejects.toThrow(
			new BundleInputError('settings.grid', "grid is not a Psi4 setting (it is NWChem's); Psi4 settings are basis, scfType, energyConvergence, densityConvergence, maxIterations, memoryMb, radialPoints, sphericalPoints")
		);
		await expect(planBundle(so2BundleInput({ settings: { scfType: 'pk' } as never }))).rejects.toMatchObject({ field: 'settings.scfType' });
		await expect(planBundle(input({ engine: 'cp2k' as never }))).rejects.toMatchObject({ field: 'engine', message: expect.stringContaining('engine must be nwchem or psi4, got "cp2k"') });
		// The deck writer's own checks still apply (a grid that is not a Lebedev order).
		await expect(planBundle(input({ settings: { sphericalPoints: 100 } }))).rejects.toBeInstanceOf(DeckInputError);
	});
});

describe('Psi4 bundle manifest', () => {
	it('validates against the bundle schema, says engine psi4, lists every file with its SHA-256 and each output as .out', async () => {
		const plan = await planBundle(input());
		const m = readManifest(plan.files[1].text);
		expect(m.engine).toBe('psi4');
		expect(m.settings).toEqual({
			basis: 'aug-cc-pvdz',
			scfType: 'df',
			radialPoints: 99,
			sphericalPoints: 590,
			energyConvergenceHartree: 1e-8,
			densityConvergence: 1e-6,
			maxIterations: 100,
			memoryMbPerJob: 1000
		});
		for (const f of m.files) {
			const planned = plan.files.find((p) => p.path === f.path)!;
			expect(f.sha256).toBe(await sha256Hex(new TextEncoder().encode(planned.text)));
			if (f.role === 'deck') expect(f.deck?.output).toBe(f.path.replace(/\.in$/, '.out'));
		}
		expect(m.files.filter((f) => f.role === 'deck')).toHaveLength(11);
	});

	it('zips with the scripts executable, and the zip is the same bytes for the same request', async () => {
		const a = await buildBundle(input());
		expect(await sha256Hex(await buildBundle(input()))).toBe(await sha256Hex(a));
		const zip = await JSZip.loadAsync(a);
		expect(zip.file('kappaline_so2/run-local.sh')?.unixPermissions).toBe(0o100755);
		expect(zip.file('kappaline_so2/tuning/g0p2000/neutral.in')?.unixPermissions).toBe(0o100644);
	});
});

describe('Psi4 README and scripts', () => {
	it('README: Psi4 title, the version needed, psi4 commands and Psi4 cautions; no NWChem run instructions', async () => {
		const plan = await planBundle(input());
		const readme = plan.files[0].text;
		expect(readme).toContain('Kappaline run bundle: Psi4 inputs, scripts and manifest');
		expect(readme.replace(/\n\s+/g, ' ')).toContain('Needs Psi4 1.4 or newer, which can set omega (gamma) on LibXC exchange functionals');
		expect(readme).toContain('psi4 -n 4 neutral.in -o neutral.out');
		expect(readme).toContain('neutral.in (N electrons), cation.in (N-1), anion.in (N+1)');
		expect(readme).toContain('screened/eps6p000/neutral.in: epsilon = 6.0, beta = -0.033333333 (negative: legal)');
		expect(readme).toContain('set_omega not implemented');
		expect(readme).not.toContain('mpirun');
		expect(readme).not.toContain('"cam" line');
	});

	const ctx = { engine: 'psi4' as const, decks: ['tuning/g0p2000/neutral.in', 'screened/eps3p000/neutral.in'], title: 'SO2', settings: { cores: 8, time: '02:00:00', memory: '4G', account: 'chem42', partition: 'short', queue: 'workq', maxParallel: 5, jobName: 'kl_so2' } };

	it('run-local.sh: configurable PSI4 command and threads, psi4 -n N deck.in -o stdout > deck.out, finished = "Psi4 exiting successfully"', () => {
		const text = runLocalScript(ctx);
		expect(text.split('\n')[2]).toBe('# Kappaline run-local.sh: run every Psi4 deck of this bundle on this machine');
		const lines = text.split('\n');
		for (const line of [
			'NTHREADS="${NTHREADS:-8}"',
			'PSI4="${PSI4:-psi4}"',
			'  $PSI4 -n "$NTHREADS" "$1" -o stdout',
			'  name=$(basename "$deck" .in)',
			'  if (cd "$dir" && run_engine "$name.in" > "$name.out" 2> "$name.err") && finished "$out"; then',
			'  [ -f "$1" ] && grep -q "Psi4 exiting successfully" "$1"'
		])
			expect(lines).toContain(line);
		expect(text).not.toMatch(/mpirun|nwchem|Total times/);
	});

	it('submit-slurm.sh: one task with CORES threads per deck, configurable PSI4', () => {
		const text = slurmScript(ctx);
		expect(text).toContain('--ntasks=1 --cpus-per-task="$CORES"');
		expect(text).toContain('PSI4="${PSI4:-psi4}"');
		expect(text).toContain('  "$PSI4" -n "$CORES" "$1" -o stdout');
		expect(text).toContain('module load psi4');
		expect(text).toContain('run_engine "$name.in" > "$name.out" 2> "$name.err"');
		expect(text).not.toMatch(/srun nwchem|mpirun/);
	});

	it('submit-pbs.sh: select without mpiprocs, configurable PSI4', () => {
		const text = pbsScript(ctx);
		expect(text).toContain('RESOURCES="select=1:ncpus=${CORES}:mem=${MEMORY}"');
		expect(text).toContain('  "$PSI4" -n "$CORES" "$1" -o stdout');
		expect(text).not.toMatch(/mpirun|nwchem/);
	});

	it('refuses NWChem deck paths in Psi4 scripts and the reverse', () => {
		expect(() => runLocalScript({ ...ctx, decks: ['tuning/g0p2000/neutral.nw'] })).toThrow('unsafe or non-Psi4 deck path "tuning/g0p2000/neutral.nw"');
		expect(() => runLocalScript({ ...ctx, engine: 'nwchem', decks: ['tuning/g0p2000/neutral.in'] })).toThrow('unsafe or non-NWChem deck path');
	});

	it('the Psi4 scripts and README match their snapshots', async () => {
		const plan = await planBundle(input({ tuning: { gammasBohrInv: [0.3], layout: 'combined' }, screened: { gammaBohrInv: 0.3, epsilons: [3] } }));
		for (const path of ['run-local.sh', 'submit-slurm.sh', 'submit-pbs.sh', 'README.txt']) {
			expect(plan.files.find((f) => f.path === path)?.text).toMatchSnapshot(path);
		}
	});
});

describe('NWChem bundles are unchanged by the engine choice', () => {
	it('engine nwchem (explicit) and no engine give the same bytes', async () => {
		const a = await sha256Hex(await buildBundle(so2BundleInput()));
		expect(await sha256Hex(await buildBundle(so2BundleInput({ engine: 'nwchem' })))).toBe(a);
	});

	it('bundles recorded before the engine choice rebuild to the same files (SHA-256 of the SO2 manifest taken before the change)', async () => {
		// Stored bundles are rebuilt on download. The manifest lists the SHA-256 of every other file, so its
		// own digest pins every deck, script and README; this one was computed from the same request with the
		// code before Psi4 bundles existed (commit d4ff620). The zip container itself changed once since,
		// when the compression level went from 6 to 1 (bench/science/bundle-build.ts).
		const plan = await planBundle(so2BundleInput());
		expect(await sha256Hex(plan.files.find((f) => f.path === 'manifest.json')!.text)).toBe('3671b2a27db3d759ece2d144f8dac88d9e186302ccf1c09f668790f6481e3f22');
	});
});

describe('Psi4 bundle round trip: build -> outputs beside the inputs -> ingest', () => {
	// Real Psi4 1.3.2 outputs of water at gamma 0.11 bohr^-1 (decks/fixtures/README.md): the tuning
	// states and the screened neutral at epsilon 3. The inputs were the writer's with the HJS omega
	// left at libxc's default 0.11 (the one edit 1.3.2 needs), so x_hf matches the bundle exactly.
	const WATER = [
		{ element: 'O', x: 0, y: 0, z: 0.1173 },
		{ element: 'H', x: 0.7572, y: 0, z: -0.4692 },
		{ element: 'H', x: -0.7572, y: 0, z: -0.4692 }
	];
	const water = (): BundleInput => ({
		engine: 'psi4',
		molecule: { name: 'water', atoms: WATER, charge: 0, multiplicity: 1 },
		jobName: 'water',
		alpha: 0.2,
		tuning: { gammasBohrInv: [0.11], layout: 'combined' },
		screened: { gammaBohrInv: 0.11, epsilons: [3] },
		settings: { basis: '6-31G*', scfType: 'pk', energyConvergence: 1e-9, densityConvergence: 1e-8, memoryMb: 500 },
		appVersion: '0.1.0',
		createdAt: '2026-12-02T00:00:00.000Z'
	});
	async function withOutputs(outputs: Record<string, string>): Promise<Uint8Array> {
		const zip = await JSZip.loadAsync(await zipBundle(await planBundle(water())));
		for (const [path, text] of Object.entries(outputs)) zip.file(`kappaline_water/${path}`, text, { createFolders: false });
		return zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE' });
	}

	it('fills the scan point and the screened rerun from the Psi4 outputs, with no problems', async () => {
		const r = await ingestOutputs(
			await withOutputs({ 'tuning/g0p1100/neutral-cation-anion.out': psi4TuningOut, 'screened/eps3p000/neutral.out': psi4CrossOut })
		);
		expect(r.problems).toEqual([]);
		expect(r.manifest?.engine).toBe('psi4');
		expect(r.scanPoints).toEqual([scanPointOf(0.11, readPsi4Output(psi4TuningOut).tasks)]);
		// Transcribed: "@RKS Final Energy: -76.32766459142536", "@UKS Final Energy: -75.87542259883396".
		expect(r.scanPoints[0].eNeutralHartree).toBe(-76.32766459142536);
		expect(r.scanPoints[0].eCationHartree).toBe(-75.87542259883396);
		expect(r.screened.map((x) => [x.epsilon, x.totalEnergyHartree, x.homoHartree])).toEqual([[3, -76.3252522788935, -0.297655]]);
	});

	it('an SCF that stopped is reported as not converged with Psi4\'s message; a missing output is listed', async () => {
		const r = await ingestOutputs(await withOutputs({ 'screened/eps3p000/neutral.out': psi4NotConvergedOut }));
		expect(r.problems.filter((p) => p.code === 'parameter-mismatch')).toEqual([]);
		expect(r.problems.find((p) => p.code === 'not-converged')).toMatchObject({
			file: 'kappaline_water/screened/eps3p000/neutral.out',
			state: 'neutral',
			line: 301,
			message: 'the neutral task (line 146) did not converge: Could not converge SCF iterations in 3 iterations.'
		});
		expect(r.problems.find((p) => p.code === 'missing-output')).toMatchObject({ file: 'tuning/g0p1100/neutral-cation-anion.out' });
		expect(r.screened).toEqual([]);
	});

	it('a Psi4 output of another gamma is refused by its echoed x_hf entry', async () => {
		const r = await ingestOutputs(await withOutputs({ 'screened/eps3p000/neutral.out': psi4CrossOut.replace('"omega": 0.11}', '"omega": 0.3}') }));
		expect(r.problems.find((p) => p.severity === 'error')).toMatchObject({
			code: 'parameter-mismatch',
			message: expect.stringContaining('the run used x_hf alpha 0.2, beta 0.133333333333, omega 0.3, but screened/eps3p000/neutral.in stands for gamma 0.11, alpha 0.2, beta 0.1333')
		});
	});
});
