/**
 * Chemical elements H (Z = 1) through Rn (Z = 86): symbol, name, atomic number, standard atomic weight
 * and single-bond covalent radius, plus formula parsing and molar masses.
 *
 * Atomic weights: IUPAC standard atomic weights 2013 (J. Meija et al., "Atomic weights of the elements
 * 2013 (IUPAC Technical Report)", Pure Appl. Chem. 88 (2016) 265-291, Table 1), uncertainties dropped;
 * for elements whose standard weight is an interval (H, Li, B, C, N, O, Mg, Si, S, Cl, Br, Tl) the
 * conventional value of that report's Table 3 is used. Values transcribed from the tabulation in the
 * ASE project's data module (ase/data/__init__.py, `atomic_masses_iupac2016`, repository
 * YutackPark/ase at commit 13df5f3), which cites the same report.
 * Tc, Pm, Po, At and Rn have no standard atomic weight; the relative atomic mass of their longest-lived
 * isotope (same tabulation, from the report's Table 4) is used and `hasStandardWeight` is false.
 *
 * Covalent radii (Å): B. Cordero et al., "Covalent radii revisited", Dalton Trans. (2008) 2832-2838,
 * as tabulated in the same ASE data module (`covalent_radii`). For C the sp3 value (0.76 Å) is used;
 * for Mn, Fe and Co the low-spin values. They serve only for bond perception (sum of radii + tolerance).
 */

export interface Element {
	/** Conventional symbol, first letter upper case ('C', 'Cl'). */
	readonly symbol: string;
	readonly name: string;
	readonly atomicNumber: number;
	/** Standard atomic weight (conventional value), g/mol; see `hasStandardWeight`. */
	readonly atomicWeight: number;
	/** False for elements without stable isotopes (Tc, Pm, Po, At, Rn): mass of the longest-lived isotope. */
	readonly hasStandardWeight: boolean;
	/** Single-bond covalent radius in Å (Cordero et al. 2008). */
	readonly covalentRadiusA: number;
}

// [symbol, name, atomic weight, covalent radius Å]; index + 1 = atomic number.
const TABLE: ReadonlyArray<readonly [string, string, number, number]> = [
	['H', 'Hydrogen', 1.008, 0.31],
	['He', 'Helium', 4.002602, 0.28],
	['Li', 'Lithium', 6.94, 1.28],
	['Be', 'Beryllium', 9.0121831, 0.96],
	['B', 'Boron', 10.81, 0.84],
	['C', 'Carbon', 12.011, 0.76],
	['N', 'Nitrogen', 14.007, 0.71],
	['O', 'Oxygen', 15.999, 0.66],
	['F', 'Fluorine', 18.998403163, 0.57],
	['Ne', 'Neon', 20.1797, 0.58],
	['Na', 'Sodium', 22.98976928, 1.66],
	['Mg', 'Magnesium', 24.305, 1.41],
	['Al', 'Aluminium', 26.9815385, 1.21],
	['Si', 'Silicon', 28.085, 1.11],
	['P', 'Phosphorus', 30.973761998, 1.07],
	['S', 'Sulfur', 32.06, 1.05],
	['Cl', 'Chlorine', 35.45, 1.02],
	['Ar', 'Argon', 39.948, 1.06],
	['K', 'Potassium', 39.0983, 2.03],
	['Ca', 'Calcium', 40.078, 1.76],
	['Sc', 'Scandium', 44.955908, 1.7],
	['Ti', 'Titanium', 47.867, 1.6],
	['V', 'Vanadium', 50.9415, 1.53],
	['Cr', 'Chromium', 51.9961, 1.39],
	['Mn', 'Manganese', 54.938044, 1.39],
	['Fe', 'Iron', 55.845, 1.32],
	['Co', 'Cobalt', 58.933194, 1.26],
	['Ni', 'Nickel', 58.6934, 1.24],
	['Cu', 'Copper', 63.546, 1.32],
	['Zn', 'Zinc', 65.38, 1.22],
	['Ga', 'Gallium', 69.723, 1.22],
	['Ge', 'Germanium', 72.63, 1.2],
	['As', 'Arsenic', 74.921595, 1.19],
	['Se', 'Selenium', 78.971, 1.2],
	['Br', 'Bromine', 79.904, 1.2],
	['Kr', 'Krypton', 83.798, 1.16],
	['Rb', 'Rubidium', 85.4678, 2.2],
	['Sr', 'Strontium', 87.62, 1.95],
	['Y', 'Yttrium', 88.90584, 1.9],
	['Zr', 'Zirconium', 91.224, 1.75],
	['Nb', 'Niobium', 92.90637, 1.64],
	['Mo', 'Molybdenum', 95.95, 1.54],
	['Tc', 'Technetium', 97.90721, 1.47],
	['Ru', 'Ruthenium', 101.07, 1.46],
	['Rh', 'Rhodium', 102.9055, 1.42],
	['Pd', 'Palladium', 106.42, 1.39],
	['Ag', 'Silver', 107.8682, 1.45],
	['Cd', 'Cadmium', 112.414, 1.44],
	['In', 'Indium', 114.818, 1.42],
	['Sn', 'Tin', 118.71, 1.39],
	['Sb', 'Antimony', 121.76, 1.39],
	['Te', 'Tellurium', 127.6, 1.38],
	['I', 'Iodine', 126.90447, 1.39],
	['Xe', 'Xenon', 131.293, 1.4],
	['Cs', 'Caesium', 132.90545196, 2.44],
	['Ba', 'Barium', 137.327, 2.15],
	['La', 'Lanthanum', 138.90547, 2.07],
	['Ce', 'Cerium', 140.116, 2.04],
	['Pr', 'Praseodymium', 140.90766, 2.03],
	['Nd', 'Neodymium', 144.242, 2.01],
	['Pm', 'Promethium', 144.91276, 1.99],
	['Sm', 'Samarium', 150.36, 1.98],
	['Eu', 'Europium', 151.964, 1.98],
	['Gd', 'Gadolinium', 157.25, 1.96],
	['Tb', 'Terbium', 158.92535, 1.94],
	['Dy', 'Dysprosium', 162.5, 1.92],
	['Ho', 'Holmium', 164.93033, 1.92],
	['Er', 'Erbium', 167.259, 1.89],
	['Tm', 'Thulium', 168.93422, 1.9],
	['Yb', 'Ytterbium', 173.054, 1.87],
	['Lu', 'Lutetium', 174.9668, 1.87],
	['Hf', 'Hafnium', 178.49, 1.75],
	['Ta', 'Tantalum', 180.94788, 1.7],
	['W', 'Tungsten', 183.84, 1.62],
	['Re', 'Rhenium', 186.207, 1.51],
	['Os', 'Osmium', 190.23, 1.44],
	['Ir', 'Iridium', 192.217, 1.41],
	['Pt', 'Platinum', 195.084, 1.36],
	['Au', 'Gold', 196.966569, 1.36],
	['Hg', 'Mercury', 200.592, 1.32],
	['Tl', 'Thallium', 204.38, 1.45],
	['Pb', 'Lead', 207.2, 1.46],
	['Bi', 'Bismuth', 208.9804, 1.48],
	['Po', 'Polonium', 208.98243, 1.4],
	['At', 'Astatine', 209.98715, 1.5],
	['Rn', 'Radon', 222.01758, 1.5]
];

