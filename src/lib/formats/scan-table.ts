/**
 * Gamma-scan tables as text: CSV, TSV, semicolon- or whitespace-separated tables with a header row,
 * pasted or uploaded by the user, turned into `ScanPoint[]`; and a CSV writer for the same points.
 *
 * Three steps, so that the page can show and correct the column mapping:
 * 1. `parseScanTable(text)` splits the text into a header and rows of cells (delimiter sniffed).
 * 2. `proposeScanMapping(headers)` proposes which column holds which ScanPoint field, from common
 *    header names (gamma/omega/mu, E_N/E0/neutral, E_cation/E(N-1), E_anion/E(N+1), HOMO, LUMO,
 *    HOMO_anion, ...), and reads unit hints from the headers ("(eV)", "/Ha", "[bohr^-1]").
 * 3. `applyMapping(table, mapping, { energyUnit, gammaUnit })` converts the cells to ScanPoint[]
 *    (energies in hartree, gamma in bohr^-1).
 * `parseScanPoints(text)` runs the three steps with the proposed mapping.
 *
 * Text rules: a byte-order mark, \r\n, \r and \n are accepted; blank lines are skipped; lines starting
 * with `#` are comments, except that a `#`-prefixed line directly followed by data serves as the header
 * (gnuplot style, `# gamma E_N ...`). Delimiter: tab, then semicolon, then comma, then runs of whitespace,
 * the first that splits the header and the first data lines into the same number (>= 2) of cells.
 * Double-quoted cells are understood for tab, semicolon and comma. When the delimiter is not a comma,
 * a decimal comma (`0,25`) is read as a decimal point. Fortran exponents (`1.0D-02`) are read. Empty
 * cells and NA, N/A, NaN, null, none, `-` mean "missing".
 *
 * Every error is a `ScanTableError` naming the 1-based line of the text and, when it concerns a cell,
 * the column header.
 */
import type { ScanEnergyField, ScanPoint } from '$lib/science/tuning/types';
import { SCAN_ENERGY_FIELDS } from '$lib/science/tuning/types';
import { HARTREE_EV, angInvToBohrInv, evToHartree } from '$lib/science/units';

export class ScanTableError extends Error {
	/** 1-based line of the text, or null when the problem is not tied to one line. */
	readonly line: number | null;
	/** Header of the column concerned, or null. */
	readonly column: string | null;

	constructor(message: string, line: number | null = null, column: string | null = null) {
		const where = [line === null ? null : `line ${line}`, column === null ? null : `column "${column}"`]
			.filter(Boolean)
			.join(', ');
		super(where ? `${where}: ${message}` : message);
		this.name = 'ScanTableError';
		this.line = line;
		this.column = column;
	}
}

export type ScanDelimiter = 'tab' | 'semicolon' | 'comma' | 'whitespace';

export interface ScanTableRow {
	/** 1-based line of the text. */
	line: number;
	cells: string[];
}

export interface ScanTable {
	delimiter: ScanDelimiter;
	/** Whether a decimal comma is accepted in numbers (delimiter other than comma). */
	decimalComma: boolean;
	/** 1-based line of the header. */
	headerLine: number;
	headers: string[];
	rows: ScanTableRow[];
}

export interface ParseScanTableOptions {
	/** Force a delimiter instead of sniffing it. */
	delimiter?: ScanDelimiter;
	/** Largest accepted input, in characters (or bytes for byte input); default 1 MiB. */
	maxLength?: number;
}

/** The fields a column can be mapped to. */
export const SCAN_FIELDS = ['gammaBohrInv', ...SCAN_ENERGY_FIELDS, 'excluded'] as const;
export type ScanField = (typeof SCAN_FIELDS)[number];

/** Column index (0-based, into `headers`) for each mapped field. */
export type ScanMapping = Partial<Record<ScanField, number>>;

export type ScanEnergyUnit = 'hartree' | 'eV';
export type ScanGammaUnit = 'bohr^-1' | 'angstrom^-1';

export interface ScanMappingProposal {
	mapping: ScanMapping;
	/** Headers (by column index) that were not recognised. */
	unmatched: { column: number; header: string }[];
	/** Energy unit written in the mapped energy headers, if they agree on one; else null. */
	energyUnitHint: ScanEnergyUnit | null;
	/** Gamma unit written in the gamma header, if any; else null. */
	gammaUnitHint: ScanGammaUnit | null;
}

