/**
 * XYZ molecule files: parse, write, and the quantities derived from an atom list
 * (Hill formula, electron count, default spin multiplicity).
 *
 * Format: line 1 the atom count, line 2 a free comment, then one line per atom, `El x y z` in Å.
 * The element may be a symbol in any case ('C', 'cl') or an atomic number ('6').
 */
import { elementByNumber, elementBySymbol, formulaHill, type ElementCounts } from '$lib/science/elements';

export { formulaHill };

/** Error in an XYZ file; `line` is 1-based (0 when the error concerns the whole file, e.g. its size). */
export class XyzParseError extends Error {
	readonly line: number;
	constructor(line: number, message: string) {
		super(line > 0 ? `line ${line}: ${message}` : message);
		this.name = 'XyzParseError';
		this.line = line;
	}
}

export interface XyzAtom {
	/** Element symbol, normalised ('C', 'Cl'). */
	element: string;
	/** Cartesian coordinates in Å. */
	x: number;
	y: number;
	z: number;
}

export interface XyzMolecule {
	comment: string;
	atoms: XyzAtom[];
	/** Hill-order formula, e.g. 'C14H10'. */
	formula: string;
	counts: ElementCounts;
}

export interface ParseXyzOptions {
	/** Largest accepted input in bytes (UTF-8). Default 1 MB (1 048 576 bytes). */
	maxBytes?: number;
}

export const XYZ_DEFAULT_MAX_BYTES = 1024 * 1024;

const NUMBER_RE = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?$/;

function utf8Length(text: string): number {
	let bytes = 0;
	for (let i = 0; i < text.length; i++) {
		const code = text.charCodeAt(i);
		if (code < 0x80) bytes += 1;
		else if (code < 0x800) bytes += 2;
		else if (code >= 0xd800 && code <= 0xdbff && i + 1 < text.length) {
			bytes += 4;
			i++;
		} else bytes += 3;
	}
	return bytes;
}

function formatBytes(n: number): string {
	return n >= 1024 * 1024 && n % (1024 * 1024) === 0
		? `${n / (1024 * 1024)} MB`
		: n >= 1024 && n % 1024 === 0
			? `${n / 1024} kB`
			: `${n} bytes`;
}

/** Decodes bytes or passes text through, enforcing the size limit first. */
function toText(input: string | Uint8Array, maxBytes: number): string {
	if (!Number.isFinite(maxBytes) || maxBytes <= 0) {
		throw new RangeError(`maxBytes must be a finite number > 0, got ${maxBytes}`);
	}
	if (typeof input === 'string') {
		const size = utf8Length(input);
		if (size > maxBytes) {
			throw new XyzParseError(0, `XYZ input is ${size} bytes, larger than the limit of ${formatBytes(maxBytes)} (maxBytes = ${maxBytes})`);
		}
		return input;
	}
	if (!(input instanceof Uint8Array)) throw new TypeError('XYZ input must be a string or a Uint8Array');
	if (input.byteLength > maxBytes) {
		throw new XyzParseError(
			0,
			`XYZ input is ${input.byteLength} bytes, larger than the limit of ${formatBytes(maxBytes)} (maxBytes = ${maxBytes})`
		);
	}
	try {
		return new TextDecoder('utf-8', { fatal: true }).decode(input);
	} catch {
		throw new XyzParseError(0, 'XYZ input is not valid UTF-8 text');
	}
}

function parseCoordinate(token: string, axis: string, line: number): number {
	if (!NUMBER_RE.test(token)) {
		throw new XyzParseError(line, `${axis} coordinate '${token}' is not a finite number`);
	}
	const value = Number(token.replace(/[dD]/, 'e'));
	if (!Number.isFinite(value)) throw new XyzParseError(line, `${axis} coordinate '${token}' is not a finite number`);
	return value + 0; // turns -0 into 0
}

function parseElement(token: string, line: number): string {
	if (/^\d+$/.test(token)) {
		const el = elementByNumber(Number(token));
		if (!el) throw new XyzParseError(line, `unknown element: atomic number ${token} (supported 1 to 86)`);
		return el.symbol;
	}
	const el = /^[A-Za-z]{1,2}$/.test(token) ? elementBySymbol(token) : undefined;
	if (!el) throw new XyzParseError(line, `unknown element symbol '${token}'`);
	return el.symbol;
}

/** Element counts of an atom list. */
function countsOf(atoms: ReadonlyArray<{ element: string }>): ElementCounts {
	const counts: ElementCounts = {};
	for (const a of atoms) counts[a.element] = (counts[a.element] ?? 0) + 1;
	return counts;
}

/**
 * Parses a single-structure XYZ file (text or UTF-8 bytes). Accepts tabs and repeated spaces,
 * Windows/old-Mac newlines, a byte-order mark and trailing blank lines.
 * Throws XyzParseError naming the 1-based line for: an empty file, a missing or non-integer atom
 * count, an atom count that does not match the atom lines (expected vs found), an unknown element,
 * a line without exactly three coordinates, a non-finite coordinate, or an input above `maxBytes`.
 */
