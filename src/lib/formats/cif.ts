/**
 * A focused CIF 1.1 reader and the extraction of a crystal polymorph (cell, symmetry, Z, formula,
 * temperature, atom sites) from it.
 *
 * Grammar covered (CIF 1.1 syntax, IUCr): data blocks `data_name`; tags `_name` (case-insensitive);
 * `loop_` with one or more tags followed by values; bare values; single- and double-quoted values
 * (a quote closes only when followed by white space or the end of the line, so 'a dog's life' is one
 * value); semicolon text fields (a line starting with ';' opens and the next line starting with ';'
 * closes); comments from '#' to the end of the line; `?` (unknown) and `.` (inapplicable) when bare.
 * Save frames (`save_`, used by dictionaries) are skipped; `global_` and `stop_` are rejected.
 * Numbers may carry a standard uncertainty in parentheses: '8.562(2)' -> { value: 8.562, su: 0.002 }.
 */
import {
	FormulaError,
	elementBySymbol,
	formulaHill,
	molarMassGPerMol,
	parseFormula,
	type ElementCounts
} from '$lib/science/elements';
import {
	cellVolumeA3,
	cellVolumeSuA3,
	densityGPerCm3,
	volumePerMoleculeA3,
	type UnitCell,
	type Vec3
} from '$lib/science/lattice';

/** Error in a CIF; `line` is 1-based (0 when the error concerns the whole input, e.g. its size). */
export class CifParseError extends Error {
	readonly line: number;
	constructor(line: number, message: string) {
		super(line > 0 ? `line ${line}: ${message}` : message);
		this.name = 'CifParseError';
		this.line = line;
	}
}

/** One value as written in the file. `quoted` is true for quoted strings and text fields. */
export interface CifValue {
	text: string;
	quoted: boolean;
	/** 1-based line where the value starts. */
	line: number;
}

export interface CifLoop {
	/** Lower-case tag names, in file order. */
	tags: string[];
	/** 1-based line of `loop_`. */
	line: number;
	rowCount: number;
}

export interface CifBlock {
	/** Block name as written after `data_`. */
	name: string;
	/** 1-based line of the `data_` header. */
	line: number;
	/** Values by lower-case tag: one value for a plain item, one per row for a looped tag. */
	items: Map<string, CifValue[]>;
	/** 1-based line where each tag is written. */
	tagLines: Map<string, number>;
	loops: CifLoop[];
}

export interface CifDocument {
	blocks: CifBlock[];
}

export interface ParseCifOptions {
	/** Largest accepted input in bytes (UTF-8). Default 16 MB (CIFs may embed reflection data). */
	maxBytes?: number;
}

export const CIF_DEFAULT_MAX_BYTES = 16 * 1024 * 1024;

/** A number with its standard uncertainty, when one was given. */
export interface Measured {
	value: number;
	su?: number;
}

type TokenKind = 'tag' | 'value' | 'data' | 'loop' | 'save' | 'global' | 'stop';
interface Token {
	kind: TokenKind;
	text: string;
	quoted: boolean;
	line: number;
}

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
	if (n >= 1024 * 1024 && n % (1024 * 1024) === 0) return `${n / (1024 * 1024)} MB`;
	if (n >= 1024 && n % 1024 === 0) return `${n / 1024} kB`;
	return `${n} bytes`;
}

function toText(input: string | Uint8Array, maxBytes: number): string {
	if (!Number.isFinite(maxBytes) || maxBytes <= 0) {
		throw new RangeError(`maxBytes must be a finite number > 0, got ${maxBytes}`);
	}
	const tooBig = (size: number) =>
		new CifParseError(0, `CIF input is ${size} bytes, larger than the limit of ${formatBytes(maxBytes)} (maxBytes = ${maxBytes})`);
	if (typeof input === 'string') {
		const size = utf8Length(input);
		if (size > maxBytes) throw tooBig(size);
		return input;
	}
	if (!(input instanceof Uint8Array)) throw new TypeError('CIF input must be a string or a Uint8Array');
	if (input.byteLength > maxBytes) throw tooBig(input.byteLength);
	try {
		return new TextDecoder('utf-8', { fatal: true }).decode(input);
	} catch {
		throw new CifParseError(0, 'CIF input is not valid UTF-8 text');
	}
}

const isSpace = (ch: string | undefined) => ch === ' ' || ch === '\t';