export interface ApplyMappingOptions {
	/** Unit of the energy columns (default 'hartree'); converted to hartree. */
	energyUnit?: ScanEnergyUnit;
	/**
	 * Refuse values that are orders of magnitude off for the chosen unit (default true): an orbital energy
	 * beyond ±2 hartree (54 eV), a neutral HOMO above -1 eV, or total energies whose difference E(N-1) - E(N)
	 * is beyond 2 hartree. Valence orbital energies and ionization energies of molecules lie far inside
	 * these bounds (common practice), so a hit almost always means the wrong unit was chosen.
	 */
	checkMagnitudes?: boolean;
	/** Unit of the gamma column (default 'bohr^-1'); converted to bohr^-1. */
	gammaUnit?: ScanGammaUnit;
}

export const SCAN_TABLE_DEFAULT_MAX_LENGTH = 1024 * 1024;

const DELIMITER_CHAR: Record<Exclude<ScanDelimiter, 'whitespace'>, string> = {
	tab: '\t',
	semicolon: ';',
	comma: ','
};

/** Splits one line on a single-character delimiter, honouring double quotes ("" is a literal quote). */
function splitQuoted(line: string, delim: string): string[] {
	const cells: string[] = [];
	let cur = '';
	let quoted = false;
	for (let i = 0; i < line.length; i++) {
		const ch = line[i];
		if (quoted) {
			if (ch === '"') {
				if (line[i + 1] === '"') {
					cur += '"';
					i++;
				} else quoted = false;
			} else cur += ch;
		} else if (ch === '"' && cur.trim() === '') {
			quoted = true;
			cur = '';
		} else if (ch === delim) {
			cells.push(cur.trim());
			cur = '';
		} else cur += ch;
	}
	cells.push(cur.trim());
	return cells;
}

function splitLine(line: string, delimiter: ScanDelimiter): string[] {
	if (delimiter === 'whitespace') return line.trim().split(/\s+/);
	return splitQuoted(line, DELIMITER_CHAR[delimiter]);
}

const NUMBER_RE = /^[+-]?(\d+(\.\d*)?|\.\d+)([eEdD][+-]?\d+)?$/;
const MISSING = new Set(['', 'na', 'n/a', 'nan', 'null', 'none', '-', '--']);

/** A cell as a number, null when it says "missing", undefined when it is not a number. */
function cellNumber(cell: string, decimalComma: boolean): number | null | undefined {
	const t = cell.trim();
	if (MISSING.has(t.toLowerCase())) return null;
	let s = t.replace(/\u2212/g, '-');
	if (decimalComma && /^[+-]?\d*,\d+([eEdD][+-]?\d+)?$/.test(s)) s = s.replace(',', '.');
	if (!NUMBER_RE.test(s)) return undefined;
	const v = Number(s.replace(/[dD]/, 'e'));
	return Number.isFinite(v) ? v : undefined;
}

function toText(input: string | Uint8Array, maxLength: number): string {
	if (typeof input !== 'string' && !(input instanceof Uint8Array))
		throw new ScanTableError('input must be text or bytes');
	if (input.length > maxLength)
		throw new ScanTableError(`input is too large (${input.length} > ${maxLength} ${typeof input === 'string' ? 'characters' : 'bytes'})`);
	const text = typeof input === 'string' ? input : new TextDecoder('utf-8').decode(input);
	return text.replace(/^\uFEFF/, '');
}

