// The `epsilon` and `cell` commands, run as a user would: `node bin/kappaline.mjs ...` in a child process.
import { spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(__dirname, '../../..');
const FIXTURES = join(ROOT, 'src/lib/formats/fixtures');
const dir = mkdtempSync(join(tmpdir(), 'kappaline-cli-'));

/** Runs the command line in a child process (tests run concurrently: each start loads the science modules). */
function kappaline(...args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
	return new Promise((done, fail) => {
		const child = spawn(process.execPath, [join(ROOT, 'bin/kappaline.mjs'), ...args], { cwd: dir, timeout: 110_000 });
		let stdout = '';
		let stderr = '';
		child.stdout.on('data', (d) => (stdout += d));
		child.stderr.on('data', (d) => (stderr += d));
		child.on('error', fail);
		child.on('close', (code) => done({ code, stdout, stderr }));
	});
}
function file(name: string, text: string): string {
	writeFileSync(join(dir, name), text);
	return name;
}

describe.concurrent('kappaline epsilon TENSOR_FILE', { timeout: 120_000 }, () => {
	it('--json prints principal (ascending), mean, harmonicMean, geometricMean and directional', async () => {
		const t = file('diag.txt', '6 0 0\n0 2 0\n0 0 3\n');
		const r = await kappaline('epsilon', t, '--direction', '1,1,0', '--json');
		expect(r.code).toBe(0);
		const j = JSON.parse(r.stdout);
		expect(j.principal).toEqual([2, 3, 6]);
		// By hand: trace/3 = 11/3; 3/(1/2 + 1/3 + 1/6) = 3; 36^(1/3); along (1,1,0)/sqrt 2: (6 + 2)/2 = 4.
		expect(j.mean).toBeCloseTo(11 / 3, 14);
		expect(j.harmonicMean).toBeCloseTo(3, 14);
		expect(j.geometricMean).toBeCloseTo(Math.cbrt(36), 14);
		expect(j.directional).toBeCloseTo(4, 14);
	});

	it('--uvw with --cif converts the crystal direction with the cell (monoclinic COD 2000724, [001])', async () => {
		// [001] of a monoclinic cell in the standard orientation is c (cos beta, 0, sin beta); beta = 109.06°.
		const t = file('voigt.txt', '2 3 4 0 0 0\n');
		const r = await kappaline('epsilon', t, '--uvw', '0,0,1', '--cif', join(FIXTURES, 'cod-2000724.cif'), '--json');
		expect(r.code).toBe(0);
		const b = (109.06 * Math.PI) / 180;
		expect(JSON.parse(r.stdout).directional).toBeCloseTo(2 * Math.cos(b) ** 2 + 4 * Math.sin(b) ** 2, 10);
	});

	it('prints a readable summary without --json', async () => {
		const r = await kappaline('epsilon', file('m.csv', 'x,y,z\nx,3,0,0\ny,0,3,0\nz,0,0,3\n'));
		expect(r.code).toBe(0);
		expect(r.stdout).toContain('trace/3 (default, common practice): 3.0000');
	});

	it('bad input: 8 numbers, an indefinite tensor, a missing file; usage errors exit 2', async () => {
		const [eight, indefinite, missing, usage] = await Promise.all([
			kappaline('epsilon', file('eight.txt', '1 2 3 4 5 6 7 8\n')),
			kappaline('epsilon', file('indef.txt', '1 2 0\n2 1 0\n0 0 3\n')),
			kappaline('epsilon', 'no-such-file.txt'),
			kappaline('epsilon', file('ok.txt', '3 0 0\n0 3 0\n0 0 3\n'), '--uvw', '1,0,0')
		]);
		expect(eight.code).toBe(1);
		expect(eight.stderr).toContain('line 1: found 8 values on a single line');
		expect(indefinite.code).toBe(1);
		expect(indefinite.stderr).toContain('tensor is not positive definite');
		expect(missing.code).toBe(1);
		expect(missing.stderr).toContain('cannot read no-such-file.txt: ENOENT');
		expect(usage.code).toBe(2);
		expect(usage.stderr).toContain('--uvw needs --cif FILE');
	});
});

describe.concurrent('kappaline epsilon --cm', { timeout: 120_000 }, () => {
	it('hand-computed case: alpha 3 Å^3, V_m 16 pi Å^3 gives x = 1/4, epsilon = 2', async () => {
		const r = await kappaline('epsilon', '--cm', '--polarizability', '3', '--volume-per-molecule', String(16 * Math.PI), '--json');
		expect(r.code).toBe(0);
		const j = JSON.parse(r.stdout);
		expect(j.epsilon).toBeCloseTo(2, 14);
		expect(j.x).toBeCloseTo(0.25, 14);
	});
	it('x >= 1 has no finite solution (exit 1 with the reason)', async () => {
		const r = await kappaline('epsilon', '--cm', '--polarizability', '30', '--volume-per-molecule', '100');
		expect(r.code).toBe(1);
		expect(r.stderr).toContain('Clausius–Mossotti has no solution');
	});
});

describe.concurrent('kappaline cell CIF_FILE --json', { timeout: 120_000 }, () => {
	it('triclinic COD 1501936 (Org. Lett. 13 (2011) 720): printed V 860.57(5) Å³, density 1.321 g/cm³, Z 2', async () => {
		const r = await kappaline('cell', join(FIXTURES, 'cod-1501936.cif'), '--json');
		expect(r.code).toBe(0);
		const j = JSON.parse(r.stdout);
		expect(Math.abs(j.volumeA3 - 860.57)).toBeLessThan(0.05);
		expect(j.volumePerMoleculeA3).toBeCloseTo(j.volumeA3 / 2, 10);
		expect(Math.abs(j.densityGcm3 - 1.321)).toBeLessThan(0.001);
		expect(j.cell).toEqual({ a: 8.2302, b: 8.2837, c: 13.1837, alphaDeg: 79.9846, betaDeg: 82.2194, gammaDeg: 77.7988 });
	});
	it('a cell angle of 200° is refused naming the line', async () => {
		const cif = file('bad.cif', 'data_bad\n_cell_length_a 5\n_cell_length_b 6\n_cell_length_c 7\n_cell_angle_alpha 90\n_cell_angle_beta 200\n_cell_angle_gamma 90\n_cell_formula_units_Z 2\n');
		const r = await kappaline('cell', cif, '--json');
		expect(r.code).toBe(1);
		expect(r.stderr).toMatch(/line 2: the cell is not physical/);
	});
});