function classifyBare(text: string, line: number): Token {
	if (text.startsWith('_')) return { kind: 'tag', text: text.toLowerCase(), quoted: false, line };
	const lower = text.toLowerCase();
	if (lower.startsWith('data_')) return { kind: 'data', text: text.slice(5), quoted: false, line };
	if (lower === 'loop_') return { kind: 'loop', text, quoted: false, line };
	if (lower.startsWith('save_')) return { kind: 'save', text: text.slice(5), quoted: false, line };
	if (lower === 'global_') return { kind: 'global', text, quoted: false, line };
	if (lower === 'stop_') return { kind: 'stop', text, quoted: false, line };
	return { kind: 'value', text, quoted: false, line };
}

/** Splits one line (outside text fields) into tokens, appending to `out`. */
function tokenizeLine(line: string, lineNo: number, out: Token[]): void {
	let p = 0;
	const n = line.length;
	while (p < n) {
		const ch = line[p];
		if (isSpace(ch)) {
			p++;
			continue;
		}
		if (ch === '#') return;
		if (ch === "'" || ch === '"') {
			let k = p + 1;
			while (k < n && !(line[k] === ch && (k + 1 === n || isSpace(line[k + 1])))) k++;
			if (k >= n) {
				const kind = ch === "'" ? 'single' : 'double';
				throw new CifParseError(
					lineNo,
					`unterminated ${kind}-quoted value starting ${JSON.stringify(line.slice(p, p + 20))} (no closing ${ch} followed by a space or the end of the line)`
				);
			}
			out.push({ kind: 'value', text: line.slice(p + 1, k), quoted: true, line: lineNo });
			p = k + 1;
			continue;
		}
		let k = p;
		while (k < n && !isSpace(line[k])) k++;
		out.push(classifyBare(line.slice(p, k), lineNo));
		p = k;
	}
}

function tokenize(text: string): Token[] {
	const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
	const tokens: Token[] = [];
	for (let i = 0; i < lines.length; i++) {
		const line = lines[i];
		if (line.startsWith(';')) {
			const start = i;
			const content: string[] = [line.slice(1)];
			i++;
			while (i < lines.length && !lines[i].startsWith(';')) content.push(lines[i++]);
			if (i >= lines.length) {
				throw new CifParseError(start + 1, 'text field opened with ";" is not closed (no later line starts with ";")');
			}
			if (content[0].trim() === '') content.shift();
			tokens.push({ kind: 'value', text: content.join('\n'), quoted: true, line: start + 1 });
			tokenizeLine(lines[i].slice(1), i + 1, tokens);
			continue;
		}
		tokenizeLine(line, i + 1, tokens);
	}
	return tokens;
}

/**
 * Parses CIF 1.1 text (or UTF-8 bytes) into data blocks. Throws CifParseError naming the line for:
 * no data block, content before the first data block, an unterminated quoted value or text field,
 * a tag without a value, a value without a tag, a loop without tags or whose value count is not a
 * multiple of its tag count, a repeated tag or block name, `global_`/`stop_`, an unclosed save frame.
 */
