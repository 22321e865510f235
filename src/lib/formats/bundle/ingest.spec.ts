import JSZip from 'jszip';
import { describe, expect, it } from 'vitest';
import so2G02 from '../decks/fixtures/so2_g0p2000.out?raw';
import so2G03 from '../decks/fixtures/so2_g0p3000.out?raw';
import so2G04 from '../decks/fixtures/so2_g0p4000.out?raw';
import so2Screened from '../decks/fixtures/so2_g0p3000_e3p0000.out?raw';
import waterNotConverged from '../decks/fixtures/water_not_converged.out?raw';
import waterBadBasis from '../decks/fixtures/water_bad_basis.out?raw';
import psi4Out from '../decks/fixtures/psi4_water_cross_g0p1100_e3p0000.out?raw';
import { readNwchemOutput } from '../decks';
import { planBundle, zipBundle } from './build';
import { ArchiveError, ManifestError } from './errors';
import { ingestOutputs } from './ingest';
import { scanPointFromOutput, so2BundleInput } from './so2.testdata';

// Real NWChem 7.0.2 outputs from decks/fixtures (see its README.md): the SO2 tuning decks at gamma
// 0.2, 0.3, 0.4 bohr^-1 (three states per deck, alpha 0.2), the screened rerun at epsilon 3, an
// unconverged water run and a run stopped by a missing basis file.

const scanInput = () =>
	so2BundleInput({ tuning: { gammasBohrInv: [0.2, 0.3, 0.4], layout: 'combined' }, screened: { gammaBohrInv: 0.3, epsilons: [3] } });

/** The values the tuning module needs, read straight from a fixture with the output reader. */
const expectedPoint = scanPointFromOutput;

/** Build the bundle, then add outputs (paths relative to the bundle folder) as a user would. */
async function bundleWithOutputs(outputs: Record<string, string>, edit?: (zip: JSZip) => void): Promise<Uint8Array> {
	const zip = await JSZip.loadAsync(await zipBundle(await planBundle(scanInput())));
	for (const [path, text] of Object.entries(outputs)) zip.file(`kappaline_so2/${path}`, text, { createFolders: false });
	edit?.(zip);
	return zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE' });
}

const allOutputs = {
	'tuning/g0p2000/neutral-cation-anion.out': so2G02,
	'tuning/g0p3000/neutral-cation-anion.out': so2G03,
	'tuning/g0p4000/neutral-cation-anion.out': so2G04,
	'screened/eps3p000/neutral.out': so2Screened
};

