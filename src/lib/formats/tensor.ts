/**
 * Dielectric tensors as text: a parser that recognises the usual ways a 3x3 tensor is written
 * by hand, by a spreadsheet or by a script, and a writer for the same formats.
 *
 * Accepted input (the detected format is returned with the matrix):
 * - `matrix-text`: three lines of three numbers separated by whitespace.
 * - `matrix-csv`: three lines of three numbers separated by commas (or semicolons). An optional header line
 *   `x,y,z` (a leading empty corner cell is allowed) and optional row labels `x`, `y`, `z` are skipped.
 * - `voigt`: one line of six numbers in Voigt order **xx yy zz yz xz xy** (Voigt indices 1..6 =
 *   11, 22, 33, 23, 13, 12). The tensor is symmetric by construction.
 * - `row-major`: one line of nine numbers xx xy xz yx yy yz zx zy zz.
 * - `labelled`: a header line of component names (`xx`, `yy`, `zz`, `xy`, `xz`, `yz`, and optionally
 *   `yx`, `zx`, `zy`) followed by one line of values in that order, e.g. `xx,yy,zz,xy,xz,yz`.
 * - `json-array`: a JSON nested array `[[xx,xy,xz],[yx,yy,yz],[zx,zy,zz]]`.
 * - `json-object`: a JSON object with keys xx, yy, zz, xy, xz, yz (required) and yx, zx, zy (optional;
 *   missing lower-triangle entries copy their upper-triangle partner). Keys are case-insensitive;
 *   other keys (e.g. `source`, `wavelengthNm`) are ignored.
 *
 * Lines starting with `#`, `!`, `%` or `//` are comments; text after `#` on a line is ignored; blank lines
 * are skipped. Fortran exponents (`1.0D+00`) are read. Every error is a `TensorParseError` carrying the
 * 1-based line number of the text (or null when the problem is the overall shape), and for JSON objects the
 * offending key.
 *
 * The parser only checks shape and numbers; symmetry and positive definiteness are checked by the
 * dielectric analysis (`analyseTensor`).
 */

export type TensorFormat =
	| 'matrix-text'
	| 'matrix-csv'
	| 'voigt'
	| 'row-major'
	| 'labelled'
	| 'json-array'
	| 'json-object';

export interface ParsedTensor {
	/** Row-major 3x3 matrix, a fresh array. */
	matrix: number[][];
	format: TensorFormat;
}

export class TensorParseError extends Error {
	/** 1-based line of the input text, or null when the problem is not tied to one line. */
	readonly line: number | null;
	/** Component or key concerned (e.g. `xy`), or null. */
	readonly field: string | null;

	constructor(message: string, line: number | null = null, field: string | null = null) {
		super(line === null ? message : `line ${line}: ${message}`);
		this.name = 'TensorParseError';
		this.line = line;
		this.field = field;
	}
}

/** Voigt order of the six independent components of a symmetric tensor. */
export const VOIGT_ORDER = ['xx', 'yy', 'zz', 'yz', 'xz', 'xy'] as const;

const AXES = ['x', 'y', 'z'] as const;
const COMPONENT_INDEX: Record<string, [number, number]> = {
	xx: [0, 0],
	xy: [0, 1],
	xz: [0, 2],
	yx: [1, 0],
	yy: [1, 1],
	yz: [1, 2],
	zx: [2, 0],
	zy: [2, 1],
	zz: [2, 2]
};
const NUMBER_RE = /^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/;
const NON_FINITE_RE = /^[+-]?(nan|inf|infinity)$/i;

const SHAPE_HELP =
	'expected 3 lines of 3 numbers, one line of 6 Voigt components (xx yy zz yz xz xy), ' +
	'one line of 9 row-major values, or JSON';

/** Parse a dielectric tensor written in any of the formats listed at the top of this file. */
export function parseDielectricTensor(text: string): ParsedTensor {
	if (typeof text !== 'string') throw new TensorParseError('input must be text');
	const trimmed = text.trim();
	if (trimmed === '') throw new TensorParseError('input is empty');
	if (trimmed.startsWith('{') || trimmed.startsWith('[')) return parseJson(text);
	return parseLines(text);
}

