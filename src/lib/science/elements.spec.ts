import { describe, expect, it } from 'vitest';
import {
	ELEMENTS,
	FormulaError,
	MAX_ATOMIC_NUMBER,
	elementByNumber,
	elementBySymbol,
	formulaHill,
	molarMassGPerMol,
	parseFormula
} from './elements';

// Reference for weights: IUPAC standard atomic weights 2013 (Meija et al., Pure Appl. Chem. 88 (2016) 265),
// conventional values; radii: Cordero et al., Dalton Trans. (2008) 2832.
describe('element table', () => {
	it('covers H (1) through Rn (86) in order of atomic number', () => {
		expect(MAX_ATOMIC_NUMBER).toBe(86);
		expect(ELEMENTS[0].symbol).toBe('H');
		expect(ELEMENTS[85].symbol).toBe('Rn');
		ELEMENTS.forEach((e, i) => expect(e.atomicNumber).toBe(i + 1));
		expect(new Set(ELEMENTS.map((e) => e.symbol)).size).toBe(86);
	});

	it('has finite positive weights and radii, weights increasing except the known inversions', () => {
		for (const e of ELEMENTS) {
			expect(Number.isFinite(e.atomicWeight) && e.atomicWeight > 0).toBe(true);
			expect(Number.isFinite(e.covalentRadiusA) && e.covalentRadiusA > 0).toBe(true);
		}
		// Ar/K, Co/Ni, Te/I are the only mass inversions up to Rn (textbook periodic table).
		const inversions = ELEMENTS.slice(1)
			.filter((e, i) => e.atomicWeight < ELEMENTS[i].atomicWeight)
			.map((e) => e.symbol);
		expect(inversions).toEqual(['K', 'Ni', 'I']);
	});

	it('conventional weights of the organic elements match IUPAC 2013 (Table 3 conventional values)', () => {
		expect(elementBySymbol('H')?.atomicWeight).toBe(1.008);
		expect(elementBySymbol('C')?.atomicWeight).toBe(12.011);
		expect(elementBySymbol('N')?.atomicWeight).toBe(14.007);
		expect(elementBySymbol('O')?.atomicWeight).toBe(15.999);
		expect(elementBySymbol('S')?.atomicWeight).toBe(32.06);
		expect(elementBySymbol('Cl')?.atomicWeight).toBe(35.45);
		expect(elementBySymbol('Br')?.atomicWeight).toBe(79.904);
		expect(elementBySymbol('F')?.atomicWeight).toBe(18.998403163);
		expect(elementBySymbol('I')?.atomicWeight).toBe(126.90447);
	});

	it('covalent radii of C, H, N, O, S match Cordero et al. 2008 (C sp3)', () => {
		expect(elementBySymbol('C')?.covalentRadiusA).toBe(0.76);
		expect(elementBySymbol('H')?.covalentRadiusA).toBe(0.31);
		expect(elementBySymbol('N')?.covalentRadiusA).toBe(0.71);
		expect(elementBySymbol('O')?.covalentRadiusA).toBe(0.66);
		expect(elementBySymbol('S')?.covalentRadiusA).toBe(1.05);
	});

	it('flags elements without a standard atomic weight', () => {
		expect(ELEMENTS.filter((e) => !e.hasStandardWeight).map((e) => e.symbol)).toEqual(['Tc', 'Pm', 'Po', 'At', 'Rn']);
	});
});

describe('elementBySymbol / elementByNumber', () => {
	it('normalises case', () => {
		expect(elementBySymbol('c')?.symbol).toBe('C');
		expect(elementBySymbol('CL')?.symbol).toBe('Cl');
		expect(elementBySymbol('cl')?.atomicNumber).toBe(17);
		expect(elementBySymbol(' Se ')?.atomicNumber).toBe(34);
	});
	it('returns undefined for unknown symbols', () => {
		expect(elementBySymbol('Xx')).toBeUndefined();
		expect(elementBySymbol('')).toBeUndefined();
		expect(elementBySymbol('Fr')).toBeUndefined(); // beyond Rn
	});
	it('looks up by atomic number', () => {
		expect(elementByNumber(6)?.symbol).toBe('C');
		expect(elementByNumber(86)?.symbol).toBe('Rn');
		expect(elementByNumber(0)).toBeUndefined();
		expect(elementByNumber(87)).toBeUndefined();
		expect(elementByNumber(6.5)).toBeUndefined();
	});
});