describe('round trip: build bundle -> add the real outputs -> ingest', () => {
	it('gives the scan points read from the fixtures, in hartree, and the screened rerun', async () => {
		const r = await ingestOutputs(await bundleWithOutputs(allOutputs));
		expect(r.problems).toEqual([]);
		expect(r.manifest?.molecule.name).toBe('sulfur dioxide (SO2)');
		expect(r.scanPoints).toEqual([expectedPoint(so2G02, 0.2), expectedPoint(so2G03, 0.3), expectedPoint(so2G04, 0.4)]);
		// Spot values transcribed from so2_g0p3000.out: "Total DFT energy = -548.351480344136" (neutral),
		// "-547.892500119740" (cation); neutral HOMO vector 16 E=-4.455290D-01, LUMO vector 17 E=-4.673906D-02.
		const p = r.scanPoints[1];
		expect(p.eNeutralHartree).toBe(-548.351480344136);
		expect(p.eCationHartree).toBe(-547.89250011974);
		expect(p.homoNeutralHartree).toBe(-0.445529);
		expect(p.lumoNeutralHartree).toBe(-0.04673906);
		expect(r.tuning.map((t) => [t.folder, t.missing, t.sources.anion])).toEqual([
			['tuning/g0p2000', [], 'kappaline_so2/tuning/g0p2000/neutral-cation-anion.out'],
			['tuning/g0p3000', [], 'kappaline_so2/tuning/g0p3000/neutral-cation-anion.out'],
			['tuning/g0p4000', [], 'kappaline_so2/tuning/g0p4000/neutral-cation-anion.out']
		]);
		const screened = readNwchemOutput(so2Screened).tasks[0];
		expect(r.screened).toHaveLength(1);
		expect(r.screened[0]).toMatchObject({
			epsilon: 3,
			gammaBohrInv: 0.3,
			alpha: 0.2,
			homoHartree: screened.homoHartree,
			lumoHartree: screened.lumoHartree,
			totalEnergyHartree: screened.totalEnergyHartree,
			folder: 'screened/eps3p000'
		});
		expect(r.screened[0].beta).toBeCloseTo(1 / 3 - 0.2, 15);
		// science notes sec. 5: screening raises the HOMO and lowers the LUMO relative to the gas phase
		expect(r.screened[0].homoHartree).toBeGreaterThan(p.homoNeutralHartree as number);
		expect(r.screened[0].lumoHartree as number).toBeLessThan(p.lumoNeutralHartree as number);
		expect(r.files.map((f) => [f.deck, f.states.length])).toEqual([
			['screened/eps3p000/neutral.nw', 1],
			['tuning/g0p2000/neutral-cation-anion.nw', 3],
			['tuning/g0p3000/neutral-cation-anion.nw', 3],
			['tuning/g0p4000/neutral-cation-anion.nw', 3]
		]);
	});

	it('reports what is still missing', async () => {
		const { 'tuning/g0p4000/neutral-cation-anion.out': _drop, ...some } = allOutputs;
		const r = await ingestOutputs(await bundleWithOutputs(some));
		expect(r.scanPoints.map((p) => p.gammaBohrInv)).toEqual([0.2, 0.3]);
		expect(r.problems).toEqual([
			{
				code: 'missing-output',
				severity: 'warning',
				file: 'tuning/g0p4000/neutral-cation-anion.out',
				message: 'no output for tuning/g0p4000/neutral-cation-anion.nw (neutral, cation, anion) yet'
			}
		]);
	});

	it('matches flattened outputs by the start name NWChem prints, given the stored manifest', async () => {
		const plan = await planBundle(scanInput());
		const r = await ingestOutputs(
			[
				{ name: 'so2_g0p2000.out', bytes: so2G02 },
				{ name: 'results/so2_g0p3000_e3p0000.out', bytes: new TextEncoder().encode(so2Screened) }
			],
			{ manifest: plan.manifest }
		);
		expect(r.scanPoints).toEqual([expectedPoint(so2G02, 0.2)]);
		expect(r.screened.map((s) => s.epsilon)).toEqual([3]);
		expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
	});

	it('accepts a bundle folder uploaded file by file (manifest.json, decks and outputs, not zipped)', async () => {
		const plan = await planBundle(scanInput());
		const upload = [
			...plan.files.map((f) => ({ name: `kappaline_so2/${f.path}`, bytes: f.text })),
			...Object.entries(allOutputs).map(([path, text]) => ({ name: `kappaline_so2/${path}`, bytes: text }))
		];
		const r = await ingestOutputs(upload);
		expect(r.problems).toEqual([]);
		expect(r.scanPoints).toEqual([expectedPoint(so2G02, 0.2), expectedPoint(so2G03, 0.3), expectedPoint(so2G04, 0.4)]);
		expect(r.screened).toHaveLength(1);
	});

	it('warns when a deck was edited after download (SHA-256 differs from the manifest)', async () => {
		const bytes = await bundleWithOutputs(allOutputs, (zip) => zip.file('kappaline_so2/tuning/g0p2000/neutral-cation-anion.nw', 'edited\n', { createFolders: false }));
		const r = await ingestOutputs(bytes);
		expect(r.problems).toEqual([
			expect.objectContaining({ code: 'deck-modified', severity: 'warning', file: 'tuning/g0p2000/neutral-cation-anion.nw' })
		]);
		expect(r.scanPoints).toHaveLength(3);
	});
});