export function parseCif(input: string | Uint8Array, options: ParseCifOptions = {}): CifDocument {
	const text = toText(input, options.maxBytes ?? CIF_DEFAULT_MAX_BYTES);
	const tokens = tokenize(text);
	const blocks: CifBlock[] = [];
	const blockLines = new Map<string, number>();
	let block: CifBlock | undefined;

	const describe = (t: Token) =>
		t.kind === 'tag' ? `tag ${t.text}` : t.kind === 'value' ? `value ${JSON.stringify(t.text.slice(0, 40))}` : `'${t.kind}_'`;
	const addTag = (b: CifBlock, tag: string, line: number, values: CifValue[]) => {
		const first = b.tagLines.get(tag);
		if (first !== undefined) {
			throw new CifParseError(line, `tag ${tag} is repeated in data block '${b.name}' (first at line ${first})`);
		}
		b.tagLines.set(tag, line);
		b.items.set(tag, values);
	};
	const asValue = (t: Token): CifValue => ({ text: t.text, quoted: t.quoted, line: t.line });

	let i = 0;
	while (i < tokens.length) {
		const t = tokens[i];
		if (t.kind === 'data') {
			if (t.text === '') throw new CifParseError(t.line, "data block header 'data_' has no name");
			const key = t.text.toLowerCase();
			const first = blockLines.get(key);
			if (first !== undefined) {
				throw new CifParseError(t.line, `data block name '${t.text}' is repeated (first at line ${first})`);
			}
			blockLines.set(key, t.line);
			block = { name: t.text, line: t.line, items: new Map(), tagLines: new Map(), loops: [] };
			blocks.push(block);
			i++;
			continue;
		}
		if (t.kind === 'global' || t.kind === 'stop') {
			throw new CifParseError(t.line, `'${t.text}' is a reserved STAR word not allowed in CIF`);
		}
		if (!block) {
			throw new CifParseError(t.line, `${describe(t)} appears before the first data block header (data_...)`);
		}
		if (t.kind === 'save') {
			if (t.text === '') throw new CifParseError(t.line, "'save_' closes a save frame that was never opened");
			let k = i + 1;
			while (k < tokens.length && !(tokens[k].kind === 'save' && tokens[k].text === '')) {
				if (tokens[k].kind === 'data' || tokens[k].kind === 'save') break;
				k++;
			}
			if (k >= tokens.length || tokens[k].kind !== 'save' || tokens[k].text !== '') {
				throw new CifParseError(t.line, `save frame 'save_${t.text}' is not closed with 'save_'`);
			}
			i = k + 1;
			continue;
		}
		if (t.kind === 'tag') {
			const next = tokens[i + 1];
			if (!next || next.kind !== 'value') throw new CifParseError(t.line, `tag ${t.text} has no value`);
			addTag(block, t.text, t.line, [asValue(next)]);
			i += 2;
			continue;
		}
		if (t.kind === 'loop') {
			const tags: Token[] = [];
			let k = i + 1;
			while (k < tokens.length && tokens[k].kind === 'tag') tags.push(tokens[k++]);
			if (tags.length === 0) throw new CifParseError(t.line, 'loop_ has no tags');
			const values: Token[] = [];
			while (k < tokens.length && tokens[k].kind === 'value') values.push(tokens[k++]);
			if (values.length === 0) {
				throw new CifParseError(t.line, `loop_ with ${tags.length} tag${tags.length === 1 ? '' : 's'} (${tags[0].text}, ...) has no values`);
			}
			if (values.length % tags.length !== 0) {
				const last = values[values.length - 1];
				throw new CifParseError(
					t.line,
					`loop_ has ${tags.length} tags but ${values.length} values (${values[0].line === last.line ? `line ${last.line}` : `lines ${values[0].line}-${last.line}`}), not a multiple of ${tags.length}`
				);
			}
			const rows = values.length / tags.length;
			tags.forEach((tag, col) => {
				const column: CifValue[] = [];
				for (let r = 0; r < rows; r++) column.push(asValue(values[r * tags.length + col]));
				addTag(block as CifBlock, tag.text, tag.line, column);
			});
			block.loops.push({ tags: tags.map((x) => x.text), line: t.line, rowCount: rows });
			i = k;
			continue;
		}
		// a value with no tag before it
		throw new CifParseError(t.line, `${describe(t)} has no tag (values follow a tag or belong to a loop_)`);
	}
	if (blocks.length === 0) {
		throw new CifParseError(1, 'no data block found (a CIF starts its content with data_<name>)');
	}
	return { blocks };
}

/** True for a bare `?` (unknown) or `.` (inapplicable). */
export function isCifUnknown(v: CifValue | undefined): boolean {
	return v === undefined || (!v.quoted && (v.text === '?' || v.text === '.'));
}

const CIF_NUMBER_RE = /^([+-]?)(\d+\.?\d*|\.\d+)(?:[eE]([+-]?\d+))?(?:\((\d+)\))?$/;

/**
 * Reads a CIF number with optional standard uncertainty: '8.562(2)' -> { value: 8.562, su: 0.002 },
 * '152(2)' -> { value: 152, su: 2 }, '1.5e-3(2)' -> { value: 0.0015, su: 0.0002 }.
 * Returns undefined when the text is not a number.
 */
export function parseCifNumber(text: string): Measured | undefined {
	const m = CIF_NUMBER_RE.exec(text.trim());
	if (!m) return undefined;
	const [, sign, mantissa, exponent, suDigits] = m;
	const exp = exponent === undefined ? 0 : Number(exponent);
	const value = Number(`${sign}${mantissa}e${exp}`);
	if (!Number.isFinite(value)) return undefined;
	if (suDigits === undefined) return { value: value + 0 };
	const dot = mantissa.indexOf('.');
	const decimals = dot < 0 ? 0 : mantissa.length - dot - 1;
	const su = Number(`${suDigits}e${exp - decimals}`);
	return { value: value + 0, su };
}

