import JSZip from 'jszip';
import { describe, expect, it } from 'vitest';
import so2TuningDeck from '../decks/fixtures/so2_g0p3000.nw?raw';
import so2ScreenedDeck from '../decks/fixtures/so2_g0p3000_e3p0000.nw?raw';
import { DeckInputError } from '../decks';
import { type BundleInput, buildBundle, planBundle } from './build';
import { so2BundleInput } from './so2.testdata';
import { BundleInputError } from './errors';
import { readManifest } from './manifest';
import { sha256Hex } from './sha256';

const input = so2BundleInput;

describe('planBundle: folder layout', () => {
	it('one folder per gamma with one deck per state, one folder per epsilon, scripts and README at the top', async () => {
		const plan = await planBundle(input());
		expect(plan.rootFolder).toBe('kappaline_so2');
		expect(plan.files.map((f) => f.path)).toEqual([
			'README.txt',
			'manifest.json',
			'run-local.sh',
			'submit-slurm.sh',
			'submit-pbs.sh',
			'tuning/g0p2000/neutral.nw',
			'tuning/g0p2000/cation.nw',
			'tuning/g0p2000/anion.nw',
			'tuning/g0p3000/neutral.nw',
			'tuning/g0p3000/cation.nw',
			'tuning/g0p3000/anion.nw',
			'tuning/g0p4000/neutral.nw',
			'tuning/g0p4000/cation.nw',
			'tuning/g0p4000/anion.nw',
			'screened/eps3p000/neutral.nw',
			'screened/eps6p000/neutral.nw'
		]);
	});

	it('combined layout: the three states in one deck per gamma', async () => {
		const plan = await planBundle(input({ tuning: { gammasBohrInv: [0.3], layout: 'combined' }, screened: null }));
		expect(plan.files.filter((f) => f.role === 'deck').map((f) => f.path)).toEqual(['tuning/g0p3000/neutral-cation-anion.nw']);
	});

	it('combined deck equals the deck of the real run fixture so2_g0p3000.nw except for the time stamp and run line', async () => {
		const plan = await planBundle(input({ tuning: { gammasBohrInv: [0.3], layout: 'combined' }, screened: null }));
		const deck = plan.files.find((f) => f.role === 'deck')?.text as string;
		const fixture = so2TuningDeck.split('\n');
		expect(deck.split('\n')).toContain('#   generated at    : 2026-12-01T12:00:00.000Z');
		const ours = deck.split('\n').filter((l) => !l.includes('generated at'));
		expect(ours).toHaveLength(fixture.length);
		expect(ours.filter((l, i) => l !== fixture[i])).toEqual(['#   Run: mpirun -np 2 nwchem neutral-cation-anion.nw > neutral-cation-anion.out']);
	});

	it('screened deck at epsilon 3 equals the fixture so2_g0p3000_e3p0000.nw apart from stamp, epsilon source and run line', async () => {
		const plan = await planBundle(input({ tuning: null, screened: { gammaBohrInv: 0.3, epsilons: [3] } }));
		const deck = plan.files.find((f) => f.path === 'screened/eps3p000/neutral.nw')?.text as string;
		const ours = deck.split('\n').filter((l) => !l.includes('generated at'));
		const fixture = so2ScreenedDeck.split('\n');
		expect(ours).toHaveLength(fixture.length);
		expect(ours.filter((l, i) => l !== fixture[i])).toEqual(['#   Run: mpirun -np 2 nwchem neutral.nw > neutral.out']);
	});

	it('every deck and script begins with a comment block saying what it is', async () => {
		const plan = await planBundle(input());
		for (const f of plan.files.filter((x) => x.role === 'deck')) {
			expect(f.text.split('\n').slice(0, 3).every((l) => l.startsWith('#')), f.path).toBe(true);
			expect(f.text.split('\n')[1], f.path).toMatch(/^# Kappaline deck for NWChem 7\.x/);
		}
		for (const f of plan.files.filter((x) => x.role === 'script')) {
			const lines = f.text.split('\n');
			expect(lines[0]).toBe('#!/usr/bin/env bash');
			expect(lines[2]).toMatch(new RegExp(`^# Kappaline ${f.path.replace('.', '\\.')}: `));
		}
	});

	it('the manifest lists every other file with purpose, size and SHA-256, and reads back', async () => {
		const plan = await planBundle(input());
		const m = readManifest(plan.files[1].text);
		expect(m).toEqual(plan.manifest);
		expect(m.files.map((f) => f.path)).toEqual(plan.files.filter((f) => f.path !== 'manifest.json').map((f) => f.path));
		for (const f of plan.files) {
			expect(f.sha256).toBe(await sha256Hex(f.text));
			expect(f.bytes).toBe(new TextEncoder().encode(f.text).length);
		}
		expect(m.molecule).toMatchObject({ name: 'sulfur dioxide (SO2)', formula: 'O2S', charge: 0, multiplicity: 1, electrons: 32 });
		expect(m.molecule.geometry.atoms).toHaveLength(3);
		expect(m.states).toEqual([
			{ label: 'neutral', charge: 0, multiplicity: 1, electrons: 32, unrestricted: false },
			{ label: 'cation', charge: 1, multiplicity: 2, electrons: 31, unrestricted: true },
			{ label: 'anion', charge: -1, multiplicity: 2, electrons: 33, unrestricted: true }
		]);
		expect(m).toMatchObject({ schemaVersion: 1, engine: 'nwchem', basis: 'aug-cc-pvdz', app: { name: 'Kappaline', version: '0.1.0' }, createdAt: '2026-12-01T12:00:00.000Z' });
		expect(m.tuning).toEqual({ alpha: 0.2, beta: 0.8, gammasBohrInv: [0.2, 0.3, 0.4], layout: 'per-state' });
		expect(m.screened?.runs.map((x) => [x.epsilon, x.folder])).toEqual([
			[3, 'screened/eps3p000'],
			[6, 'screened/eps6p000']
		]);
		// science notes sec. 2: beta = 1/epsilon - alpha, negative when 1/epsilon < alpha
		expect(m.screened?.runs[0].beta).toBeCloseTo(1 / 3 - 0.2, 15);
		expect(m.screened?.runs[1].beta).toBeCloseTo(1 / 6 - 0.2, 15);
		const cation = m.files.find((f) => f.path === 'tuning/g0p2000/cation.nw');
		expect(cation?.deck).toEqual({
			kind: 'tuning',
			jobName: 'so2_g0p2000_cation',
			alpha: 0.2,
			beta: 0.8,
			gammaBohrInv: 0.2,
			epsilon: 1,
			states: ['cation'],
			output: 'tuning/g0p2000/cation.out'
		});
		expect(cation?.purpose).toBe('NWChem deck, gas-phase tuning at gamma = 0.2 bohr^-1, alpha = 0.2: cation (charge 1, multiplicity 2)');
	});

	it('the README names the folders, how to run and bring back, and the cautions', async () => {
		const readme = (await planBundle(input())).files[0].text;
		for (const s of ['tuning/', 'screened/', 'bash run-local.sh', 'bash submit-slurm.sh', 'bash submit-pbs.sh', 'HOW TO BRING THE OUTPUTS BACK', 'CAUTIONS', 'band dispersion', 'cam_alpha', 'eps6p000/neutral.nw: epsilon = 6.0, beta = -0.033333333 (negative: legal)']) {
			expect(readme).toContain(s);
		}
	});
});

describe('buildBundle: the zip', () => {
	it('unpacks into one folder with executable scripts and the planned bytes', async () => {
		const bytes = await buildBundle(input());
		const plan = await planBundle(input());
		const zip = await JSZip.loadAsync(bytes);
		const names = Object.keys(zip.files);
		expect(names).toEqual(plan.files.map((f) => `kappaline_so2/${f.path}`));
		for (const f of plan.files) {
			const entry = zip.file(`kappaline_so2/${f.path}`);
			expect(await entry?.async('string')).toBe(f.text);
			expect(Number(entry?.unixPermissions) & 0o777).toBe(f.executable ? 0o755 : 0o644);
		}
	});

	it('is reproducible: same request, same bytes', async () => {
		expect(await buildBundle(input())).toEqual(await buildBundle(input()));
	});

	it('a scan of 100 gamma values x 3 states: 300 decks in 100 folders (timing belongs to the benchmarks)', async () => {
		const gammas = Array.from({ length: 100 }, (_, i) => 0.1 + i * 0.003);
		const zip = await JSZip.loadAsync(await buildBundle(input({ tuning: { gammasBohrInv: gammas }, screened: null })));
		const decks = Object.keys(zip.files).filter((n) => n.endsWith('.nw'));
		expect(decks).toHaveLength(300);
		expect(new Set(decks.map((d) => d.split('/')[2])).size).toBe(100);
	});
});

describe('buildBundle: refusals', () => {
	it.each([
		['no calculation', { tuning: null, screened: null }, 'tuning: a bundle needs a tuning scan, screened reruns, or both'],
		['unknown engine', { engine: 'cp2k' as unknown as 'nwchem' }, 'engine: engine must be nwchem or psi4, got "cp2k"'],
		['bad time stamp', { createdAt: 'yesterday' }, 'createdAt: createdAt must be an ISO 8601 time, got "yesterday"'],
		['epsilons sharing a folder', { screened: { gammaBohrInv: 0.3, epsilons: [3, 3.0001] } }, 'screened.epsilons[1]: epsilon 3.0001 shares the folder screened/eps3p000 with screened.epsilons[0]'],
		['bad root folder', { rootFolder: '../x' }, 'rootFolder: rootFolder must be one folder name'],
		['unsafe account', { scripts: { account: 'a; rm -rf ~' } }, "scripts.account: account may contain only letters"],
		['bad memory', { scripts: { memory: '8 gigs' } }, 'scripts.memory: memory must look like 8G or 16000M, got "8 gigs"']
	])('%s', async (_name, over, message) => {
		const p = planBundle(input(over as Partial<BundleInput>));
		await expect(p).rejects.toThrow(BundleInputError);
		await expect(p).rejects.toThrow(message);
	});

	it('passes deck errors through with their field', async () => {
		const p = planBundle(input({ alpha: 1.5 }));
		await expect(p).rejects.toThrow(DeckInputError);
		await expect(p).rejects.toThrow('alpha: alpha must lie in [0, 1], got 1.5');
	});
});