describe('per-file problems', () => {
	it('an output in the wrong gamma folder: the echoed cam line disagrees with the deck', async () => {
		const r = await ingestOutputs(await bundleWithOutputs({ 'tuning/g0p3000/neutral-cation-anion.out': so2G02 }));
		const p = r.problems.find((x) => x.code === 'parameter-mismatch');
		expect(p).toMatchObject({ severity: 'error', file: 'kappaline_so2/tuning/g0p3000/neutral-cation-anion.out' });
		expect(p?.message).toBe('the run used cam 0.2 cam_alpha 0.2 cam_beta 0.8, but tuning/g0p3000/neutral-cation-anion.nw stands for gamma 0.3, alpha 0.2, beta 0.8');
		expect(p?.line).toBeGreaterThan(0);
		expect(r.scanPoints).toEqual([]);
	});

	it('a state run with another multiplicity than the manifest says', async () => {
		const plan = await planBundle({ ...scanInput(), cationMultiplicity: 4, screened: null });
		const r = await ingestOutputs({ name: 'tuning/g0p3000/neutral-cation-anion.out', bytes: so2G03 }, { manifest: plan.manifest });
		expect(r.problems.find((x) => x.code === 'state-mismatch')).toMatchObject({
			state: 'cation',
			message: 'task 2 has charge 1 and multiplicity 2, but the cation has charge 1 and multiplicity 4'
		});
		expect(r.tuning[0].missing).toEqual(['cation']);
	});

	it('an output of another molecule in the bundle folder: unmatched', async () => {
		const r = await ingestOutputs(await bundleWithOutputs({ 'extra/water.out': waterBadBasis }));
		expect(r.problems.find((x) => x.code === 'unmatched-output')).toMatchObject({
			file: 'kappaline_so2/extra/water.out',
			message: expect.stringContaining("(this output's is water_bad_basis_g0p3000_e3p0000)")
		});
	});

	it('two outputs for the same deck', async () => {
		const bytes = await bundleWithOutputs({ 'tuning/g0p2000/neutral-cation-anion.out': so2G02, 'copy/so2_g0p2000.out': so2G02 });
		const r = await ingestOutputs(bytes);
		expect(r.problems.find((x) => x.code === 'duplicate-output')).toMatchObject({
			file: 'kappaline_so2/copy/so2_g0p2000.out',
			message: 'is a second output for tuning/g0p2000/neutral-cation-anion.nw (first: kappaline_so2/tuning/g0p2000/neutral-cation-anion.out); remove one and upload again'
		});
		expect(r.scanPoints).toHaveLength(1);
	});

	it('a run that did not converge, and the states it never reached (single file, no manifest)', async () => {
		const r = await ingestOutputs(new TextEncoder().encode(waterNotConverged), { fileName: 'tuning/g0p3000/neutral-cation-anion.out' });
		expect(r.problems.map((p) => [p.code, p.state])).toEqual([
			['not-converged', 'neutral'],
			['missing-task', 'cation'],
			['missing-task', 'anion']
		]);
		expect(r.problems[0].message).toMatch(/^the neutral task \(line \d+\) did not converge: dft energy failed/);
		expect(r.problems[0].line).toBeGreaterThan(0);
		expect(r.problems[1].message).toBe('has no cation task (task 2 of 3): the run stopped with "dft energy failed"');
		expect(r.tuning).toEqual([]);
	});

	it('without a manifest or state names, the task titles tell the states', async () => {
		const r = await ingestOutputs({ name: 'whatever.out', bytes: so2G03 });
		expect(r.manifest).toBeNull();
		expect(r.scanPoints).toEqual([expectedPoint(so2G03, 0.3)]);
	});

	it('a screened output alone: epsilon from the echoed cam line (1/(alpha + beta))', async () => {
		const r = await ingestOutputs({ name: 'so2_g0p3000_e3p0000.out', bytes: so2Screened });
		expect(r.screened).toHaveLength(1);
		expect(r.screened[0].epsilon).toBeCloseTo(3, 9);
	});

	it('an output of an unknown engine: parse error naming the engines read', async () => {
		const r = await ingestOutputs({ name: 'other.out', bytes: 'SCF Done:  E(RB3LYP) =  -76.4\n Normal termination\n' });
		expect(r.problems).toEqual([
			{ code: 'parse-error', severity: 'error', file: 'other.out', message: "not an NWChem or Psi4 output: neither engine's banner was found (Kappaline reads NWChem 7.x and Psi4 outputs)" }
		]);
	});

	it('a Psi4 output without a manifest: read as Psi4, sorted by its folder and x_hf entry', async () => {
		// psi4_water_cross_g0p1100_e3p0000.out: Psi4 1.3.2, screened neutral, x_hf alpha 0.2, beta 0.133333333333, omega 0.11.
		const r = await ingestOutputs({ name: 'screened/eps3p000/neutral.out', bytes: psi4Out });
		expect(r.problems).toEqual([]);
		expect(r.screened).toHaveLength(1);
		expect(r.screened[0]).toMatchObject({ epsilon: 3, gammaBohrInv: 0.11, alpha: 0.2, beta: 0.133333333333, totalEnergyHartree: -76.3252522788935 });
		// "5A     -0.297655" (HOMO) and "6A      0.083940" (LUMO) in the fixture's orbital table.
		expect(r.screened[0].homoHartree).toBe(-0.297655);
		expect(r.screened[0].lumoHartree).toBe(0.08394);
	});

	it('a Psi4 output in an NWChem bundle: engine mismatch, not read', async () => {
		const r = await ingestOutputs(await bundleWithOutputs({ 'screened/eps3p000/neutral.out': psi4Out }));
		expect(r.problems.filter((p) => p.severity === 'error')).toEqual([
			{ code: 'engine-mismatch', severity: 'error', file: 'kappaline_so2/screened/eps3p000/neutral.out', message: "is a Psi4 output, but the bundle's decks are for NWChem" }
		]);
		expect(r.screened).toEqual([]);
	});

	it('a truncated output: the missing states are reported', async () => {
		const cut = so2G03.slice(0, so2G03.indexOf('Total DFT energy', so2G03.indexOf('Total DFT energy') + 1) - 200);
		const r = await ingestOutputs({ name: 'tuning/g0p3000/neutral-cation-anion.out', bytes: cut });
		expect(r.problems.map((p) => [p.code, p.state])).toEqual([
			['not-converged', 'cation'],
			['missing-task', 'anion']
		]);
		expect(r.problems[1].message).toBe('has no anion task (task 3 of 3): the output ends early (still running, or killed?)');
		expect(r.tuning[0].missing).toEqual(['cation', 'anion']);
		expect(r.scanPoints[0]).toMatchObject({ eNeutralHartree: -548.351480344136, eCationHartree: null, eAnionHartree: null, homoAnionHartree: null });
	});

	it('binary junk named .out', async () => {
		const r = await ingestOutputs({ name: 'x.out', bytes: new Uint8Array([0xff, 0xfe, 0x00, 0x80]) });
		expect(r.problems).toEqual([{ code: 'not-text', severity: 'error', file: 'x.out', message: 'is not UTF-8 text; NWChem and Psi4 outputs are plain text' }]);
	});
});