// ---------------------------------------------------------------------------------------------
// Polymorph extraction

export interface CifAtomSite {
	label: string;
	/** Element symbol from _atom_site_type_symbol, or derived from the label. */
	element: string;
	/** Fractional coordinates (su dropped). */
	fract: Vec3;
	/** Site occupancy, 1 when not given. */
	occupancy: number;
}

export interface CifPolymorph {
	blockName: string;
	cell: { a: Measured; b: Measured; c: Measured; alphaDeg: Measured; betaDeg: Measured; gammaDeg: Measured };
	spaceGroup: { hermannMauguin?: string; number?: number; hall?: string };
	/** Formula units per cell (_cell_formula_units_Z). */
	z?: number;
	formula?: { sum: string; counts: ElementCounts; hill: string; molarMassGPerMol: number };
	temperatureK?: Measured;
	atomSites: CifAtomSite[];
	/** Computed from the cell. */
	volumeA3: number;
	/** Propagated from the cell uncertainties (uncorrelated), when any are given. */
	volumeSuA3?: number;
	volumePerMoleculeA3?: number;
	densityGPerCm3?: number;
	/** Values printed in the file, for comparison. */
	reported: { volumeA3?: Measured; densityGPerCm3?: number; formulaWeightGPerMol?: number };
	/** Non-fatal findings (skipped atom sites, printed values that disagree with computed ones). */
	warnings: string[];
}

export interface PolymorphFromCifOptions extends ParseCifOptions {
	/** Name of the data block to read; default: the first block with _cell_length_a. */
	blockName?: string;
}

function firstValue(block: CifBlock, tags: readonly string[]): { tag: string; value: CifValue } | undefined {
	for (const tag of tags) {
		const values = block.items.get(tag);
		if (values && values.length > 0) return { tag, value: values[0] };
	}
	return undefined;
}

function numberAt(tag: string, v: CifValue): Measured {
	const m = parseCifNumber(v.text);
	if (!m) throw new CifParseError(v.line, `${tag} value ${JSON.stringify(v.text)} is not a number`);
	return m;
}

function optionalNumber(block: CifBlock, tags: readonly string[]): Measured | undefined {
	const found = firstValue(block, tags);
	if (!found || isCifUnknown(found.value)) return undefined;
	return numberAt(found.tag, found.value);
}

const CELL_TAGS = [
	['a', '_cell_length_a'],
	['b', '_cell_length_b'],
	['c', '_cell_length_c'],
	['alphaDeg', '_cell_angle_alpha'],
	['betaDeg', '_cell_angle_beta'],
	['gammaDeg', '_cell_angle_gamma']
] as const;

/** Element symbol from a type symbol ('O2-', 'Fe3+', 'Cl') or an atom label ('C12', 'H3A', 'Cl1'). */
function elementFromSymbolOrLabel(text: string): string | undefined {
	const m = /^([A-Za-z])([A-Za-z]?)/.exec(text.trim());
	if (!m) return undefined;
	const [, first, second] = m;
	if (second) {
		// two-letter symbol only when written with a lower-case second letter ('Cl1'; 'CA' stays C)
		if (second === second.toLowerCase()) {
			const two = elementBySymbol(first + second);
			if (two) return two.symbol;
		}
	}
	if (first.toUpperCase() === 'D') return 'H'; // deuterium
	return elementBySymbol(first)?.symbol;
}

