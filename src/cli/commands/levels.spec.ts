import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

// Runs the real command line (`node bin/kappaline.mjs`), as a user on a cluster login node would.
const cli = (...args: string[]) => spawnSync(process.execPath, ['bin/kappaline.mjs', 'levels', ...args], { encoding: 'utf8' });

describe('kappaline levels', () => {
	it('prints the JSON keys for one epsilon (Born a = 5 Å, eps = 3: P = 0.95998 eV, hand arithmetic with CODATA 2018)', () => {
		const r = cli('--alpha', '0.2', '--gamma', '0.25', '--epsilon', '3', '--ip', '7', '--ea', '1', '--radius', '5', '--json');
		expect(r.status, r.stderr).toBe(0);
		const j = JSON.parse(r.stdout);
		expect(Object.keys(j)).toEqual(expect.arrayContaining(['beta', 'longRangeFraction', 'pPlusEv', 'pMinusEv', 'ipSolidEv', 'eaSolidEv', 'gapSolidEv', 'renormalizationEv']));
		expect(j.beta).toBeCloseTo(1 / 3 - 0.2, 12);
		expect(j.pPlusEv).toBeCloseTo(0.95998, 5);
		expect(j.gapSolidEv).toBeCloseTo(6 - 2 * 0.9599763652, 9);
	});

	it('sweeps a range into an array, with the gap shrinking as epsilon grows', () => {
		const r = cli('--alpha', '0.2', '--gamma', '0.25', '--epsilon-range', '1:4:0.5', '--ip', '7', '--ea', '1', '--volume-per-molecule', '240', '--json');
		expect(r.status, r.stderr).toBe(0);
		const rows = JSON.parse(r.stdout) as { epsilon: number; gapSolidEv: number }[];
		expect(rows.map((x) => x.epsilon)).toEqual([1, 1.5, 2, 2.5, 3, 3.5, 4]);
		expect(rows[0].gapSolidEv).toBeCloseTo(6, 12);
		for (let i = 1; i < rows.length; i++) expect(rows[i].gapSolidEv).toBeLessThan(rows[i - 1].gapSolidEv);
	});

	it('adds a metal substrate image term (z = 3 Å: 1.19997 eV)', () => {
		const r = cli('--alpha', '0.2', '--gamma', '0.25', '--epsilon', '1', '--ip', '7', '--ea', '1', '--radius', '5', '--substrate-epsilon', 'metal', '--distance', '3', '--json');
		expect(JSON.parse(r.stdout).pPlusEv).toBeCloseTo(1.19997, 5);
	});

	it('refuses bad input with a message on stderr and a non-zero exit', () => {
		const bad = cli('--alpha', '0.2', '--gamma', '0.25', '--epsilon', '0.8', '--ip', '7', '--ea', '1', '--radius', '5');
		expect(bad.status).toBe(1);
		expect(bad.stderr).toMatch(/epsilon must be >= 1/);
		const usage = cli('--alpha', '0.2', '--epsilon', '3', '--ip', '7', '--ea', '1', '--radius', '5');
		expect(usage.status).toBe(2);
		expect(usage.stderr).toMatch(/--gamma is required/);
		const radius = cli('--alpha', '0.2', '--gamma', '0.25', '--epsilon', '3', '--ip', '7', '--ea', '1', '--radius=-1');
		expect(radius.status).toBe(1);
		expect(radius.stderr).toMatch(/radius/);
	});
});
