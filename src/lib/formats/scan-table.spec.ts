import { describe, expect, it } from 'vitest';
import { optimalGamma } from '$lib/science/tuning';
import type { ScanPoint } from '$lib/science/tuning/types';
import { syntheticScan, GRID } from '$lib/science/tuning/synthetic-scan.testdata';
import { HARTREE_EV } from '$lib/science/units';
import commaHartree from './fixtures/scan-comma-hartree.csv?raw';
import semicolonDecimalComma from './fixtures/scan-semicolon-decimal-comma.csv?raw';
import tabEv from './fixtures/scan-tab-ev.tsv?raw';
import whitespaceDat from './fixtures/scan-whitespace.dat?raw';
import {
	ScanTableError,
	applyMapping,
	parseScanPoints,
	parseScanTable,
	proposeScanMapping,
	writeScanCsv
} from './scan-table';

// Fixtures scan-*: synthetic gamma scans written from the model in
// src/lib/science/tuning/synthetic-scan.testdata.ts (not engine output; each file says so in its first
// line), in four layouts: comma/hartree, tab/eV with CRLF, semicolon with decimal commas and an
// excluded column, whitespace with a '#' header (gnuplot style). Hartree values carry 10 decimals,
// eV values 7 decimals, so each file reproduces the model to 1e-10 Ha or 1e-7 eV (3.7e-9 Ha).

const model = syntheticScan(GRID);

function scanError(f: () => unknown): ScanTableError {
	try {
		f();
	} catch (e) {
		expect(e).toBeInstanceOf(ScanTableError);
		return e as ScanTableError;
	}
	throw new Error('expected a ScanTableError');
}

function expectNear(points: ScanPoint[], tolHartree: number, skip: (p: ScanPoint, field: string) => boolean = () => false) {
	expect(points).toHaveLength(model.length);
	points.forEach((p, i) => {
		expect(p.gammaBohrInv).toBeCloseTo(model[i].gammaBohrInv, 12);
		for (const f of ['eNeutralHartree', 'eCationHartree', 'eAnionHartree', 'homoNeutralHartree', 'lumoNeutralHartree', 'homoAnionHartree'] as const) {
			if (skip(p, f)) continue;
			expect(Math.abs((p[f] as number) - (model[i][f] as number))).toBeLessThan(tolHartree);
		}
	});
}

describe('parseScanTable: delimiter sniffing and layout', () => {
	it('comma-separated with comment lines before the header', () => {
		const t = parseScanTable(commaHartree);
		expect(t.delimiter).toBe('comma');
		expect(t.decimalComma).toBe(false);
		expect(t.headerLine).toBe(3);
		expect(t.headers).toEqual(['gamma', 'E_N', 'E_cation', 'E_anion', 'HOMO', 'LUMO', 'HOMO_anion']);
		expect(t.rows).toHaveLength(10);
		expect(t.rows[0].line).toBe(4);
	});

	it('tab-separated with CRLF line ends', () => {
		const t = parseScanTable(tabEv);
		expect(t.delimiter).toBe('tab');
		expect(t.headers[0]).toBe('omega (bohr^-1)');
		expect(t.rows).toHaveLength(10);
	});

	it('semicolon-separated with decimal commas', () => {
		const t = parseScanTable(semicolonDecimalComma);
		expect(t.delimiter).toBe('semicolon');
		expect(t.decimalComma).toBe(true);
		expect(t.rows[0].cells[0]).toBe('0,05');
	});

	it("whitespace-separated, header on a '#' line (gnuplot style)", () => {
		const t = parseScanTable(whitespaceDat);
		expect(t.delimiter).toBe('whitespace');
		expect(t.headerLine).toBe(3);
		expect(t.headers).toEqual(['gamma', 'E_N', 'E_N-1', 'E_N+1', 'homo', 'lumo', 'homo_anion']);
	});

	it('quoted cells, a byte-order mark and trailing delimiters', () => {
		const t = parseScanTable('\uFEFF"gamma","E(N-1), Ha",E_N,\n0.1,"-9.5",-10,\n');
		expect(t.headers).toEqual(['gamma', 'E(N-1), Ha', 'E_N']);
		expect(t.rows[0].cells).toEqual(['0.1', '-9.5', '-10']);
	});

	it('accepts bytes (UTF-8)', () => {
		const t = parseScanTable(new TextEncoder().encode('γ,E_N\n0.2,-1\n'));
		expect(t.headers).toEqual(['γ', 'E_N']);
	});

	it('errors name the line', () => {
		expect(scanError(() => parseScanTable('# only a comment\n')).message).toBe(
			'no table found (the text is empty or only comments)'
		);
		expect(scanError(() => parseScanTable('gamma,E_N\n')).message).toBe('line 1: the table has a header but no data rows');
		expect(scanError(() => parseScanTable('0.1,-1\n0.2,-2\n')).message).toBe(
			'line 1: the first line holds numbers; a header row naming the columns is needed'
		);
		const e = scanError(() => parseScanTable('gamma E_N E_cation\n0.1 -1 -0.7\n0.2 -1\n0.3 -1 -0.7\n'));
		expect(e.message).toBe('line 3: expected 3 cells as in the header, found 2');
		expect(e.line).toBe(3);
		expect(scanError(() => parseScanTable('x'.repeat(20), { maxLength: 10 })).message).toBe(
			'input is too large (20 > 10 characters)'
		);
	});
});