function readAtomSites(block: CifBlock, warnings: string[]): CifAtomSite[] {
	const labels = block.items.get('_atom_site_label');
	const xs = block.items.get('_atom_site_fract_x');
	const ys = block.items.get('_atom_site_fract_y');
	const zs = block.items.get('_atom_site_fract_z');
	if (!xs || !ys || !zs) {
		if (labels && labels.length > 0) {
			warnings.push('atom sites have no fractional coordinates (_atom_site_fract_x/y/z); none read');
		}
		return [];
	}
	const types = block.items.get('_atom_site_type_symbol');
	const occs = block.items.get('_atom_site_occupancy');
	const flags = block.items.get('_atom_site_calc_flag');
	const n = xs.length;
	for (const [tag, col] of [
		['_atom_site_fract_y', ys],
		['_atom_site_fract_z', zs],
		['_atom_site_label', labels],
		['_atom_site_type_symbol', types],
		['_atom_site_occupancy', occs]
	] as const) {
		if (col && col.length !== n) {
			throw new CifParseError(
				block.tagLines.get(tag) ?? block.line,
				`${tag} has ${col.length} values but _atom_site_fract_x has ${n}; they must be in the same loop_`
			);
		}
	}
	const sites: CifAtomSite[] = [];
	for (let r = 0; r < n; r++) {
		const label = labels && !isCifUnknown(labels[r]) ? labels[r].text : `site ${r + 1}`;
		const line = xs[r].line;
		if (flags && !isCifUnknown(flags[r]) && flags[r].text.toLowerCase() === 'dum') {
			warnings.push(`line ${line}: atom site ${label} is a dummy site (calc_flag dum); skipped`);
			continue;
		}
		if (isCifUnknown(xs[r]) || isCifUnknown(ys[r]) || isCifUnknown(zs[r])) {
			warnings.push(`line ${line}: atom site ${label} has unknown coordinates; skipped`);
			continue;
		}
		const typeText = types && !isCifUnknown(types[r]) ? types[r].text : undefined;
		const element = elementFromSymbolOrLabel(typeText ?? label);
		if (!element) {
			throw new CifParseError(
				typeText !== undefined ? (types as CifValue[])[r].line : line,
				typeText !== undefined
					? `atom site ${label}: unknown element in type symbol ${JSON.stringify(typeText)}`
					: `atom site ${label}: no _atom_site_type_symbol and no element symbol at the start of the label`
			);
		}
		let occupancy = 1;
		if (occs && !isCifUnknown(occs[r])) {
			occupancy = numberAt('_atom_site_occupancy', occs[r]).value;
			if (occupancy < 0 || occupancy > 1.000001) {
				throw new CifParseError(occs[r].line, `atom site ${label}: occupancy ${occs[r].text} is outside 0..1`);
			}
		}
		sites.push({
			label,
			element,
			fract: [
				numberAt('_atom_site_fract_x', xs[r]).value,
				numberAt('_atom_site_fract_y', ys[r]).value,
				numberAt('_atom_site_fract_z', zs[r]).value
			],
			occupancy
		});
	}
	return sites;
}

/**
 * Reads the crystal structure of one data block: cell (with su), space group (H-M symbol, number,
 * Hall symbol), Z, sum formula, temperature (K), atom sites, and the volume, volume per formula unit
 * and density computed with the lattice module. Throws CifParseError naming the line for syntax errors
 * (see `parseCif`), missing or unknown cell tags, non-numeric values, a non-physical cell, a bad Z,
 * space-group number or formula.
 */
