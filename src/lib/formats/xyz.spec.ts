import { describe, expect, it } from 'vitest';
import anthraceneXyz from './fixtures/anthracene.xyz?raw';
import {
	XYZ_DEFAULT_MAX_BYTES,
	XyzParseError,
	defaultMultiplicity,
	electronCount,
	formulaHill,
	parseXyz,
	writeXyz
} from './xyz';

// Fixture: anthracene, 24 atoms, coordinates transcribed from Slookeur/Atomes
// bin/library/molecules/Aromatics/anthracene.sml (see fixtures/README.md).
const err = (line: number, message: string) => new XyzParseError(line, message);

describe('parseXyz on the anthracene fixture', () => {
	const mol = parseXyz(anthraceneXyz);
	it('reads 24 atoms, formula C14H10 and the comment', () => {
		expect(mol.atoms).toHaveLength(24);
		expect(mol.formula).toBe('C14H10');
		expect(mol.counts).toEqual({ C: 14, H: 10 });
		expect(mol.comment).toMatch(/^anthracene C14H10/);
	});
	it('reads coordinates exactly as printed (first and last atom of the source file)', () => {
		expect(mol.atoms[0]).toEqual({ element: 'C', x: 3.66094, y: 0.58478, z: 0 });
		expect(mol.atoms[23]).toEqual({ element: 'H', x: -2.368146, y: 2.584394, z: 0 });
	});
	it('has a C-C bond of 1.36-1.45 Å between atoms 1 and 2 (aromatic bond length, geometry sanity)', () => {
		const d = (i: number, j: number) =>
			Math.hypot(mol.atoms[i].x - mol.atoms[j].x, mol.atoms[i].y - mol.atoms[j].y, mol.atoms[i].z - mol.atoms[j].z);
		expect(d(0, 1)).toBeGreaterThan(1.36);
		expect(d(0, 1)).toBeLessThan(1.45);
	});
	it('counts 94 electrons (14·6 + 10·1) and a singlet; the cation has 93 and is a doublet', () => {
		expect(electronCount(mol.atoms)).toBe(94);
		expect(defaultMultiplicity(mol.atoms)).toBe(1);
		expect(electronCount(mol.atoms, 1)).toBe(93);
		expect(defaultMultiplicity(mol.atoms, 1)).toBe(2);
		expect(electronCount(mol.atoms, -1)).toBe(95);
	});
});

describe('parseXyz tolerance', () => {
	it('accepts CRLF, tabs, extra spaces, a BOM, lower-case symbols, atomic numbers and trailing blank lines', () => {
		const text = '\uFEFF 3 \r\nwater\r\n o\t0.0  0.0\t0.117\r\n1   0.0 0.757 -0.467\r\nH 0 -0.757 -4.67e-1\r\n\r\n  \r\n';
		const mol = parseXyz(text);
		expect(mol.formula).toBe('H2O');
		expect(mol.comment).toBe('water');
		expect(mol.atoms.map((a) => a.element)).toEqual(['O', 'H', 'H']);
		expect(mol.atoms[2].z).toBe(-0.467);
	});
	it('accepts an empty comment line and old-Mac newlines', () => {
		expect(parseXyz('1\r\rHe 0 0 0').atoms[0].element).toBe('He');
	});
	it('accepts UTF-8 bytes', () => {
		expect(parseXyz(new TextEncoder().encode(anthraceneXyz)).formula).toBe('C14H10');
	});
});

