import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readManifest } from '$lib/formats/bundle';

// The real command line (`node bin/kappaline.mjs`) on committed NWChem 7.0.2 and Psi4 1.3.2 outputs
// (src/lib/formats/decks/fixtures/README.md).
const cli = (...args: string[]) => spawnSync(process.execPath, ['bin/kappaline.mjs', ...args], { encoding: 'utf8' });
const FIX = 'src/lib/formats/decks/fixtures';

describe('kappaline deck / parse / collect', () => {
	it('deck writes the web bundle’s files: a screened rerun with beta = 1/3 - 0.2 and a manifest', () => {
		const out = mkdtempSync(join(tmpdir(), 'kl-deck-'));
		const r = cli('deck', 'nwchem', '--xyz', 'src/lib/formats/fixtures/anthracene.xyz', '--alpha', '0.2', '--gamma', '0.25', '--epsilon', '3', '--out', out);
		expect(r.status, r.stderr).toBe(0);
		const manifest = readManifest(JSON.parse(readFileSync(join(out, 'manifest.json'), 'utf8')));
		expect(manifest.files.length).toBeGreaterThan(3);
		const deck = readFileSync(join(out, 'screened', 'eps3p000', 'neutral.nw'), 'utf8');
		expect(deck).toMatch(/cam 0\.25 cam_alpha 0\.2 cam_beta 0\.1333/);
		expect(existsSync(join(out, 'run-local.sh'))).toBe(true);
		const scan = cli('deck', 'nwchem', '--xyz', 'src/lib/formats/fixtures/anthracene.xyz', '--alpha', '0.2', '--gamma', '0.25', '--scan', '0.2:0.3:0.05', '--out', join(out, 'scan'));
		expect(scan.status, scan.stderr).toBe(0);
		expect(existsSync(join(out, 'scan', 'tuning', 'g0p2500'))).toBe(true);
	});

	it('deck refuses what NWChem would get wrong (a doublet for an even electron count), naming the reason', () => {
		const r = cli('deck', 'nwchem', '--xyz', 'src/lib/formats/fixtures/anthracene.xyz', '--mult', '2', '--alpha', '0.2', '--gamma', '0.25', '--epsilon', '3', '--out', mkdtempSync(join(tmpdir(), 'kl-deck-')));
		expect(r.status).toBe(1);
		expect(r.stderr).toMatch(/multiplicity/i);
	});

	it('parse prints the spin-resolved records as JSON', () => {
		const r = cli('parse', `${FIX}/so2_g0p3000.out`, '--json');
		expect(r.status, r.stderr).toBe(0);
		const recs = JSON.parse(r.stdout);
		expect(recs.map((x: { charge: number }) => x.charge)).toEqual([0, 1, -1]);
		for (const x of recs) expect(Object.keys(x)).toEqual(expect.arrayContaining(['engine', 'converged', 'charge', 'multiplicity', 'totalEnergyHa', 'homoHa', 'lumoHa', 'alphaOrbitals', 'betaOrbitals']));
		expect(recs[1].betaOrbitals.length).toBeGreaterThan(0);
	});

	it('parse reads a Psi4 output too (engine psi4), and refuses a truncated one with its line', () => {
		// Psi4 1.3.2 run of the water tuning states at gamma 0.11 (fixtures/README.md).
		const r = cli('parse', `${FIX}/psi4_water_tuning_g0p1100.out`, '--json');
		expect(r.status, r.stderr).toBe(0);
		const recs = JSON.parse(r.stdout);
		expect(recs.map((x: { engine: string; charge: number; totalEnergyHa: number }) => [x.engine, x.charge, x.totalEnergyHa])).toEqual([
			['psi4', 0, -76.32766459142536],
			['psi4', 1, -75.87542259883396],
			['psi4', -1, -76.15748106811162]
		]);
		expect(recs[1].betaOrbitals.filter((o: { occupation: number }) => o.occupation === 1)).toHaveLength(4);
		const dir = mkdtempSync(join(tmpdir(), 'kl-parse-'));
		const cut = join(dir, 'cut.out');
		writeFileSync(cut, readFileSync(`${FIX}/psi4_water_tuning_g0p1100.out`, 'utf8').split('\n').slice(0, 499).join('\n'));
		const bad = cli('parse', cut);
		expect(bad.status).not.toBe(0);
		expect(bad.stderr).toContain('line 499');
		expect(bad.stderr).toContain('truncated');
	});

	it('collect turns a finished scan folder into the canonical scan CSV', () => {
		const dir = mkdtempSync(join(tmpdir(), 'kl-collect-'));
		for (const g of ['2', '3', '4']) {
			mkdirSync(join(dir, 'tuning', `g0p${g}000`), { recursive: true });
			copyFileSync(`${FIX}/so2_g0p${g}000.out`, join(dir, 'tuning', `g0p${g}000`, `so2_g0p${g}000.out`));
		}
		const r = cli('collect', dir);
		expect(r.status, r.stderr).toBe(0);
		const lines = r.stdout.trim().split('\n');
		expect(lines[0]).toBe('gamma_bohr_inv,E_N_Ha,E_cation_Ha,E_anion_Ha,eps_homo_N_Ha,eps_lumo_N_Ha,eps_homo_anion_Ha,excluded');
		expect(lines.slice(1).map((l) => Number(l.split(',')[0]))).toEqual([0.2, 0.3, 0.4]);
		// the same numbers as the committed scan table built from these runs by the tuning fixtures' generator
		const table = readFileSync('src/lib/science/tuning/fixtures/so2-alpha0.2-aug-cc-pvdz.csv', 'utf8');
		expect(table).toContain(lines[1].replace(/,$/, ''));
	});
});