describe('proposeScanMapping', () => {
	it('recognises the fixture headers and their units', () => {
		const comma = proposeScanMapping(parseScanTable(commaHartree).headers);
		expect(comma.mapping).toEqual({
			gammaBohrInv: 0,
			eNeutralHartree: 1,
			eCationHartree: 2,
			eAnionHartree: 3,
			homoNeutralHartree: 4,
			lumoNeutralHartree: 5,
			homoAnionHartree: 6
		});
		expect(comma.unmatched).toEqual([]);
		expect(comma.energyUnitHint).toBeNull();

		const tab = proposeScanMapping(parseScanTable(tabEv).headers);
		expect(Object.keys(tab.mapping)).toHaveLength(7);
		expect(tab.energyUnitHint).toBe('eV');
		expect(tab.gammaUnitHint).toBe('bohr^-1');

		const semi = proposeScanMapping(parseScanTable(semicolonDecimalComma).headers);
		expect(semi.mapping.excluded).toBe(7);
		expect(semi.mapping.eCationHartree).toBe(2);
		expect(semi.mapping.eAnionHartree).toBe(3);
		expect(semi.mapping.homoAnionHartree).toBe(6);
	});

	it('common aliases', () => {
		const p = proposeScanMapping(['mu [1/Å]', 'E0 / Ha', 'E(N-1) (hartree)', 'E(N+1)', 'eps_HOMO', 'eps_LUMO(N)', 'HOMO(N+1)', 'notes']);
		expect(p.mapping).toEqual({
			gammaBohrInv: 0,
			eNeutralHartree: 1,
			eCationHartree: 2,
			eAnionHartree: 3,
			homoNeutralHartree: 4,
			lumoNeutralHartree: 5,
			homoAnionHartree: 6
		});
		expect(p.unmatched).toEqual([{ column: 7, header: 'notes' }]);
		expect(p.gammaUnitHint).toBe('angstrom^-1');
		expect(p.energyUnitHint).toBe('hartree');
	});

	it('maps a field once and gives no unit hint when the headers disagree', () => {
		const p = proposeScanMapping(['omega', 'gamma', 'E_N (eV)', 'E_cation (Ha)']);
		expect(p.mapping.gammaBohrInv).toBe(0);
		expect(p.unmatched).toEqual([{ column: 1, header: 'gamma' }]);
		expect(p.energyUnitHint).toBeNull();
	});
});