export function parseXyz(input: string | Uint8Array, options: ParseXyzOptions = {}): XyzMolecule {
	const maxBytes = options.maxBytes ?? XYZ_DEFAULT_MAX_BYTES;
	const text = toText(input, maxBytes).replace(/^\uFEFF/, '');
	const lines = text.split(/\r\n|\r|\n/);
	while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
	if (lines.length === 0) throw new XyzParseError(1, 'file is empty (expected the atom count)');

	const countText = lines[0].trim();
	if (countText === '') throw new XyzParseError(1, 'atom count is missing (line 1 is blank)');
	if (!/^\+?\d+$/.test(countText)) {
		throw new XyzParseError(1, `atom count must be a whole number, got '${countText}'`);
	}
	const expected = Number(countText);
	if (!Number.isSafeInteger(expected) || expected < 1) {
		throw new XyzParseError(1, `atom count must be at least 1, got ${countText}`);
	}

	const comment = lines.length > 1 ? lines[1].trim() : '';
	const atoms: XyzAtom[] = [];
	for (let k = 0; k < expected; k++) {
		const idx = 2 + k;
		const lineNo = idx + 1;
		if (idx >= lines.length) {
			throw new XyzParseError(lineNo, `expected ${expected} atoms (line 1), found ${atoms.length}`);
		}
		const tokens = lines[idx].trim().split(/\s+/).filter((t) => t !== '');
		if (tokens.length === 0) {
			throw new XyzParseError(lineNo, `blank line where atom ${k + 1} of ${expected} was expected`);
		}
		const element = parseElement(tokens[0], lineNo);
		const coords = tokens.slice(1);
		if (coords.length !== 3) {
			throw new XyzParseError(
				lineNo,
				`expected an element and three coordinates (x y z), found ${coords.length} value${coords.length === 1 ? '' : 's'} after '${tokens[0]}'`
			);
		}
		atoms.push({
			element,
			x: parseCoordinate(coords[0], 'x', lineNo),
			y: parseCoordinate(coords[1], 'y', lineNo),
			z: parseCoordinate(coords[2], 'z', lineNo)
		});
	}

	const rest = lines.slice(2 + expected);
	const firstExtra = rest.findIndex((l) => l.trim() !== '');
	if (firstExtra >= 0) {
		const lineNo = 2 + expected + firstExtra + 1;
		if (/^\s*\d+\s*$/.test(rest[firstExtra])) {
			throw new XyzParseError(lineNo, 'a second structure starts here; only single-structure XYZ files are accepted');
		}
		const found = expected + rest.filter((l) => l.trim() !== '').length;
		throw new XyzParseError(lineNo, `expected ${expected} atoms (line 1), found ${found} atom lines`);
	}

	const counts = countsOf(atoms);
	return { comment, atoms, formula: formulaHill(counts), counts };
}

export interface WriteXyzOptions {
	/** Fixed decimals for coordinates; default: the shortest text that reads back to the same number. */
	decimals?: number;
}

/**
 * Writes an XYZ file (LF newlines, trailing newline). Newlines in the comment become spaces.
 * Throws RangeError for no atoms, an unknown element or a non-finite coordinate.
 */
export function writeXyz(
	molecule: { comment?: string; atoms: ReadonlyArray<XyzAtom> },
	options: WriteXyzOptions = {}
): string {
	const { atoms } = molecule;
	if (!Array.isArray(atoms) || atoms.length === 0) throw new RangeError('an XYZ file needs at least one atom');
	const { decimals } = options;
	if (decimals !== undefined && !(Number.isInteger(decimals) && decimals >= 0 && decimals <= 20)) {
		throw new RangeError(`decimals must be an integer from 0 to 20, got ${decimals}`);
	}
	const fmt = (v: number) => (decimals === undefined ? String(v + 0) : (v + 0).toFixed(decimals));
	const rows = atoms.map((a, i) => {
		const el = elementBySymbol(a.element);
		if (!el) throw new RangeError(`atom ${i + 1}: unknown element '${a.element}'`);
		for (const axis of ['x', 'y', 'z'] as const) {
			if (!Number.isFinite(a[axis])) throw new RangeError(`atom ${i + 1}: ${axis} must be a finite number, got ${a[axis]}`);
		}
		return [el.symbol, fmt(a.x), fmt(a.y), fmt(a.z)];
	});
	const width = Math.max(...rows.flatMap((r) => r.slice(1).map((s) => s.length)));
	const comment = (molecule.comment ?? '').replace(/[\r\n]+/g, ' ');
	const body = rows.map(([el, x, y, z]) => `${el.padEnd(2)} ${x.padStart(width)} ${y.padStart(width)} ${z.padStart(width)}`);
	return `${atoms.length}\n${comment}\n${body.join('\n')}\n`;
}

function totalAtomicNumber(atoms: ReadonlyArray<{ element: string }>): number {
	let sum = 0;
	atoms.forEach((a, i) => {
		const el = elementBySymbol(a.element);
		if (!el) throw new RangeError(`atom ${i + 1}: unknown element '${a.element}'`);
		sum += el.atomicNumber;
	});
	return sum;
}

function assertCharge(charge: number): void {
	if (!Number.isInteger(charge)) throw new RangeError(`charge must be a whole number, got ${charge}`);
}

/**
 * Number of electrons: sum of atomic numbers minus the charge (a cation has fewer electrons).
 * Throws RangeError for an unknown element, a non-integer charge, or a result below zero.
 */
export function electronCount(atoms: ReadonlyArray<{ element: string }>, charge = 0): number {
	assertCharge(charge);
	const n = totalAtomicNumber(atoms) - charge;
	if (n < 0) throw new RangeError(`charge ${charge} leaves ${n} electrons`);
	return n;
}

/** Lowest spin multiplicity for the electron count: 1 (singlet) if even, 2 (doublet) if odd. */
export function defaultMultiplicity(atoms: ReadonlyArray<{ element: string }>, charge = 0): 1 | 2 {
	return electronCount(atoms, charge) % 2 === 0 ? 1 : 2;
}