// ---------------------------------------------------------------------------------------------
// Plain text and CSV

interface ContentLine {
	line: number;
	cells: string[];
	delimited: boolean;
}

function splitCells(raw: string, line: number): { cells: string[]; delimited: boolean } {
	const delimiter = raw.includes(',') ? ',' : raw.includes(';') ? ';' : null;
	if (delimiter === null) return { cells: raw.split(/\s+/).filter((c) => c !== ''), delimited: false };
	let cells = raw.split(delimiter).map((c) => c.trim());
	// A trailing delimiter (as some spreadsheets write) leaves one empty last cell: drop it.
	if (cells.length > 1 && cells[cells.length - 1] === '') cells = cells.slice(0, -1);
	cells.forEach((c, i) => {
		// The corner cell of a header row (",x,y,z") may be empty; checked by the caller.
		if (c === '' && i !== 0) throw new TensorParseError(`empty cell in column ${i + 1}`, line);
	});
	return { cells, delimited: true };
}

function contentLines(text: string): ContentLine[] {
	const out: ContentLine[] = [];
	text.split(/\r\n|\r|\n/).forEach((rawLine, i) => {
		const line = i + 1;
		let s = rawLine.trim();
		if (s === '' || s.startsWith('#') || s.startsWith('!') || s.startsWith('%') || s.startsWith('//')) return;
		const hash = s.indexOf('#');
		if (hash >= 0) s = s.slice(0, hash).trim();
		if (s === '') return;
		const { cells, delimited } = splitCells(s, line);
		out.push({ line, cells, delimited });
	});
	return out;
}

function isNumberToken(token: string): boolean {
	return NUMBER_RE.test(token) || NON_FINITE_RE.test(token);
}

function parseNumber(token: string, line: number | null, where: string): number {
	if (NON_FINITE_RE.test(token)) throw new TensorParseError(`${where} is not a finite number: '${token}'`, line);
	if (!NUMBER_RE.test(token)) throw new TensorParseError(`${where} is not a number: '${token}'`, line);
	const value = Number(token.replace(/[dD]/, 'e'));
	if (!Number.isFinite(value)) throw new TensorParseError(`${where} is not a finite number: '${token}'`, line);
	return value;
}

function parseLines(text: string): ParsedTensor {
	let lines = contentLines(text);
	if (lines.length === 0) throw new TensorParseError('input has no numbers (only comments or blank lines)');
	const delimited = lines.some((l) => l.delimited);

	// Optional header: a first line with no numeric cell.
	let header: { line: number; labels: string[] } | null = null;
	const first = lines[0];
	if (first.cells.every((c) => c === '' || !isNumberToken(c))) {
		const labels = first.cells.filter((c, i) => !(i === 0 && c === '')).map((c) => c.toLowerCase());
		header = { line: first.line, labels };
		lines = lines.slice(1);
	} else if (first.cells[0] === '') {
		throw new TensorParseError('empty cell in column 1', first.line);
	}
	if (header !== null && header.labels.every((l) => l in COMPONENT_INDEX)) {
		return parseLabelled(header, lines);
	}
	if (header !== null && !(header.labels.length === 3 && header.labels.every((l, i) => l === AXES[i]))) {
		throw new TensorParseError(
			`unrecognised header '${header.labels.join(' ')}': use 'x y z' above a 3x3 matrix or component ` +
				`names (xx, yy, zz, xy, xz, yz, ...) above one line of values`,
			header.line
		);
	}

	if (lines.length === 0) throw new TensorParseError(`no values after the header; ${SHAPE_HELP}`, header?.line ?? null);

	if (lines.length === 1 && header === null) {
		const only = lines[0];
		if (only.cells.some((c) => c === '')) throw new TensorParseError('empty cell in column 1', only.line);
		const values = only.cells.map((c, i) => parseNumber(c, only.line, `value ${i + 1}`));
		if (values.length === 6) return { matrix: fromVoigt(values), format: 'voigt' };
		if (values.length === 9) {
			return { matrix: [values.slice(0, 3), values.slice(3, 6), values.slice(6, 9)], format: 'row-major' };
		}
		throw new TensorParseError(`found ${values.length} values on a single line; ${SHAPE_HELP}`, only.line);
	}

	if (lines.length !== 3) {
		throw new TensorParseError(
			`found ${lines.length} lines of values; ${SHAPE_HELP}`,
			lines.length > 3 ? lines[3].line : null
		);
	}
	const matrix = lines.map((l, row) => {
		let cells = l.cells;
		if (cells.length === 4 && !isNumberToken(cells[0])) {
			if (cells[0].toLowerCase() !== AXES[row]) {
				throw new TensorParseError(`row label '${cells[0]}' should be '${AXES[row]}' (rows in x, y, z order)`, l.line);
			}
			cells = cells.slice(1);
		}
		if (cells.length !== 3) {
			throw new TensorParseError(`row ${row + 1} has ${cells.length} values, expected 3; ${SHAPE_HELP}`, l.line);
		}
		return cells.map((c, col) => parseNumber(c, l.line, `${AXES[row]}${AXES[col]}`));
	});
	return { matrix, format: delimited ? 'matrix-csv' : 'matrix-text' };
}

