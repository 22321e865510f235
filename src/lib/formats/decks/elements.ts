/**
 * Element symbols in order of atomic number (IUPAC names as of 2016), used to count electrons.
 * Index + 1 is the atomic number.
 */
export const ELEMENT_SYMBOLS: readonly string[] = [
	'H', 'He',
	'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne',
	'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar',
	'K', 'Ca', 'Sc', 'Ti', 'V', 'Cr', 'Mn', 'Fe', 'Co', 'Ni', 'Cu', 'Zn', 'Ga', 'Ge', 'As', 'Se', 'Br', 'Kr',
	'Rb', 'Sr', 'Y', 'Zr', 'Nb', 'Mo', 'Tc', 'Ru', 'Rh', 'Pd', 'Ag', 'Cd', 'In', 'Sn', 'Sb', 'Te', 'I', 'Xe',
	'Cs', 'Ba',
	'La', 'Ce', 'Pr', 'Nd', 'Pm', 'Sm', 'Eu', 'Gd', 'Tb', 'Dy', 'Ho', 'Er', 'Tm', 'Yb', 'Lu',
	'Hf', 'Ta', 'W', 'Re', 'Os', 'Ir', 'Pt', 'Au', 'Hg', 'Tl', 'Pb', 'Bi', 'Po', 'At', 'Rn',
	'Fr', 'Ra',
	'Ac', 'Th', 'Pa', 'U', 'Np', 'Pu', 'Am', 'Cm', 'Bk', 'Cf', 'Es', 'Fm', 'Md', 'No', 'Lr',
	'Rf', 'Db', 'Sg', 'Bh', 'Hs', 'Mt', 'Ds', 'Rg', 'Cn', 'Nh', 'Fl', 'Mc', 'Lv', 'Ts', 'Og'
];

const BY_SYMBOL = new Map(ELEMENT_SYMBOLS.map((s, i) => [s.toLowerCase(), i + 1]));

/** Canonical symbol ('c' -> 'C', 'CL' -> 'Cl') or null when the text is not an element symbol. */
export function canonicalElement(symbol: string): string | null {
	const z = BY_SYMBOL.get(symbol.trim().toLowerCase());
	return z === undefined ? null : ELEMENT_SYMBOLS[z - 1];
}

/** Atomic number of an element symbol (case-insensitive) or null when unknown. */
export function atomicNumber(symbol: string): number | null {
	return BY_SYMBOL.get(symbol.trim().toLowerCase()) ?? null;
}