/** Splits the text into header and rows. Throws ScanTableError when no header and data can be found. */
export function parseScanTable(input: string | Uint8Array, options: ParseScanTableOptions = {}): ScanTable {
	const text = toText(input, options.maxLength ?? SCAN_TABLE_DEFAULT_MAX_LENGTH);
	const lines = text.split(/\r\n|\r|\n/).map((t, i) => ({ line: i + 1, text: t }));
	const content = lines.filter((l) => l.text.trim() !== '');
	const firstData = content.findIndex((l) => !l.text.trim().startsWith('#'));
	if (firstData < 0) throw new ScanTableError('no table found (the text is empty or only comments)');

	// Header: the first non-comment line, unless it already holds numbers and a '#' line precedes it.
	let header = content[firstData];
	let headerText = header.text;
	let dataFrom = firstData + 1;
	const firstCell = header.text.trim().split(/[\s,;]+/)[0] ?? '';
	if (cellNumber(firstCell, true) !== undefined && cellNumber(firstCell, true) !== null) {
		const prev = content[firstData - 1];
		if (!prev) throw new ScanTableError('the first line holds numbers; a header row naming the columns is needed', header.line);
		header = prev;
		headerText = prev.text.trim().replace(/^#+/, '');
		dataFrom = firstData;
	}
	const data = content.slice(dataFrom).filter((l) => !l.text.trim().startsWith('#'));
	if (data.length === 0) throw new ScanTableError('the table has a header but no data rows', header.line);

	let delimiter = options.delimiter;
	if (delimiter === undefined) {
		const sample = data.slice(0, 5);
		const order: ScanDelimiter[] = ['tab', 'semicolon', 'comma', 'whitespace'];
		delimiter = order.find((d) => {
			const n = splitLine(headerText, d).length;
			return n >= 2 && sample.every((l) => splitLine(l.text, d).length === n);
		});
		// Fallback: the first delimiter that splits the header at all; rows are then checked one by one.
		delimiter ??= order.find((d) => splitLine(headerText, d).length >= 2);
		if (delimiter === undefined)
			throw new ScanTableError('cannot tell the columns apart: the header has a single column', header.line);
	}
	const headers = splitLine(headerText, delimiter).map((h) => h.trim());
	while (headers.length > 1 && headers[headers.length - 1] === '') headers.pop(); // trailing delimiters
	headers.forEach((h, i) => {
		if (h === '') throw new ScanTableError(`header cell ${i + 1} is empty`, header.line);
	});
	const rows: ScanTableRow[] = data.map((l) => {
		let cells = splitLine(l.text, delimiter);
		if (cells.length > headers.length && cells.slice(headers.length).every((c) => c === ''))
			cells = cells.slice(0, headers.length); // trailing delimiters
		if (cells.length < headers.length && delimiter !== 'whitespace')
			cells = [...cells, ...new Array<string>(headers.length - cells.length).fill('')]; // trailing empty cells
		if (cells.length !== headers.length)
			throw new ScanTableError(`expected ${headers.length} cells as in the header, found ${cells.length}`, l.line);
		return { line: l.line, cells };
	});
	return { delimiter, decimalComma: delimiter !== 'comma', headerLine: header.line, headers, rows };
}

// ---------------------------------------------------------------------------------------------------
// Header mapping

const UNIT_TOKEN =
	'(ev|mev|ha|hartree|hartrees|eh|e_h|au|a\\.u\\.|bohr\\^?-1|bohr\\^?\\{-1\\}|bohr⁻¹|1/bohr|a0\\^?-1|å\\^?-1|a\\^?-1|å⁻¹|1/å|1/a|ang\\^?-1|angstrom\\^?-1|1/angstrom)';
const BRACKET_UNIT_RE = new RegExp(`\\s*[([{]\\s*(?:in\\s+)?${UNIT_TOKEN}\\s*[)\\]}]\\s*$`, 'i');
const SUFFIX_UNIT_RE = new RegExp(`\\s*[/_ ]\\s*${UNIT_TOKEN}\\s*$`, 'i');

/** The unit written at the end of a header, if any (lower case), and the header without it. */
function splitUnit(header: string): { name: string; unit: string | null } {
	const h = header.trim().replace(/\u2212/g, '-');
	for (const re of [BRACKET_UNIT_RE, SUFFIX_UNIT_RE]) {
		const m = re.exec(h);
		if (m) return { name: h.slice(0, m.index), unit: m[1].toLowerCase() };
	}
	return { name: h, unit: null };
}

const normalise = (name: string): string => name.toLowerCase().replace(/[\s_.]/g, '');

const ALIASES: Record<ScanField, string[]> = {
	gammaBohrInv: ['gamma', 'omega', 'mu', 'w', 'γ', 'ω', 'μ', 'cam', 'rangeseparation', 'rangeseparationparameter', 'rsparameter', 'rsp', 'gammabohrinv', 'omegabohrinv'],
	eNeutralHartree: ['en', 'e(n)', 'e0', 'eneutral', 'neutral', 'neutralenergy', 'energyneutral', 'etotn', 'etot(n)', 'en0', 'e(0)', 'eneutralhartree'],
	eCationHartree: ['ecation', 'cation', 'e(n-1)', 'en-1', 'e+', 'e(+)', 'eplus', 'ecat', 'cationenergy', 'energycation', 'etot(n-1)', 'ecationhartree'],
	eAnionHartree: ['eanion', 'anion', 'e(n+1)', 'en+1', 'e-', 'e(-)', 'eminus', 'ean', 'anionenergy', 'energyanion', 'etot(n+1)', 'eanionhartree'],
	homoNeutralHartree: ['homo', 'homo(n)', 'homon', 'epshomo', 'epshomo(n)', 'ehomo', 'ehomo(n)', 'εhomo', 'homoneutral', 'neutralhomo', 'homoneutralhartree', 'epshomon', 'epshomoneutral'],
	lumoNeutralHartree: ['lumo', 'lumo(n)', 'lumon', 'epslumo', 'epslumo(n)', 'elumo', 'elumo(n)', 'εlumo', 'lumoneutral', 'neutrallumo', 'lumoneutralhartree', 'epslumon', 'epslumoneutral'],
	homoAnionHartree: ['homoanion', 'homo-anion', 'anionhomo', 'anion-homo', 'homo(n+1)', 'homon+1', 'epshomo(n+1)', 'ehomo(n+1)', 'εhomo(n+1)', 'homo(-)', 'homo-', 'homoa', 'homoanionhartree', 'epshomoanion', 'epshomo(anion)'],
	excluded: ['excluded', 'exclude', 'excl', 'skip', 'ignore', 'ignored']
};

const ALIAS_TO_FIELD = new Map<string, ScanField>();
for (const field of SCAN_FIELDS) for (const a of ALIASES[field]) ALIAS_TO_FIELD.set(normalise(a), field);

const ENERGY_UNIT: Record<string, ScanEnergyUnit> = { ev: 'eV', ha: 'hartree', hartree: 'hartree', hartrees: 'hartree', eh: 'hartree', e_h: 'hartree', au: 'hartree', 'a.u.': 'hartree' };
const isAngstromUnit = (u: string) => /^(å|a|ang|angstrom|1\/å|1\/a|1\/angstrom)/.test(u) && !/^(au|a\.u\.|a0)/.test(u);
const isBohrUnit = (u: string) => /^(bohr|1\/bohr|a0|au|a\.u\.)/.test(u);

/** Proposes a mapping from the table's headers to ScanPoint fields; every header maps to at most one field. */
export function proposeScanMapping(headers: readonly string[]): ScanMappingProposal {
	if (!Array.isArray(headers)) throw new ScanTableError('headers must be an array of strings');
	const mapping: ScanMapping = {};
	const unmatched: { column: number; header: string }[] = [];
	const energyUnits = new Set<ScanEnergyUnit>();
	let gammaUnitHint: ScanGammaUnit | null = null;
	headers.forEach((header, column) => {
		const { name, unit } = splitUnit(String(header));
		const field = ALIAS_TO_FIELD.get(normalise(name));
		if (field === undefined || mapping[field] !== undefined) {
			unmatched.push({ column, header });
			return;
		}
		mapping[field] = column;
		if (unit === null) return;
		if (field === 'gammaBohrInv') gammaUnitHint = isBohrUnit(unit) ? 'bohr^-1' : isAngstromUnit(unit) ? 'angstrom^-1' : null;
		else if (field !== 'excluded' && ENERGY_UNIT[unit]) energyUnits.add(ENERGY_UNIT[unit]);
	});
	return {
		mapping,
		unmatched,
		energyUnitHint: energyUnits.size === 1 ? [...energyUnits][0] : null,
		gammaUnitHint
	};
}

// ---------------------------------------------------------------------------------------------------
// Cells to points

const TRUE_WORDS = new Set(['true', 'yes', 'y', '1', 'x', 'excluded', 'exclude', 'skip']);
const FALSE_WORDS = new Set(['', 'false', 'no', 'n', '0', '-']);

/** Converts the rows to ScanPoint[] (energies in hartree, gamma in bohr^-1), in table order. */
export function applyMapping(table: ScanTable, mapping: ScanMapping, options: ApplyMappingOptions = {}): ScanPoint[] {
	const energyUnit = options.energyUnit ?? 'hartree';
	const gammaUnit = options.gammaUnit ?? 'bohr^-1';
	if (energyUnit !== 'hartree' && energyUnit !== 'eV')
		throw new ScanTableError(`energyUnit must be 'hartree' or 'eV', got ${String(energyUnit)}`);
	if (gammaUnit !== 'bohr^-1' && gammaUnit !== 'angstrom^-1')
		throw new ScanTableError(`gammaUnit must be 'bohr^-1' or 'angstrom^-1', got ${String(gammaUnit)}`);
	if (!table || !Array.isArray(table.headers) || !Array.isArray(table.rows))
		throw new ScanTableError('table must come from parseScanTable');
	const used = new Map<number, ScanField>();
	for (const [field, column] of Object.entries(mapping) as [ScanField, number | undefined][]) {
		if (column === undefined) continue;
		if (!(SCAN_FIELDS as readonly string[]).includes(field)) throw new ScanTableError(`unknown field ${field} in the mapping`);
		if (!Number.isInteger(column) || column < 0 || column >= table.headers.length)
			throw new ScanTableError(`field ${field} is mapped to column ${column}, but the table has columns 0..${table.headers.length - 1}`);
		const other = used.get(column);
		if (other !== undefined)
			throw new ScanTableError(`fields ${other} and ${field} are both mapped to the same column`, table.headerLine, table.headers[column]);
		used.set(column, field);
	}
	const gammaColumn = mapping.gammaBohrInv;
	if (gammaColumn === undefined)
		throw new ScanTableError(
			`no column is mapped to gamma (headers: ${table.headers.join(', ')}); name it gamma, omega or mu, or map it by hand`,
			table.headerLine
		);
	const toHartree = energyUnit === 'eV' ? evToHartree : (v: number) => v;
	const toBohrInv = gammaUnit === 'angstrom^-1' ? angInvToBohrInv : (v: number) => v;

	const checkMagnitudes = options.checkMagnitudes ?? true;
	const otherUnit = energyUnit === 'eV' ? 'hartree' : 'eV';
	const wrongUnit = (line: number, field: ScanField, what: string): never => {
		throw new ScanTableError(
			`${what}: the value is orders of magnitude off for energies in ${energyUnit}; were the energies in ${otherUnit}? Choose ${otherUnit} as the energy unit.`,
			line,
			table.headers[mapping[field] as number]
		);
	};
	return table.rows.map(({ line, cells }) => {
		const number = (column: number, what: string): number | null => {
			const v = cellNumber(cells[column] ?? '', table.decimalComma);
			if (v === undefined)
				throw new ScanTableError(`${what} "${cells[column]}" is not a number`, line, table.headers[column]);
			return v;
		};
		const g = number(gammaColumn, 'gamma');
		if (g === null) throw new ScanTableError('gamma is missing', line, table.headers[gammaColumn]);
		if (g < 0) throw new ScanTableError(`gamma must be >= 0, got ${g}`, line, table.headers[gammaColumn]);
		const point: ScanPoint = { gammaBohrInv: toBohrInv(g) };
		for (const field of SCAN_ENERGY_FIELDS as readonly ScanEnergyField[]) {
			const column = mapping[field];
			if (column === undefined) {
				point[field] = null;
				continue;
			}
			const v = number(column, 'energy');
			point[field] = v === null ? null : toHartree(v);
		}
		if (checkMagnitudes) {
			for (const field of ['homoNeutralHartree', 'lumoNeutralHartree', 'homoAnionHartree'] as const) {
				const v = point[field];
				if (typeof v === 'number' && Math.abs(v) > 2)
					wrongUnit(line, field, `orbital energy ${v.toPrecision(4)} hartree (${(v * HARTREE_EV).toPrecision(4)} eV) is beyond ±2 hartree`);
			}
			const homo = point.homoNeutralHartree;
			if (typeof homo === 'number' && homo > -1 / HARTREE_EV)
				wrongUnit(line, 'homoNeutralHartree', `neutral HOMO ${(homo * HARTREE_EV).toPrecision(3)} eV lies above -1 eV`);
			const eN = point.eNeutralHartree;
			const eC = point.eCationHartree;
			if (typeof eN === 'number' && typeof eC === 'number' && Math.abs(eC - eN) > 2)
				wrongUnit(line, 'eCationHartree', `E(N-1) - E(N) = ${(eC - eN).toPrecision(4)} hartree is beyond ±2 hartree`);
		}
		const exColumn = mapping.excluded;
		if (exColumn !== undefined) {
			const word = (cells[exColumn] ?? '').trim().toLowerCase();
			if (TRUE_WORDS.has(word)) point.excluded = true;
			else if (!FALSE_WORDS.has(word))
				throw new ScanTableError(`"${cells[exColumn]}" is not a yes/no value`, line, table.headers[exColumn]);
		}
		return point;
	});
}

export interface ParseScanPointsOptions extends ParseScanTableOptions, ApplyMappingOptions {}

/**
 * parseScanTable + proposeScanMapping + applyMapping. The units default to the hints in the headers,
 * then to hartree and bohr^-1. Throws ScanTableError when gamma has no recognisable column.
 */
export function parseScanPoints(input: string | Uint8Array, options: ParseScanPointsOptions = {}): ScanPoint[] {
	const table = parseScanTable(input, options);
	const proposal = proposeScanMapping(table.headers);
	return applyMapping(table, proposal.mapping, {
		energyUnit: options.energyUnit ?? proposal.energyUnitHint ?? 'hartree',
		gammaUnit: options.gammaUnit ?? proposal.gammaUnitHint ?? 'bohr^-1'
	});
}

// ---------------------------------------------------------------------------------------------------
// Writer

export interface WriteScanCsvOptions {
	/** Line ending (default '\n'). */
	newline?: '\n' | '\r\n';
	/**
	 * 'fields' (default): the ScanPoint field names; 'canonical': the documented header
	 * `gamma_bohr_inv,E_N_Ha,E_cation_Ha,E_anion_Ha,eps_homo_N_Ha,eps_lumo_N_Ha,eps_homo_anion_Ha,excluded`.
	 */
	header?: 'fields' | 'canonical';
}

/** The documented scan-table header (energies in hartree, gamma in bohr^-1), without the optional `excluded`. */
export const CANONICAL_SCAN_HEADERS = [
	'gamma_bohr_inv',
	'E_N_Ha',
	'E_cation_Ha',
	'E_anion_Ha',
	'eps_homo_N_Ha',
	'eps_lumo_N_Ha',
	'eps_homo_anion_Ha'
] as const;

/**
 * Writes points as CSV with a header of the field names (units in the names: hartree, bohr^-1):
 * gammaBohrInv, the six energies, excluded. Missing energies are empty cells; excluded is `true` or
 * empty. Numbers are written in JavaScript's shortest round-trip form, so parsing the text returns
 * the same numbers.
 */
export function writeScanCsv(points: readonly ScanPoint[], options: WriteScanCsvOptions = {}): string {
	const nl = options.newline ?? '\n';
	if (!Array.isArray(points)) throw new ScanTableError('points must be an array of scan points');
	const out = [options.header === 'canonical' ? [...CANONICAL_SCAN_HEADERS, 'excluded'].join(',') : SCAN_FIELDS.join(',')];
	points.forEach((p, i) => {
		const g = p?.gammaBohrInv;
		if (typeof g !== 'number' || !Number.isFinite(g) || g < 0)
			throw new ScanTableError(`points[${i}].gammaBohrInv must be a finite number >= 0, got ${String(g)}`);
		const cells = [String(g)];
		for (const field of SCAN_ENERGY_FIELDS) {
			const v = p[field];
			if (v === null || v === undefined) cells.push('');
			else if (typeof v === 'number' && Number.isFinite(v)) cells.push(String(v));
			else throw new ScanTableError(`points[${i}].${field} must be a finite number or null, got ${String(v)}`);
		}
		cells.push(p.excluded === true ? 'true' : '');
		out.push(cells.join(','));
	});
	return out.join(nl) + nl;
}