function parseLabelled(header: { line: number; labels: string[] }, lines: ContentLine[]): ParsedTensor {
	const seen = new Set<string>();
	for (const label of header.labels) {
		if (seen.has(label)) throw new TensorParseError(`component '${label}' appears twice in the header`, header.line, label);
		seen.add(label);
	}
	if (lines.length !== 1) {
		throw new TensorParseError(
			`a header of component names must be followed by exactly one line of values, found ${lines.length}`,
			lines.length > 1 ? lines[1].line : header.line
		);
	}
	const row = lines[0];
	if (row.cells.length !== header.labels.length) {
		throw new TensorParseError(
			`header names ${header.labels.length} components but the line has ${row.cells.length} values`,
			row.line
		);
	}
	const components: Record<string, number> = {};
	header.labels.forEach((label, i) => {
		components[label] = parseNumber(row.cells[i], row.line, label);
	});
	return { matrix: fromComponents(components, row.line), format: 'labelled' };
}

// ---------------------------------------------------------------------------------------------
// JSON

function jsonErrorLine(text: string, message: string): number | null {
	const lineMatch = /line (\d+)/.exec(message);
	if (lineMatch) return Number(lineMatch[1]);
	const posMatch = /position (\d+)/.exec(message);
	if (posMatch) return text.slice(0, Number(posMatch[1])).split(/\r\n|\r|\n/).length;
	return null;
}

function parseJson(text: string): ParsedTensor {
	let data: unknown;
	try {
		data = JSON.parse(text);
	} catch (e) {
		const message = e instanceof Error ? e.message : String(e);
		throw new TensorParseError(`invalid JSON (${message})`, jsonErrorLine(text, message));
	}
	if (Array.isArray(data)) {
		if (data.length !== 3 || !data.every((row) => Array.isArray(row) && row.length === 3)) {
			throw new TensorParseError('a JSON array must be 3 rows of 3 numbers: [[xx,xy,xz],[yx,yy,yz],[zx,zy,zz]]');
		}
		const matrix = (data as unknown[][]).map((row, i) =>
			row.map((v, j) => jsonNumber(v, `${AXES[i]}${AXES[j]}`))
		);
		return { matrix, format: 'json-array' };
	}
	if (data !== null && typeof data === 'object') {
		const components: Record<string, number> = {};
		for (const [key, value] of Object.entries(data as Record<string, unknown>)) {
			const k = key.toLowerCase();
			if (!(k in COMPONENT_INDEX)) continue;
			if (k in components) throw new TensorParseError(`component '${k}' is given twice`, null, k);
			components[k] = jsonNumber(value, k);
		}
		return { matrix: fromComponents(components, null), format: 'json-object' };
	}
	throw new TensorParseError('JSON must be a 3x3 nested array or an object with xx, yy, zz, xy, xz, yz');
}