describe('parseFormula', () => {
	it('parses compact, spaced and CIF-style formulas', () => {
		expect(parseFormula('C22H14')).toEqual({ C: 22, H: 14 });
		expect(parseFormula('C22 H14')).toEqual({ C: 22, H: 14 });
		expect(parseFormula('C22 H14 N2 O')).toEqual({ C: 22, H: 14, N: 2, O: 1 });
		expect(parseFormula('  C9 H6 F4 N2 ')).toEqual({ C: 9, H: 6, F: 4, N: 2 });
	});
	it('is case-sensitive by default: CO is carbon monoxide, Co is cobalt', () => {
		expect(parseFormula('CO')).toEqual({ C: 1, O: 1 });
		expect(parseFormula('Co')).toEqual({ Co: 1 });
	});
	it('accepts lower/upper case symbols when asked and tokens are spaced', () => {
		expect(parseFormula('c22 h14 CL2', { caseInsensitive: true })).toEqual({ C: 22, H: 14, Cl: 2 });
	});
	it('adds repeated symbols, fractional counts and parenthesised groups', () => {
		expect(parseFormula('CH3CH2OH')).toEqual({ C: 2, H: 6, O: 1 });
		expect(parseFormula('C10 H8 O0.5')).toEqual({ C: 10, H: 8, O: 0.5 });
		expect(parseFormula('Ca(OH)2')).toEqual({ Ca: 1, O: 2, H: 2 });
		expect(parseFormula('[Fe(CN)6]2')).toEqual({ Fe: 2, C: 12, N: 12 });
	});
	it('throws FormulaError with the position for unknown elements and bad syntax', () => {
		expect(() => parseFormula('C22 Xx14')).toThrow(new FormulaError("unknown element 'Xx' at position 5 of 'C22 Xx14'", 4));
		expect(() => parseFormula('')).toThrow('formula is empty');
		expect(() => parseFormula('c22h14')).toThrow(/unexpected 'c' at position 1/);
		expect(() => parseFormula('C2-H4')).toThrow(/unexpected '-' at position 3/);
		expect(() => parseFormula('Ca(OH2')).toThrow(/unclosed '\(' at position 3/);
		expect(() => parseFormula('CaOH)2')).toThrow(/unmatched '\)' at position 5/);
		expect(() => parseFormula('C0 H4')).toThrow(/count '0' at position 2/);
		expect(() => parseFormula('C6 Q2')).toThrow(expect.objectContaining({ name: 'FormulaError', position: 3 }));
	});
});

describe('molarMassGPerMol', () => {
	it('anthracene C14H10 = 178.234 g/mol (sum of IUPAC 2013 conventional weights)', () =>
		expect(molarMassGPerMol(parseFormula('C14H10'))).toBeCloseTo(178.234, 3));
	it('matches the formula weight 829.63 printed in COD entry 1100772 (C18 H33 Gd N3 O18 P3)', () =>
		// cod-developers/cod-tools tests/inputs/1100772.cif, _chemical_formula_weight 829.63
		expect(Math.abs(molarMassGPerMol(parseFormula('C18 H33 Gd N3 O18 P3')) - 829.63)).toBeLessThan(0.02));
	it('throws for unknown elements and bad counts', () => {
		expect(() => molarMassGPerMol({ Qq: 1 })).toThrow(FormulaError);
		expect(() => molarMassGPerMol({ C: -1 })).toThrow(RangeError);
		expect(() => molarMassGPerMol({ C: Number.NaN })).toThrow(RangeError);
	});
	it('is 0 for no atoms', () => expect(molarMassGPerMol({})).toBe(0));
});

describe('formulaHill', () => {
	// Hill system (E. A. Hill, J. Am. Chem. Soc. 22 (1900) 478), as used by CAS and CIF _chemical_formula_sum.
	it('puts C then H first, the rest alphabetically', () => {
		expect(formulaHill({ H: 10, C: 14 })).toBe('C14H10');
		expect(formulaHill({ O: 1, N: 2, H: 14, C: 22 })).toBe('C22H14N2O');
		expect(formulaHill({ S: 1, Cl: 2, C: 6, H: 3, Br: 1 })).toBe('C6H3BrCl2S');
	});
	it('sorts all elements alphabetically when there is no carbon', () => {
		expect(formulaHill({ O: 1, H: 2 })).toBe('H2O');
		expect(formulaHill({ Na: 1, Cl: 1 })).toBe('ClNa');
		expect(formulaHill({ S: 1, O: 4, H: 2 })).toBe('H2O4S');
	});
	it('skips zero counts, keeps fractions and normalises symbol case', () => {
		expect(formulaHill({ c: 10, h: 8, O: 0.5, N: 0 })).toBe('C10H8O0.5');
	});
	it('throws for unknown elements or bad counts', () => {
		expect(() => formulaHill({ Qq: 1 })).toThrow(FormulaError);
		expect(() => formulaHill({ C: -2 })).toThrow(RangeError);
	});
});
