// The `kappaline tune` command as a user runs it: a child process of bin/kappaline.mjs.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScanPoints } from '$lib/formats/scan-table';
import { optimalGamma } from '$lib/science/tuning/optimal-gamma';
import { parseTuneArgs } from './tune';

const root = resolve(__dirname, '..', '..', '..');
const so2 = join(root, 'src/lib/science/tuning/fixtures/so2-alpha0.2-aug-cc-pvdz.csv');
const run = (...args: string[]) => spawnSync(process.execPath, [join(root, 'bin/kappaline.mjs'), 'tune', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
const tmp = mkdtempSync(join(tmpdir(), 'kappaline-tune-'));
const file = (name: string, text: string) => {
	const p = join(tmp, name);
	writeFileSync(p, text);
	return p;
};

describe('kappaline tune', () => {
	it('--json prints gamma*, crossings, levels and diagnostics matching the library', { timeout: 60_000 }, async () => {
		const r = run(so2, '--json');
		expect(r.status, r.stderr).toBe(0);
		const out = JSON.parse(r.stdout);
		const lib = optimalGamma(parseScanPoints((await import('node:fs')).readFileSync(so2, 'utf8')));
		expect(out.gammaStar).toBe(lib.optimum!.gammaBohrInv);
		expect(out.objectiveAtOptimum).toBe(lib.optimum!.objectiveValue);
		expect(out.crossings).toEqual({ ip: lib.crossings.jIpBohrInv, ea: lib.crossings.jEaBohrInv });
		expect(out.ipEv).toBe(lib.optimum!.ipEv);
		expect(out.gapEv).toBe(lib.optimum!.gapEv);
		expect(out.homoEv).toBe(-lib.optimum!.minusHomoEv!);
		expect(out.lumoEv).toBeLessThan(0);
		expect(Array.isArray(out.diagnostics)).toBe(true);
		for (const d of out.diagnostics) expect(Object.keys(d)).toEqual(expect.arrayContaining(['code', 'message']));
	});

	it('--objective ip-only and a plain-text report', { timeout: 60_000 }, () => {
		const ip = JSON.parse(run(so2, '--objective', 'ip-only', '--json').stdout);
		expect(ip.gammaStar).toBeCloseTo(ip.crossings.ip, 8);
		const text = run(so2, '--objective=squares');
		expect(text.status).toBe(0);
		expect(text.stdout).toMatch(/^gamma\* {8}0\.\d{4} bohr\^-1/);
		expect(text.stdout).toContain('before device decisions');
	});

	it('unusable input: exit 1 and a specific message on stderr', { timeout: 60_000 }, () => {
		const missing = run(file('no-gamma.csv', 'E_N_Ha,E_cation_Ha\n-1,-0.7\n'));
		expect(missing.status).toBe(1);
		expect(missing.stderr).toMatch(/no column is mapped to gamma/);
		const nan = run(file('nan.csv', 'gamma_bohr_inv,E_N_Ha,E_cation_Ha\n0.1,-100,-99.7\n0.2,abc,-99.7\n'));
		expect(nan.status).toBe(1);
		expect(nan.stderr).toContain('line 3, column "E_N_Ha": energy "abc" is not a number');
		const few = run(file('few.csv', 'gamma_bohr_inv,E_N_Ha,E_cation_Ha,E_anion_Ha,eps_homo_N_Ha,eps_lumo_N_Ha,eps_homo_anion_Ha\n0.1,-100,-99.7,-100.04,-0.3,-0.01,-0.04\n'));
		expect(few.status).toBe(1);
		expect(few.stderr).toMatch(/no optimum: Only 1 usable scan point/);
		expect(run('does-not-exist.csv').stderr).toContain('cannot read does-not-exist.csv: ENOENT');
	});

	it('usage errors exit 2', () => {
		expect(() => parseTuneArgs([])).toThrow('give the scan table');
		expect(() => parseTuneArgs(['a.csv', '--objective', 'best'])).toThrow('--objective must be one of abs, squares, ip-only, lumo');
		expect(parseTuneArgs(['a.csv', '--objective=lumo', '--json'])).toMatchObject({ file: 'a.csv', objective: 'lumo-variant', json: true });
	});
});