export function polymorphFromCif(input: string | Uint8Array, options: PolymorphFromCifOptions = {}): CifPolymorph {
	const { blocks } = parseCif(input, options);
	let block: CifBlock | undefined;
	if (options.blockName !== undefined) {
		block = blocks.find((b) => b.name.toLowerCase() === options.blockName?.toLowerCase());
		if (!block) {
			throw new CifParseError(0, `no data block named '${options.blockName}' (found: ${blocks.map((b) => b.name).join(', ')})`);
		}
	} else {
		block = blocks.find((b) => b.items.has('_cell_length_a')) ?? blocks[0];
	}
	const warnings: string[] = [];

	// Cell
	const cellM = {} as CifPolymorph['cell'];
	for (const [key, tag] of CELL_TAGS) {
		const v = block.items.get(tag)?.[0];
		if (!v) {
			throw new CifParseError(block.line, `data block '${block.name}' is missing the required cell tag ${tag}`);
		}
		if (isCifUnknown(v)) throw new CifParseError(v.line, `required cell tag ${tag} has no value ('${v.text}')`);
		cellM[key] = numberAt(tag, v);
	}
	const cell: UnitCell = {
		a: cellM.a.value,
		b: cellM.b.value,
		c: cellM.c.value,
		alphaDeg: cellM.alphaDeg.value,
		betaDeg: cellM.betaDeg.value,
		gammaDeg: cellM.gammaDeg.value
	};
	let volumeA3: number;
	try {
		volumeA3 = cellVolumeA3(cell);
	} catch (e) {
		const line = block.tagLines.get('_cell_length_a') ?? block.line;
		throw new CifParseError(line, `the cell is not physical: ${(e as Error).message}`);
	}
	const hasSu = CELL_TAGS.some(([key]) => cellM[key].su !== undefined);
	const volumeSuA3 = hasSu
		? cellVolumeSuA3(cell, Object.fromEntries(CELL_TAGS.map(([key]) => [key, cellM[key].su ?? 0])))
		: undefined;

	// Space group
	const spaceGroup: CifPolymorph['spaceGroup'] = {};
	const hm = firstValue(block, ['_space_group_name_h-m_alt', '_symmetry_space_group_name_h-m']);
	if (hm && !isCifUnknown(hm.value)) spaceGroup.hermannMauguin = hm.value.text.trim().replace(/\s+/g, ' ');
	const hall = firstValue(block, ['_space_group_name_hall', '_symmetry_space_group_name_hall']);
	if (hall && !isCifUnknown(hall.value)) spaceGroup.hall = hall.value.text.trim().replace(/\s+/g, ' ');
	const sgn = firstValue(block, ['_space_group_it_number', '_symmetry_int_tables_number']);
	if (sgn && !isCifUnknown(sgn.value)) {
		const num = numberAt(sgn.tag, sgn.value).value;
		if (!Number.isInteger(num) || num < 1 || num > 230) {
			throw new CifParseError(sgn.value.line, `${sgn.tag} must be a whole number from 1 to 230, got ${sgn.value.text}`);
		}
		spaceGroup.number = num;
	}

	// Z
	let z: number | undefined;
	const zv = block.items.get('_cell_formula_units_z')?.[0];
	if (zv && !isCifUnknown(zv)) {
		const zm = numberAt('_cell_formula_units_z', zv).value;
		if (!Number.isInteger(zm) || zm < 1) {
			throw new CifParseError(zv.line, `_cell_formula_units_Z must be a whole number >= 1, got ${zv.text}`);
		}
		z = zm;
	}

	// Formula
	let formula: CifPolymorph['formula'];
	const fv = block.items.get('_chemical_formula_sum')?.[0];
	if (fv && !isCifUnknown(fv)) {
		try {
			const counts = parseFormula(fv.text.replace(/\s+/g, ' '));
			formula = { sum: fv.text.trim(), counts, hill: formulaHill(counts), molarMassGPerMol: molarMassGPerMol(counts) };
		} catch (e) {
			if (e instanceof FormulaError) throw new CifParseError(fv.line, `_chemical_formula_sum: ${e.message}`);
			throw e;
		}
	}

	const temperatureK = optionalNumber(block, ['_cell_measurement_temperature', '_diffrn_ambient_temperature']);
	if (temperatureK && !(temperatureK.value > 0)) {
		const t = firstValue(block, ['_cell_measurement_temperature', '_diffrn_ambient_temperature']) as { value: CifValue };
		throw new CifParseError(t.value.line, `temperature must be > 0 K, got ${t.value.text}`);
	}

	const atomSites = readAtomSites(block, warnings);

	const volumePerMolecule = z !== undefined ? volumePerMoleculeA3(volumeA3, z) : undefined;
	const density = z !== undefined && formula && formula.molarMassGPerMol > 0 ? densityGPerCm3(formula.molarMassGPerMol, z, volumeA3) : undefined;

	const reported: CifPolymorph['reported'] = {};
	const rv = optionalNumber(block, ['_cell_volume']);
	if (rv) {
		reported.volumeA3 = rv;
		const tolerance = Math.max(3 * (rv.su ?? 0), 1e-3 * rv.value, 0.01);
		if (Math.abs(rv.value - volumeA3) > tolerance) {
			warnings.push(`_cell_volume ${rv.value} Å³ differs from the volume computed from the cell, ${volumeA3.toFixed(2)} Å³`);
		}
	}
	const rd = optionalNumber(block, ['_exptl_crystal_density_diffrn']);
	if (rd) {
		reported.densityGPerCm3 = rd.value;
		if (density !== undefined && Math.abs(rd.value - density) > 0.01 * rd.value) {
			warnings.push(`_exptl_crystal_density_diffrn ${rd.value} g/cm³ differs from the computed ${density.toFixed(3)} g/cm³`);
		}
	}
	const rw = optionalNumber(block, ['_chemical_formula_weight']);
	if (rw) reported.formulaWeightGPerMol = rw.value;

	const result: CifPolymorph = {
		blockName: block.name,
		cell: cellM,
		spaceGroup,
		atomSites,
		volumeA3,
		reported,
		warnings
	};
	if (volumeSuA3 !== undefined) result.volumeSuA3 = volumeSuA3;
	if (z !== undefined) result.z = z;
	if (formula) result.formula = formula;
	if (temperatureK) result.temperatureK = temperatureK;
	if (volumePerMolecule !== undefined) result.volumePerMoleculeA3 = volumePerMolecule;
	if (density !== undefined) result.densityGPerCm3 = density;
	return result;
}