describe('applyMapping and parseScanPoints', () => {
	it('comma/hartree fixture: model values to 1e-10 Ha; empty cells become null', () => {
		const pts = parseScanPoints(commaHartree);
		expectNear(pts, 1.1e-10, (p, f) => p.gammaBohrInv === 0.45 && (f === 'eAnionHartree' || f === 'homoAnionHartree'));
		const p45 = pts.find((p) => p.gammaBohrInv === 0.45)!;
		expect(p45.eAnionHartree).toBeNull();
		expect(p45.homoAnionHartree).toBeNull();
		expect(p45.excluded).toBeUndefined();
	});

	it('tab/eV fixture: converted to hartree (CODATA 2018) to 1e-8 Ha', () => {
		const table = parseScanTable(tabEv);
		const { mapping } = proposeScanMapping(table.headers);
		expectNear(applyMapping(table, mapping, { energyUnit: 'eV' }), 1e-8);
		// parseScanPoints takes the unit from the headers.
		expectNear(parseScanPoints(tabEv), 1e-8);
		// Read as hartree by mistake, the numbers are 27.2 times too large; the magnitude check refuses them:
		expect(() => applyMapping(table, mapping)).toThrow(/^line 3, column "eps_HOMO\(N\) \(eV\)": orbital energy .* were the energies in eV\? Choose eV/);
		expect(applyMapping(table, mapping, { checkMagnitudes: false })[0].eNeutralHartree).toBeCloseTo(model[0].eNeutralHartree! * HARTREE_EV, 5);
	});

	it('semicolon/decimal-comma fixture, with an excluded point', () => {
		const pts = parseScanPoints(semicolonDecimalComma);
		expectNear(pts, 1.1e-10);
		expect(pts[0].excluded).toBe(true);
		expect(pts.slice(1).every((p) => p.excluded === undefined)).toBe(true);
	});

	it('whitespace fixture: NA is missing', () => {
		const pts = parseScanPoints(whitespaceDat);
		expectNear(pts, 1.1e-10, (p, f) => p.gammaBohrInv === 0.5 && f === 'lumoNeutralHartree');
		expect(pts[9].lumoNeutralHartree).toBeNull();
	});

	it('every fixture gives the same optimum (synthetic model root 0.213 bohr^-1)', () => {
		const ref = optimalGamma(parseScanPoints(commaHartree)).optimum!.gammaBohrInv;
		expect(Math.abs(ref - 0.213)).toBeLessThan(1e-4);
		for (const text of [tabEv, whitespaceDat])
			expect(optimalGamma(parseScanPoints(text)).optimum!.gammaBohrInv).toBeCloseTo(ref, 5);
	});

	it('gamma in Å^-1 is converted to bohr^-1 (x 0.529177210903, CODATA 2018)', () => {
		const pts = parseScanPoints('gamma (Å^-1),E_N\n0.5,-1\n');
		expect(pts[0].gammaBohrInv).toBeCloseTo(0.5 * 0.529177210903, 14);
	});

	it('Fortran exponents and a Unicode minus are read', () => {
		const pts = parseScanPoints('gamma\tE_N\n0.2\t\u22121.5D+02\n');
		expect(pts[0].eNeutralHartree).toBe(-150);
	});

	it('unmapped energies are null', () => {
		expect(parseScanPoints('omega,E_N\n0.3,-5\n')).toEqual([
			{
				gammaBohrInv: 0.3,
				eNeutralHartree: -5,
				eCationHartree: null,
				eAnionHartree: null,
				homoNeutralHartree: null,
				lumoNeutralHartree: null,
				homoAnionHartree: null
			}
		]);
	});

	it('errors name the line and column: non-numeric cell, missing or negative gamma, bad flags', () => {
		let e = scanError(() => parseScanPoints('gamma,E_N,E_cation\n0.1,-1,-0.7\n0.2,-1,abc\n'));
		expect(e.message).toBe('line 3, column "E_cation": energy "abc" is not a number');
		expect([e.line, e.column]).toEqual([3, 'E_cation']);

		e = scanError(() => parseScanPoints('omega;E_N\n;-1\n'));
		expect(e.message).toBe('line 2, column "omega": gamma is missing');

		e = scanError(() => parseScanPoints('# scan\ngamma,E_N\n0.1,-1\n-0.2,-1\n'));
		expect(e.message).toBe('line 4, column "gamma": gamma must be >= 0, got -0.2');

		e = scanError(() => parseScanPoints('gamma,E_N\n0,1 ,-1\n'));
		expect(e.message).toBe('line 2: expected 2 cells as in the header, found 3');

		e = scanError(() => parseScanPoints('gamma,E_N,skip\n0.1,-1,maybe\n'));
		expect(e.message).toBe('line 2, column "skip": "maybe" is not a yes/no value');

		e = scanError(() => parseScanPoints('energy,E_N\n0.1,-1\n'));
		expect(e.message).toBe(
			'line 1: no column is mapped to gamma (headers: energy, E_N); name it gamma, omega or mu, or map it by hand'
		);
	});

	it('checks a hand-made mapping', () => {
		const table = parseScanTable('a,b,c\n0.1,-1,-0.7\n');
		expect(applyMapping(table, { gammaBohrInv: 0, eNeutralHartree: 1, eCationHartree: 2 })[0].eCationHartree).toBe(-0.7);
		expect(scanError(() => applyMapping(table, { gammaBohrInv: 0, eNeutralHartree: 0 })).message).toBe(
			'line 1, column "a": fields gammaBohrInv and eNeutralHartree are both mapped to the same column'
		);
		expect(scanError(() => applyMapping(table, { gammaBohrInv: 3 })).message).toBe(
			'field gammaBohrInv is mapped to column 3, but the table has columns 0..2'
		);
	});
});