const NO_STANDARD_WEIGHT = new Set(['Tc', 'Pm', 'Po', 'At', 'Rn']);

/** All supported elements, ordered by atomic number (ELEMENTS[Z - 1]). */
export const ELEMENTS: readonly Element[] = Object.freeze(
	TABLE.map(([symbol, name, atomicWeight, covalentRadiusA], i) =>
		Object.freeze({
			symbol,
			name,
			atomicNumber: i + 1,
			atomicWeight,
			hasStandardWeight: !NO_STANDARD_WEIGHT.has(symbol),
			covalentRadiusA
		})
	)
);

/** Highest atomic number supported. */
export const MAX_ATOMIC_NUMBER = ELEMENTS.length;

const BY_SYMBOL: ReadonlyMap<string, Element> = new Map(ELEMENTS.map((e) => [e.symbol, e]));

/** Normalises the case of a symbol: 'c' -> 'C', 'CL' -> 'Cl', ' fe ' -> 'Fe'. */
function normaliseSymbol(sym: string): string {
	const s = sym.trim();
	return s.charAt(0).toUpperCase() + s.slice(1).toLowerCase();
}

/** The element with this symbol, case-insensitively ('c', 'CL'); undefined when unknown. */
export function elementBySymbol(sym: string): Element | undefined {
	if (typeof sym !== 'string') return undefined;
	return BY_SYMBOL.get(normaliseSymbol(sym));
}

/** The element with this atomic number (1..86); undefined otherwise. */
export function elementByNumber(atomicNumber: number): Element | undefined {
	if (!Number.isInteger(atomicNumber) || atomicNumber < 1) return undefined;
	return ELEMENTS[atomicNumber - 1];
}

/** Element counts by symbol, e.g. { C: 14, H: 10 }. Counts may be fractional (CIF solvates). */
export type ElementCounts = Record<string, number>;

/** Thrown by `parseFormula` and `molarMassGPerMol`; `position` is the 0-based character offset (or -1). */
export class FormulaError extends Error {
	readonly position: number;
	constructor(message: string, position = -1) {
		super(message);
		this.name = 'FormulaError';
		this.position = position;
	}
}

export interface ParseFormulaOptions {
	/** Accept symbols in any case when whitespace separates the tokens ('c22 h14'). Default false. */
	caseInsensitive?: boolean;
}

/**
 * Parses a sum formula into element counts: 'C22H14', 'C22 H14', CIF style 'C22 H14 N2 O',
 * fractional counts ('C10 H8 O0.5') and parenthesised groups ('Ca(OH)2'). Symbols are case-sensitive
 * by default (so 'CO' is carbon + oxygen, 'Co' is cobalt). Repeated symbols add up.
 * Throws FormulaError for an empty formula, an unknown element, a bad count or unbalanced parentheses.
 */
