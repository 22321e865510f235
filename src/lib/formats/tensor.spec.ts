import { describe, expect, it } from 'vitest';
import { TensorParseError, VOIGT_ORDER, parseDielectricTensor, writeDielectricTensor, type WritableTensorFormat } from './tensor';

// A general (non-diagonal, slightly asymmetric) tensor used across formats. The numbers are made up
// for the parser; they are not data about any material.
const M = [
	[3.1, 0.2, -0.05],
	[0.21, 2.9, 0.3],
	[-0.05, 0.3, 4.2]
];
const SYM = [
	[3.1, 0.2, -0.05],
	[0.2, 2.9, 0.3],
	[-0.05, 0.3, 4.2]
];

function parseError(text: string): TensorParseError {
	try {
		parseDielectricTensor(text);
	} catch (e) {
		expect(e).toBeInstanceOf(TensorParseError);
		return e as TensorParseError;
	}
	throw new Error('expected a TensorParseError');
}

describe('parseDielectricTensor: formats', () => {
	it('reads 3 lines of whitespace-separated numbers', () => {
		const r = parseDielectricTensor('3.1 0.2 -0.05\n0.21   2.9 0.3\n\t-0.05 0.3 4.2\n');
		expect(r).toEqual({ matrix: M, format: 'matrix-text' });
	});

	it('reads CSV, with an x,y,z header (empty corner cell) and row labels', () => {
		const text = ',x,y,z\nx,3.1,0.2,-0.05\ny,0.21,2.9,0.3\nz,-0.05,0.3,4.2\n';
		expect(parseDielectricTensor(text)).toEqual({ matrix: M, format: 'matrix-csv' });
	});

	it('reads CSV with semicolons, CRLF line ends and a trailing delimiter', () => {
		const text = '3.1;0.2;-0.05;\r\n0.21;2.9;0.3;\r\n-0.05;0.3;4.2;\r\n';
		expect(parseDielectricTensor(text)).toEqual({ matrix: M, format: 'matrix-csv' });
	});

	it('skips comment lines and trailing comments, reads Fortran D exponents', () => {
		const text = [
			'# electronic dielectric tensor (made-up numbers)',
			'! another comment style',
			'',
			'3.1D+00 2.0D-01 -5.0D-02   # row x',
			'0.21 2.9 0.3',
			'-0.05 0.3 4.2'
		].join('\n');
		expect(parseDielectricTensor(text).matrix).toEqual(M);
	});

	it('reads a 6-component Voigt vector in the order xx yy zz yz xz xy', () => {
		// Voigt notation (textbook, e.g. Nye, Physical Properties of Crystals): 1=11, 2=22, 3=33, 4=23, 5=13, 6=12.
		expect(VOIGT_ORDER).toEqual(['xx', 'yy', 'zz', 'yz', 'xz', 'xy']);
		const r = parseDielectricTensor('1 2 3 4 5 6');
		expect(r.format).toBe('voigt');
		expect(r.matrix).toEqual([
			[1, 6, 5],
			[6, 2, 4],
			[5, 4, 3]
		]);
		expect(parseDielectricTensor('3.1, 2.9, 4.2, 0.3, -0.05, 0.2').matrix).toEqual(SYM);
	});

	it('reads one line of 9 row-major values', () => {
		const r = parseDielectricTensor('3.1 0.2 -0.05 0.21 2.9 0.3 -0.05 0.3 4.2');
		expect(r).toEqual({ matrix: M, format: 'row-major' });
	});

	it('reads a header of component names followed by one line of values, in any order', () => {
		const r = parseDielectricTensor('xx,yy,zz,xy,xz,yz\n3.1,2.9,4.2,0.2,-0.05,0.3\n');
		expect(r).toEqual({ matrix: SYM, format: 'labelled' });
		const r9 = parseDielectricTensor('XX XY XZ YX YY YZ ZX ZY ZZ\n3.1 0.2 -0.05 0.21 2.9 0.3 -0.05 0.3 4.2');
		expect(r9.matrix).toEqual(M);
	});

	it('reads a JSON nested array', () => {
		expect(parseDielectricTensor(JSON.stringify(M))).toEqual({ matrix: M, format: 'json-array' });
	});

	it('reads a JSON object (upper triangle required, lower optional, extra keys ignored)', () => {
		const sym = parseDielectricTensor('{"xx":3.1,"yy":2.9,"zz":4.2,"xy":0.2,"xz":-0.05,"yz":0.3,"source":"DFPT"}');
		expect(sym).toEqual({ matrix: SYM, format: 'json-object' });
		const full = parseDielectricTensor('{"XX":3.1,"yy":2.9,"zz":4.2,"xy":0.2,"xz":-0.05,"yz":0.3,"yx":0.21}');
		expect(full.matrix).toEqual(M);
	});

	it('does not share arrays between calls (fresh matrix)', () => {
		const a = parseDielectricTensor('1 2 3 4 5 6');
		a.matrix[0][0] = 99;
		expect(parseDielectricTensor('1 2 3 4 5 6').matrix[0][0]).toBe(1);
	});
});