describe('writeScanCsv', () => {
	it('round-trips: parseScanPoints(writeScanCsv(x)) equals x exactly', () => {
		const points: ScanPoint[] = model.map((p, i) => ({
			...p,
			eAnionHartree: i === 3 ? null : p.eAnionHartree,
			homoAnionHartree: i === 3 ? null : p.homoAnionHartree,
			...(i === 7 ? { excluded: true } : {})
		}));
		const text = writeScanCsv(points);
		expect(text.split('\n')[0]).toBe(
			'gammaBohrInv,eNeutralHartree,eCationHartree,eAnionHartree,homoNeutralHartree,lumoNeutralHartree,homoAnionHartree,excluded'
		);
		expect(parseScanPoints(text)).toEqual(points);
	});

	it('writes missing values as empty cells and CRLF on request', () => {
		expect(writeScanCsv([{ gammaBohrInv: 0.25, eNeutralHartree: -1.5 }], { newline: '\r\n' })).toBe(
			'gammaBohrInv,eNeutralHartree,eCationHartree,eAnionHartree,homoNeutralHartree,lumoNeutralHartree,homoAnionHartree,excluded\r\n0.25,-1.5,,,,,,\r\n'
		);
	});

	it('refuses non-finite numbers', () => {
		expect(scanError(() => writeScanCsv([{ gammaBohrInv: 0.1, eNeutralHartree: Number.NaN }])).message).toBe(
			'points[0].eNeutralHartree must be a finite number or null, got NaN'
		);
	});
});

describe('canonical header and unit magnitude checks', () => {
	const canonical = 'gamma_bohr_inv,E_N_Ha,E_cation_Ha,E_anion_Ha,eps_homo_N_Ha,eps_lumo_N_Ha,eps_homo_anion_Ha';
	const row = '0.2,-100.0,-99.7,-100.04,-0.3,-0.01,-0.04';

	it('maps every column of the documented canonical header without a mapping step', () => {
		const { mapping, unmatched, energyUnitHint } = proposeScanMapping(canonical.split(','));
		expect(unmatched).toEqual([]);
		expect(mapping).toEqual({ gammaBohrInv: 0, eNeutralHartree: 1, eCationHartree: 2, eAnionHartree: 3, homoNeutralHartree: 4, lumoNeutralHartree: 5, homoAnionHartree: 6 });
		expect(energyUnitHint).toBe('hartree');
	});

	it('writes the canonical header on request, and reads it back', () => {
		const pts = parseScanPoints(`${canonical}\n${row}\n`);
		const text = writeScanCsv(pts, { header: 'canonical' });
		expect(text.split('\n')[0]).toBe(`${canonical},excluded`);
		expect(parseScanPoints(text)).toEqual(pts);
	});

	it('hartree values declared as eV are refused, naming line and column', () => {
		expect(() => parseScanPoints(`${canonical}\n${row}\n`, { energyUnit: 'eV' })).toThrow(
			/^line 2, column "eps_homo_N_Ha": neutral HOMO -0.300 eV lies above -1 eV: .* were the energies in hartree\?/
		);
	});

	it('eV values declared as hartree are refused: orbital beyond 2 hartree, or E(N-1) - E(N) beyond 2 hartree', () => {
		expect(() => parseScanPoints(`${canonical}\n0.2,-2721,-2713,-2722,-8.1,-0.3,-1.1\n`, { energyUnit: 'hartree' })).toThrow(/^line 2, column "eps_homo_N_Ha": orbital energy -8\.100 hartree/);
		expect(() => parseScanPoints('gamma,E_N,E_cation\n0.2,-2721,-2713\n', { energyUnit: 'hartree' })).toThrow(/^line 2, column "E_cation": E\(N-1\) - E\(N\) = 8\.000 hartree/);
	});
});