describe('refused uploads', () => {
	it('a bundle zip with an entry outside its root: nothing is read', async () => {
		const bytes = await bundleWithOutputs(allOutputs, (zip) => zip.file('../../evil.out', so2G02, { createFolders: false }));
		const p = ingestOutputs(bytes);
		await expect(p).rejects.toThrow(ArchiveError);
		await expect(p).rejects.toThrow('entry "../../evil.out": the name contains ".." and would land outside the extraction folder');
	});

	it('a zip over the size limit', async () => {
		await expect(ingestOutputs(await bundleWithOutputs(allOutputs), { limits: { maxTotalBytes: 100_000 } })).rejects.toThrow(
			'the limit for all files together'
		);
	});

	it('a manifest of an unknown schema version', async () => {
		const bytes = await bundleWithOutputs(allOutputs, (zip) => zip.file('kappaline_so2/manifest.json', JSON.stringify({ schemaVersion: 2 }), { createFolders: false }));
		const p = ingestOutputs(bytes);
		await expect(p).rejects.toThrow(ManifestError);
		await expect(p).rejects.toThrow('manifest.json schemaVersion: unknown version 2; this Kappaline reads version 1');
	});

	it('two bundles in one zip', async () => {
		const bytes = await bundleWithOutputs({}, (zip) => zip.file('other/manifest.json', '{}', { createFolders: false }));
		await expect(ingestOutputs(bytes)).rejects.toThrow('two bundle manifests at the same level');
	});

	it('a single file over the per-file limit', async () => {
		await expect(ingestOutputs({ name: 'a.out', bytes: so2G02 }, { limits: { maxEntryBytes: 1000 } })).rejects.toThrow('entry "a.out": is');
	});
});