describe('parseDielectricTensor: errors carry the line', () => {
	it('empty input', () => {
		expect(parseError('  \n ').message).toBe('input is empty');
		expect(parseError('# only a comment\n').message).toBe('input has no numbers (only comments or blank lines)');
	});

	it('wrong row length', () => {
		const e = parseError('1 0 0\n0 1\n0 0 1');
		expect(e.line).toBe(2);
		expect(e.message).toBe(
			'line 2: row 2 has 2 values, expected 3; expected 3 lines of 3 numbers, one line of 6 Voigt components ' +
				'(xx yy zz yz xz xy), one line of 9 row-major values, or JSON'
		);
	});

	it('wrong number of lines', () => {
		expect(parseError('1 0 0\n0 1 0').line).toBeNull();
		expect(parseError('1 0 0\n0 1 0\n0 0 1\n1 1 1').line).toBe(4);
		expect(parseError('1 2 3 4 5').message).toMatch(/^line 1: found 5 values on a single line/);
	});

	it('non-finite and non-numeric values', () => {
		const nan = parseError('1 0 0\n0 NaN 0\n0 0 1');
		expect(nan.line).toBe(2);
		expect(nan.message).toBe("line 2: yy is not a finite number: 'NaN'");
		expect(parseError('1 0 0\n0 1 0\n0 0 1e999').message).toBe("line 3: zz is not a finite number: '1e999'");
		expect(parseError('1 0 0\n0 1 0\n0 0 -inf').line).toBe(3);
		expect(parseError('1 0 0\n0 1 abc\n0 0 1').message).toBe("line 2: yz is not a number: 'abc'");
		expect(parseError('1 2 3 4 5 x6').message).toBe("line 1: value 6 is not a number: 'x6'");
	});

	it('empty CSV cells are refused, not collapsed', () => {
		const e = parseError('1,,0\n0,1,0\n0,0,1');
		expect(e.line).toBe(1);
		expect(e.message).toBe('line 1: empty cell in column 2');
	});

	it('row labels out of order and unknown headers', () => {
		expect(parseError(',x,y,z\ny,1,0,0\nx,0,1,0\nz,0,0,1').message).toBe(
			"line 2: row label 'y' should be 'x' (rows in x, y, z order)"
		);
		expect(parseError('a b c\n1 0 0\n0 1 0\n0 0 1').line).toBe(1);
		expect(parseError('xx,yy,zz,xy,xz,yz\n1,2,3').message).toBe(
			'line 2: header names 6 components but the line has 3 values'
		);
		expect(parseError('xx,xx,zz,xy,xz,yz\n1,2,3,4,5,6').field).toBe('xx');
	});

	it('JSON syntax errors report a line', () => {
		const e = parseError('{\n  "xx": 3.1,\n  "yy": 2.9,,\n  "zz": 4.2\n}');
		expect(e.message).toMatch(/^line 3: invalid JSON/);
		expect(e.line).toBe(3);
	});

	it('JSON shape and value errors name the component', () => {
		expect(parseError('[[1,0,0],[0,1,0]]').message).toBe(
			'a JSON array must be 3 rows of 3 numbers: [[xx,xy,xz],[yx,yy,yz],[zx,zy,zz]]'
		);
		const str = parseError('[[1,0,0],[0,"2",0],[0,0,1]]');
		expect(str.message).toBe('component yy must be a number, got "2"');
		expect(str.field).toBe('yy');
		const missing = parseError('{"xx":1,"yy":1,"zz":1,"xy":0,"xz":0}');
		expect(missing.message).toBe('component yz is missing');
		expect(missing.field).toBe('yz');
		expect(parseError('{"xx":1,"yy":1,"zz":1,"xy":0,"xz":0,"zy":0}').message).toBe(
			'component yz is missing (only zy was given)'
		);
		expect(parseError('{"xx":1,"yy":1,"zz":1e999,"xy":0,"xz":0,"yz":0}').message).toBe('component zz is not a finite number');
		expect(parseError('{"xx":1,"XX":1}').message).toBe("component 'xx' is given twice");
	});
});

describe('writeDielectricTensor round-trips', () => {
	const formats: WritableTensorFormat[] = ['matrix-text', 'matrix-csv', 'row-major', 'json-array', 'json-object'];
	for (const format of formats) {
		it(`parse(write(m, '${format}')) returns m and the format`, () => {
			expect(parseDielectricTensor(writeDielectricTensor(M, format))).toEqual({ matrix: M, format });
		});
	}

	it('Voigt round-trip for a symmetric tensor; refuses an asymmetric one', () => {
		expect(parseDielectricTensor(writeDielectricTensor(SYM, 'voigt'))).toEqual({ matrix: SYM, format: 'voigt' });
		expect(writeDielectricTensor(SYM, 'voigt')).toBe('3.1 2.9 4.2 0.3 -0.05 0.2\n');
		expect(() => writeDielectricTensor(M, 'voigt')).toThrow('the Voigt format needs an exactly symmetric matrix');
	});

	it('refuses non-finite entries and wrong shapes', () => {
		expect(() => writeDielectricTensor([[1, 0, 0], [0, NaN, 0], [0, 0, 1]], 'matrix-text')).toThrow(
			'matrix entry yy must be a finite number, got NaN'
		);
		expect(() => writeDielectricTensor([[1, 0, 0]], 'matrix-text')).toThrow('matrix must be 3x3');
	});
});