function jsonNumber(value: unknown, field: string): number {
	if (typeof value !== 'number') {
		throw new TensorParseError(`component ${field} must be a number, got ${JSON.stringify(value)}`, null, field);
	}
	if (!Number.isFinite(value)) throw new TensorParseError(`component ${field} is not a finite number`, null, field);
	return value;
}

// ---------------------------------------------------------------------------------------------
// Shared builders

function fromVoigt(v: number[]): number[][] {
	const [xx, yy, zz, yz, xz, xy] = v;
	return [
		[xx, xy, xz],
		[xy, yy, yz],
		[xz, yz, zz]
	];
}

/** Build a matrix from named components; the upper triangle and diagonal are required. */
function fromComponents(components: Record<string, number>, line: number | null): number[][] {
	const pairs: [string, string][] = [
		['xy', 'yx'],
		['xz', 'zx'],
		['yz', 'zy']
	];
	for (const d of ['xx', 'yy', 'zz']) {
		if (!(d in components)) throw new TensorParseError(`component ${d} is missing`, line, d);
	}
	for (const [upper, lower] of pairs) {
		if (!(upper in components) && !(lower in components)) {
			throw new TensorParseError(`component ${upper} is missing`, line, upper);
		}
		if (!(upper in components)) {
			throw new TensorParseError(`component ${upper} is missing (only ${lower} was given)`, line, upper);
		}
	}
	const matrix = [
		[0, 0, 0],
		[0, 0, 0],
		[0, 0, 0]
	];
	for (const [name, [i, j]] of Object.entries(COMPONENT_INDEX)) {
		if (name in components) matrix[i][j] = components[name];
	}
	for (const [upper, lower] of pairs) {
		if (!(lower in components)) {
			const [i, j] = COMPONENT_INDEX[upper];
			matrix[j][i] = components[upper];
		}
	}
	return matrix;
}

// ---------------------------------------------------------------------------------------------
// Writer

export type WritableTensorFormat = Exclude<TensorFormat, 'labelled'>;

/**
 * Write a 3x3 matrix in one of the parser's formats, so that `parseDielectricTensor(write(m, f))` returns
 * `m` and `f`. Numbers are written with JavaScript's shortest round-trip representation. The Voigt format
 * requires an exactly symmetric matrix (use the symmetrised tensor from the analysis).
 */
export function writeDielectricTensor(matrix: readonly (readonly number[])[], format: WritableTensorFormat): string {
	const rows: unknown = matrix;
	if (!Array.isArray(rows) || rows.length !== 3 || !rows.every((r) => Array.isArray(r) && r.length === 3)) {
		throw new RangeError('matrix must be 3x3');
	}
	(rows as unknown[][]).forEach((row, i) =>
		row.forEach((v, j) => {
			if (typeof v !== 'number' || !Number.isFinite(v)) {
				throw new RangeError(`matrix entry ${AXES[i]}${AXES[j]} must be a finite number, got ${String(v)}`);
			}
		})
	);
	const m = matrix;
	switch (format) {
		case 'matrix-text':
			return m.map((r) => r.map(String).join(' ')).join('\n') + '\n';
		case 'matrix-csv':
			return m.map((r) => r.map(String).join(',')).join('\n') + '\n';
		case 'row-major':
			return m.flat().map(String).join(' ') + '\n';
		case 'voigt': {
			if (m[0][1] !== m[1][0] || m[0][2] !== m[2][0] || m[1][2] !== m[2][1]) {
				throw new RangeError('the Voigt format needs an exactly symmetric matrix; symmetrise it first');
			}
			return [m[0][0], m[1][1], m[2][2], m[1][2], m[0][2], m[0][1]].map(String).join(' ') + '\n';
		}
		case 'json-array':
			return JSON.stringify(m.map((r) => [...r]));
		case 'json-object': {
			const o: Record<string, number> = {};
			for (const [name, [i, j]] of Object.entries(COMPONENT_INDEX)) o[name] = m[i][j];
			return JSON.stringify(o);
		}
		default:
			throw new RangeError(`unknown tensor format '${String(format)}'`);
	}
}