describe('parseXyz errors name the 1-based line', () => {
	it('empty file', () => {
		expect(() => parseXyz('')).toThrow(err(1, 'file is empty (expected the atom count)'));
		expect(() => parseXyz('\n\n  \n')).toThrow(XyzParseError);
	});
	it('missing or non-integer count', () => {
		expect(() => parseXyz('\ncomment\nC 0 0 0\n')).toThrow(err(1, 'atom count is missing (line 1 is blank)'));
		expect(() => parseXyz('2.5\ncomment\nC 0 0 0\n')).toThrow(err(1, "atom count must be a whole number, got '2.5'"));
		expect(() => parseXyz('C 0 0 0\n')).toThrow(err(1, "atom count must be a whole number, got 'C 0 0 0'"));
		expect(() => parseXyz('0\nnothing\n')).toThrow(err(1, 'atom count must be at least 1, got 0'));
	});
	it('count mismatch says expected vs found', () => {
		expect(() => parseXyz('3\nc\nC 0 0 0\nH 1 0 0\n')).toThrow(err(5, 'expected 3 atoms (line 1), found 2'));
		expect(() => parseXyz('1\nc\nC 0 0 0\nH 1 0 0\nH 2 0 0\n')).toThrow(err(4, 'expected 1 atoms (line 1), found 3 atom lines'));
		expect(() => parseXyz('2\nc\nC 0 0 0\n\nH 1 0 0\n')).toThrow(err(4, 'blank line where atom 2 of 2 was expected'));
	});
	it('a second frame is refused', () => {
		expect(() => parseXyz('1\na\nC 0 0 0\n1\nb\nC 0 0 1\n')).toThrow(
			err(4, 'a second structure starts here; only single-structure XYZ files are accepted')
		);
	});
	it('unknown element symbol or atomic number', () => {
		expect(() => parseXyz('1\nc\nXx 0 0 0\n')).toThrow(err(3, "unknown element symbol 'Xx'"));
		expect(() => parseXyz('2\nc\nC 0 0 0\nC1 0 0 1\n')).toThrow(err(4, "unknown element symbol 'C1'"));
		expect(() => parseXyz('1\nc\n120 0 0 0\n')).toThrow(err(3, 'unknown element: atomic number 120 (supported 1 to 86)'));
	});
	it('fewer or more than three coordinates', () => {
		expect(() => parseXyz('1\nc\nC 0 0\n')).toThrow(
			err(3, "expected an element and three coordinates (x y z), found 2 values after 'C'")
		);
		expect(() => parseXyz('1\nc\nC 0 0 0 0.5\n')).toThrow(
			err(3, "expected an element and three coordinates (x y z), found 4 values after 'C'")
		);
		expect(() => parseXyz('1\nc\nC\n')).toThrow(/found 0 values after 'C'/);
	});
	it('non-finite numbers', () => {
		expect(() => parseXyz('1\nc\nC 0 NaN 0\n')).toThrow(err(3, "y coordinate 'NaN' is not a finite number"));
		expect(() => parseXyz('1\nc\nC 0 0 Infinity\n')).toThrow(err(3, "z coordinate 'Infinity' is not a finite number"));
		expect(() => parseXyz('1\nc\nC 1e999 0 0\n')).toThrow(err(3, "x coordinate '1e999' is not a finite number"));
		expect(() => parseXyz('1\nc\nC 0x10 0 0\n')).toThrow(err(3, "x coordinate '0x10' is not a finite number"));
	});
	it('input larger than maxBytes (default 1 MB) names the limit', () => {
		expect(XYZ_DEFAULT_MAX_BYTES).toBe(1048576);
		const big = '1\n' + 'x'.repeat(1048576) + '\nC 0 0 0\n';
		expect(() => parseXyz(big)).toThrow(
			new XyzParseError(0, 'XYZ input is 1048587 bytes, larger than the limit of 1 MB (maxBytes = 1048576)')
		);
		expect(() => parseXyz(anthraceneXyz, { maxBytes: 100 })).toThrow(/larger than the limit of 100 bytes \(maxBytes = 100\)/);
		expect(() => parseXyz(new Uint8Array(2048), { maxBytes: 1024 })).toThrow(/2048 bytes, larger than the limit of 1 kB/);
		// size is counted in UTF-8 bytes: 'é' is 2 bytes, '€' 3 (Unicode UTF-8 encoding)
		expect(() => parseXyz('é€', { maxBytes: 4 })).toThrow(/XYZ input is 5 bytes/);
	});
	it('errors carry the line number as a field', () => {
		expect(() => parseXyz('1\nc\nC 0 0 zero\n')).toThrow(expect.objectContaining({ name: 'XyzParseError', line: 3 }));
	});
});

describe('writeXyz', () => {
	it('round-trips the anthracene fixture: parseXyz(writeXyz(m)) equals m', () => {
		const mol = parseXyz(anthraceneXyz);
		expect(parseXyz(writeXyz(mol))).toEqual(mol);
	});
	it('round-trips arbitrary doubles exactly by default', () => {
		const mol = { comment: 'x', atoms: [{ element: 'C', x: 0.1 + 0.2, y: -1 / 3, z: 1e-7 }] };
		expect(parseXyz(writeXyz(mol)).atoms).toEqual(mol.atoms);
	});
	it('writes fixed decimals, aligned columns and a single-line comment', () => {
		const text = writeXyz(
			{ comment: 'two\nlines', atoms: [{ element: 'c', x: 1, y: -2.5, z: 0 }, { element: 'H', x: 10.25, y: 0, z: 0 }] },
			{ decimals: 3 }
		);
		expect(text).toBe('2\ntwo lines\nC   1.000 -2.500  0.000\nH  10.250  0.000  0.000\n');
	});
	it('throws RangeError for no atoms, unknown elements or non-finite coordinates', () => {
		expect(() => writeXyz({ atoms: [] })).toThrow('an XYZ file needs at least one atom');
		expect(() => writeXyz({ atoms: [{ element: 'Q', x: 0, y: 0, z: 0 }] })).toThrow("atom 1: unknown element 'Q'");
		expect(() => writeXyz({ atoms: [{ element: 'C', x: 0, y: Number.NaN, z: 0 }] })).toThrow('atom 1: y must be a finite number, got NaN');
	});
});

describe('formulaHill / electronCount', () => {
	it('is re-exported from the element module', () => expect(formulaHill({ H: 14, C: 22 })).toBe('C22H14'));
	it('rejects a non-integer charge or too large a positive charge', () => {
		expect(() => electronCount([{ element: 'H' }], 0.5)).toThrow('charge must be a whole number, got 0.5');
		expect(() => electronCount([{ element: 'H' }], 2)).toThrow('charge 2 leaves -1 electrons');
		expect(electronCount([{ element: 'H' }], 1)).toBe(0);
	});
});