export function parseFormula(formula: string, options: ParseFormulaOptions = {}): ElementCounts {
	if (typeof formula !== 'string') throw new FormulaError('formula must be a string');
	const text = formula.trim();
	if (text === '') throw new FormulaError('formula is empty');
	const caseInsensitive = options.caseInsensitive ?? false;

	const stack: ElementCounts[] = [{}];
	const openedAt: number[] = [];
	let i = 0;

	const readCount = (): number | undefined => {
		const m = /^\d+(?:\.\d+)?|^\.\d+/.exec(text.slice(i));
		if (!m) return undefined;
		const value = Number(m[0]);
		if (!Number.isFinite(value) || value <= 0) {
			throw new FormulaError(`count '${m[0]}' at position ${i + 1} of '${text}' must be a positive number`, i);
		}
		i += m[0].length;
		return value;
	};
	const add = (into: ElementCounts, sym: string, n: number) => {
		into[sym] = (into[sym] ?? 0) + n;
	};

	while (i < text.length) {
		const ch = text[i];
		if (/\s/.test(ch)) {
			i++;
		} else if (ch === '(' || ch === '[') {
			openedAt.push(i);
			stack.push({});
			i++;
		} else if (ch === ')' || ch === ']') {
			if (stack.length === 1) {
				throw new FormulaError(`unmatched '${ch}' at position ${i + 1} of '${text}'`, i);
			}
			openedAt.pop();
			i++;
			const group = stack.pop() as ElementCounts;
			const mult = readCount() ?? 1;
			const top = stack[stack.length - 1];
			for (const [sym, n] of Object.entries(group)) add(top, sym, n * mult);
		} else if (/[A-Za-z]/.test(ch)) {
			const start = i;
			let sym: string;
			if (caseInsensitive) {
				const m = /^[A-Za-z]+/.exec(text.slice(i)) as RegExpExecArray;
				sym = m[0];
			} else {
				const m = /^[A-Z][a-z]?/.exec(text.slice(i));
				if (!m) {
					throw new FormulaError(
						`unexpected '${ch}' at position ${i + 1} of '${text}': element symbols start with an upper-case letter`,
						i
					);
				}
				sym = m[0];
			}
			i += sym.length;
			const el = caseInsensitive ? elementBySymbol(sym) : BY_SYMBOL.get(sym);
			if (!el) throw new FormulaError(`unknown element '${sym}' at position ${start + 1} of '${text}'`, start);
			add(stack[stack.length - 1], el.symbol, readCount() ?? 1);
		} else {
			throw new FormulaError(`unexpected '${ch}' at position ${i + 1} of '${text}'`, i);
		}
	}
	if (stack.length > 1) {
		const at = openedAt[openedAt.length - 1];
		throw new FormulaError(`unclosed '${text[at]}' at position ${at + 1} of '${text}'`, at);
	}
	const counts = stack[0];
	if (Object.keys(counts).length === 0) throw new FormulaError(`formula '${text}' names no element`);
	return counts;
}

/**
 * Molar mass (g/mol) from element counts, using the standard atomic weights above.
 * Throws FormulaError for an unknown symbol and RangeError for a negative or non-finite count.
 */
export function molarMassGPerMol(counts: ElementCounts): number {
	let total = 0;
	for (const [sym, n] of Object.entries(counts)) {
		const el = BY_SYMBOL.get(sym) ?? elementBySymbol(sym);
		if (!el) throw new FormulaError(`unknown element '${sym}'`);
		if (!Number.isFinite(n) || n < 0) throw new RangeError(`count of ${sym} must be a finite number >= 0, got ${n}`);
		total += n * el.atomicWeight;
	}
	return total;
}

/**
 * Hill-order formula string from element counts: C first, then H, then the rest alphabetically;
 * without carbon every element (H included) is alphabetical. Counts of 1 are omitted, zero counts
 * skipped, fractional counts kept ('C10H8O0.5'). Example: { H: 10, C: 14 } -> 'C14H10'.
 * Throws FormulaError for unknown symbols and RangeError for negative or non-finite counts.
 */
export function formulaHill(counts: ElementCounts): string {
	const entries: Array<[string, number]> = [];
	for (const [sym, n] of Object.entries(counts)) {
		const el = BY_SYMBOL.get(sym) ?? elementBySymbol(sym);
		if (!el) throw new FormulaError(`unknown element '${sym}'`);
		if (!Number.isFinite(n) || n < 0) throw new RangeError(`count of ${sym} must be a finite number >= 0, got ${n}`);
		if (n > 0) entries.push([el.symbol, n]);
	}
	const hasCarbon = entries.some(([s]) => s === 'C');
	const rank = (s: string) => (hasCarbon ? (s === 'C' ? 0 : s === 'H' ? 1 : 2) : 2);
	entries.sort(([s1], [s2]) => rank(s1) - rank(s2) || (s1 < s2 ? -1 : s1 > s2 ? 1 : 0));
	return entries.map(([s, n]) => (n === 1 ? s : `${s}${n}`)).join('');
}
