import { describe, expect, it } from 'vitest';
import nitrothiopheneCif from './fixtures/cod-2205750.cif?raw';
import hybridCif from './fixtures/cod-1100117.cif?raw';
import dithioneCif from './fixtures/cod-2000724.cif?raw';
import { CifParseError, isCifUnknown, parseCif, parseCifNumber, polymorphFromCif } from './cif';

// Fixtures (see fixtures/README.md):
// - cod-2205750.cif: 5-nitrothiophene-2-carbaldehyde, McBurney, Crundwell, Updegraff, Zeller & Hunter,
//   Acta Cryst. E61 (2005) o1221-o1222; COD entry 2205750, file tests/inputs/2205750.cif of
//   cod-developers/cod-tools, unchanged.
// - cod-1100117.cif: (C12H30N2)AlF5 hybrid, Goreshnik et al., Solid State Sciences 4 (2002) 1213;
//   COD entry 1100117 (public domain), file tests/inputs/1100117.cif of cod-developers/cod-tools, unchanged.
// - cod-2000724.cif: 5,7,12,14-tetrahydroquinolino[2,3-b]acridine-7,14-dithione, Mizuguchi & Rihs,
//   Acta Cryst. C48 (1992) 1553-1555; COD entry 2000724, file tests/inputs/2000724.cif of
//   cod-developers/cod-tools, unchanged.
const err = (line: number, message: string) => new CifParseError(line, message);

describe('parseCifNumber', () => {
	// CIF 1.1 numeric values: the su in parentheses applies to the last digits of the mantissa.
	it('reads values and standard uncertainties', () => {
		expect(parseCifNumber('8.562(2)')).toEqual({ value: 8.562, su: 0.002 });
		expect(parseCifNumber('0.46363(17)')).toEqual({ value: 0.46363, su: 0.00017 });
		expect(parseCifNumber('152(2)')).toEqual({ value: 152, su: 2 });
		expect(parseCifNumber('-0.0176(6)')).toEqual({ value: -0.0176, su: 0.0006 });
		expect(parseCifNumber('1.5e-3(2)')).toEqual({ value: 0.0015, su: 0.0002 });
		expect(parseCifNumber('90')).toEqual({ value: 90 });
		expect(parseCifNumber('.5')).toEqual({ value: 0.5 });
		expect(parseCifNumber('.28820(10)')).toEqual({ value: 0.2882, su: 0.0001 }); // as written in COD 2000724
		expect(parseCifNumber('119.(2)')).toEqual({ value: 119, su: 2 }); // as written in COD 2000724
	});
	it('returns undefined for non-numbers', () => {
		expect(parseCifNumber('?')).toBeUndefined();
		expect(parseCifNumber('.')).toBeUndefined();
		expect(parseCifNumber('abc')).toBeUndefined();
		expect(parseCifNumber('1.2(3')).toBeUndefined();
		expect(parseCifNumber('NaN')).toBeUndefined();
		expect(parseCifNumber('1e999')).toBeUndefined();
	});
});

describe('parseCif grammar', () => {
	it('reads blocks, items, loops, quotes, text fields and comments', () => {
		const text = [
			'# leading comment',
			'data_first',
			"_title 'a dog's life'   # comment after a value",
			'_quoted "say \'hi\'"',
			'_unknown ?',
			'_inapplicable .',
			"_literal '?'",
			'_text',
			';',
			'line one',
			'  line two',
			';',
			'loop_',
			'_x_label _x_value',
			'A 1.5(2) B 2',
			'C #not-a-comment-start',
			'3',
			'data_second',
			'_Mixed_Case value'
		].join('\n');
		const doc = parseCif(text);
		expect(doc.blocks.map((b) => b.name)).toEqual(['first', 'second']);
		const [b1, b2] = doc.blocks;
		expect(b1.items.get('_title')?.[0]).toEqual({ text: "a dog's life", quoted: true, line: 3 });
		expect(b1.items.get('_quoted')?.[0].text).toBe("say 'hi'");
		expect(isCifUnknown(b1.items.get('_unknown')?.[0])).toBe(true);
		expect(isCifUnknown(b1.items.get('_inapplicable')?.[0])).toBe(true);
		expect(isCifUnknown(b1.items.get('_literal')?.[0])).toBe(false);
		expect(b1.items.get('_text')?.[0]).toEqual({ text: 'line one\n  line two', quoted: true, line: 9 });
		expect(b1.items.get('_x_label')?.map((v) => v.text)).toEqual(['A', 'B', 'C']);
		expect(b1.items.get('_x_value')?.map((v) => v.text)).toEqual(['1.5(2)', '2', '3']);
		expect(b1.loops).toEqual([{ tags: ['_x_label', '_x_value'], line: 13, rowCount: 3 }]);
		expect(b1.tagLines.get('_x_value')).toBe(14);
		expect(b2.items.get('_mixed_case')?.[0].text).toBe('value');
	});
	it('accepts CRLF newlines, tabs and a BOM', () => {
		const doc = parseCif('\uFEFFdata_x\r\n_a\t1\r\n_b\r\n;\r\ntext\r\n;\r\n');
		expect(doc.blocks[0].items.get('_a')?.[0].text).toBe('1');
		expect(doc.blocks[0].items.get('_b')?.[0].text).toBe('text');
	});
	it('skips save frames', () => {
		const doc = parseCif('data_d\nsave_frame\n_inner 1\nsave_\n_outer 2\n');
		expect([...doc.blocks[0].items.keys()]).toEqual(['_outer']);
	});
	it('reads the whole COD 2205750 fixture', () => {
		const doc = parseCif(nitrothiopheneCif);
		expect(doc.blocks).toHaveLength(1);
		const b = doc.blocks[0];
		expect(b.name).toBe('2205750');
		expect(b.items.get('_publ_author_name')?.map((v) => v.text)).toEqual([
			'McBurney, Brian',
			'Crundwell, Guy',
			'Updegraff III, James B.',
			'Zeller, Matthias',
			'Hunter, Allen D.'
		]);
		expect(b.items.get('_publ_section_title')?.[0].text).toBe('5-Nitrothiophene-2-carbaldehyde');
		expect(b.items.get('_refine_ls_weighting_details')?.[0].text).toBe(
			'calc w = 1/[\\s^2^(Fo^2^)+(0.0443P)^2^+0.2249P] where P = (Fo^2^+2Fc^2^)/3'
		);
		expect(b.loops.map((l) => l.rowCount)).toEqual([5, 4, 5, 13, 10, 13, 19, 15, 2]);
	});
});

describe('parseCif errors name the line', () => {
	it('no data block', () => {
		expect(() => parseCif('# only a comment\n\n')).toThrow(err(1, 'no data block found (a CIF starts its content with data_<name>)'));
		expect(() => parseCif('_cell_length_a 5\ndata_x\n')).toThrow(
			err(1, 'tag _cell_length_a appears before the first data block header (data_...)')
		);
	});
	it('unterminated quotes', () => {
		expect(() => parseCif("data_x\n_a 'open\n")).toThrow(
			err(2, 'unterminated single-quoted value starting "\'open" (no closing \' followed by a space or the end of the line)')
		);
		expect(() => parseCif('data_x\n_a "open"x\n')).toThrow(expect.objectContaining({ name: 'CifParseError', line: 2 }));
	});
	it('unterminated text field names the opening line', () => {
		expect(() => parseCif('data_x\n_a 1\n_b\n;\nnever closed\n')).toThrow(
			err(4, 'text field opened with ";" is not closed (no later line starts with ";")')
		);
	});
	it('loop value count not a multiple of the tag count', () => {
		expect(() => parseCif('data_x\nloop_\n_p\n_q\n_r\n1 2 3\n4 5\n_next 1\n')).toThrow(
			err(2, 'loop_ has 3 tags but 5 values (lines 6-7), not a multiple of 3')
		);
	});
	it('loops without tags or values', () => {
		expect(() => parseCif('data_x\nloop_\n1 2\n')).toThrow(err(2, 'loop_ has no tags'));
		expect(() => parseCif('data_x\nloop_\n_p\n_q\ndata_y\n')).toThrow(err(2, 'loop_ with 2 tags (_p, ...) has no values'));
		expect(() => parseCif('data_x\nloop_\n_p\n_q\n_r 1\n')).toThrow(err(2, 'loop_ has 3 tags but 1 values (line 5), not a multiple of 3'));
	});
	it('tag without value, value without tag, repeated tag or block', () => {
		expect(() => parseCif('data_x\n_a\n_b 2\n')).toThrow(err(2, 'tag _a has no value'));
		expect(() => parseCif('data_x\n_a 1 2\n')).toThrow(err(2, 'value "2" has no tag (values follow a tag or belong to a loop_)'));
		expect(() => parseCif('data_x\n_a 1\n_A 2\n')).toThrow(err(3, "tag _a is repeated in data block 'x' (first at line 2)"));
		expect(() => parseCif('data_x\ndata_X\n')).toThrow(err(2, "data block name 'X' is repeated (first at line 1)"));
		expect(() => parseCif('data_\n')).toThrow(err(1, "data block header 'data_' has no name"));
	});
	it('reserved words and unclosed save frames', () => {
		expect(() => parseCif('data_x\nglobal_\n')).toThrow(err(2, "'global_' is a reserved STAR word not allowed in CIF"));
		expect(() => parseCif('data_x\nsave_f\n_a 1\n')).toThrow(err(2, "save frame 'save_f' is not closed with 'save_'"));
	});
	it('input above maxBytes', () => {
		expect(() => parseCif(nitrothiopheneCif, { maxBytes: 1024 })).toThrow(
			new CifParseError(0, 'CIF input is 8901 bytes, larger than the limit of 1 kB (maxBytes = 1024)')
		);
	});
});

describe('polymorphFromCif on COD 2205750 (orthorhombic, 100 K)', () => {
	const p = polymorphFromCif(nitrothiopheneCif);
	it('reads the cell with standard uncertainties as printed', () => {
		expect(p.blockName).toBe('2205750');
		expect(p.cell.a).toEqual({ value: 11.418, su: 0.0007 });
		expect(p.cell.b).toEqual({ value: 13.9536, su: 0.0008 });
		expect(p.cell.c).toEqual({ value: 3.8525, su: 0.0002 });
		expect(p.cell.alphaDeg).toEqual({ value: 90 });
	});
	it('reads space group, Z, formula and temperature', () => {
		expect(p.spaceGroup).toEqual({ hermannMauguin: 'P n a 21', hall: 'P 2c -2n' });
		expect(p.z).toBe(4);
		expect(p.formula?.counts).toEqual({ C: 5, H: 3, N: 1, O: 3, S: 1 });
		expect(p.formula?.hill).toBe('C5H3NO3S');
		expect(p.temperatureK).toEqual({ value: 100, su: 2 });
	});
	it('computed volume 613.79(6) Å³, molar mass 157.14 and density 1.701 match the printed values', () => {
		expect(Math.abs(p.volumeA3 - 613.79)).toBeLessThan(0.005); // _cell_volume 613.79(6)
		expect(Math.abs((p.volumeSuA3 ?? 0) - 0.06)).toBeLessThan(0.005);
		expect(Math.abs((p.formula?.molarMassGPerMol ?? 0) - 157.14)).toBeLessThan(0.005); // _chemical_formula_weight
		expect(Math.abs((p.densityGPerCm3 ?? 0) - 1.701)).toBeLessThan(0.0005); // _exptl_crystal_density_diffrn
		expect(p.volumePerMoleculeA3).toBeCloseTo(p.volumeA3 / 4, 12);
		expect(p.reported).toEqual({ volumeA3: { value: 613.79, su: 0.06 }, densityGPerCm3: 1.701, formulaWeightGPerMol: 157.14 });
		expect(p.warnings).toEqual([]);
	});
	it('reads 13 atom sites with su stripped and type symbols', () => {
		expect(p.atomSites).toHaveLength(13);
		expect(p.atomSites[0]).toEqual({ label: 'C1', element: 'C', fract: [0.46363, 0.11451, 0.2365], occupancy: 1 });
		expect(p.atomSites[8]).toEqual({ label: 'S1', element: 'S', fract: [0.46118, 0.31238, 0.2815], occupancy: 1 });
		expect(p.atomSites[12]).toEqual({ label: 'H1', element: 'H', fract: [0.433, 0.059, 0.138], occupancy: 1 });
		const counts: Record<string, number> = {};
		for (const s of p.atomSites) counts[s.element] = (counts[s.element] ?? 0) + 1;
		// Z' = 1: the asymmetric unit holds one molecule, so the sites reproduce the sum formula
		expect(counts).toEqual(p.formula?.counts);
	});
});

describe('polymorphFromCif on COD 1100117 (monoclinic, unknown temperature)', () => {
	const p = polymorphFromCif(hybridCif);
	it('reads H-M symbol and IT number, Z and formula', () => {
		expect(p.spaceGroup).toEqual({ hermannMauguin: 'P 1 21 1', hall: 'P 2yb', number: 4 });
		expect(p.z).toBe(2);
		expect(p.formula?.hill).toBe('C12H30AlF5N2');
		expect(p.temperatureK).toBeUndefined(); // _diffrn_ambient_temperature ?
	});
	it('computed volume and density match the printed 832.354 Å³ and 1.29 g/cm³', () => {
		expect(Math.abs(p.volumeA3 - 832.354)).toBeLessThan(0.001);
		expect(Math.abs((p.densityGPerCm3 ?? 0) - 1.29)).toBeLessThan(0.005);
		expect(p.warnings).toEqual([]);
	});
	it('reads atom sites without an occupancy column (defaults to 1)', () => {
		expect(p.atomSites).toHaveLength(20);
		expect(p.atomSites[0]).toEqual({ label: 'Al1', element: 'Al', fract: [0.3244, 0, -0.0223], occupancy: 1 });
	});
});

describe('polymorphFromCif on COD 2000724 (monoclinic organic pigment, Z = 2)', () => {
	const p = polymorphFromCif(dithioneCif);
	it('reads cell, symmetry, Z, formula and temperature', () => {
		expect(p.cell.betaDeg).toEqual({ value: 109.06, su: 0.01 });
		expect(p.cell.c).toEqual({ value: 14.813, su: 0.002 });
		expect(p.spaceGroup).toEqual({ hermannMauguin: 'P 1 21/c 1', hall: '-P 2ybc' });
		expect(p.z).toBe(2);
		expect(p.formula?.hill).toBe('C20H12N2S2');
		expect(p.temperatureK).toEqual({ value: 293 });
	});
	it('computed volume matches the printed 763.9(4) Å³ and molar mass the printed 344.45 g/mol', () => {
		expect(Math.abs(p.volumeA3 - 763.9)).toBeLessThan(0.05);
		expect(Math.abs((p.formula?.molarMassGPerMol ?? 0) - 344.45)).toBeLessThan(0.005);
		expect(p.volumePerMoleculeA3).toBeCloseTo(p.volumeA3 / 2, 12);
	});
	it('computed density 1.497 equals the printed measured density; the printed diffraction density 1.470 is flagged', () => {
		// the file prints _exptl_crystal_density_diffrn 1.470 and _exptl_crystal_density_meas 1.497
		expect(Math.abs((p.densityGPerCm3 ?? 0) - 1.497)).toBeLessThan(0.0005);
		expect(p.warnings).toEqual(['_exptl_crystal_density_diffrn 1.47 g/cm³ differs from the computed 1.497 g/cm³']);
	});
	it('reads the half molecule of the asymmetric unit (molecule on an inversion centre)', () => {
		expect(p.atomSites).toHaveLength(18);
		expect(p.atomSites[0]).toEqual({ label: 'S1', element: 'S', fract: [0.2882, 0.1233, 0.63948], occupancy: 1 });
		const counts: Record<string, number> = {};
		for (const s of p.atomSites) counts[s.element] = (counts[s.element] ?? 0) + 1;
		expect(counts).toEqual({ S: 1, N: 1, C: 10, H: 6 });
	});
});

const minimal = (extra: string, cell = '_cell_length_a 5\n_cell_length_b 6\n_cell_length_c 7\n_cell_angle_alpha 90\n_cell_angle_beta 100\n_cell_angle_gamma 90\n') =>
	`data_m\n${cell}${extra}`;

describe('polymorphFromCif details', () => {
	it('derives elements from labels, reads occupancy, skips unknown and dummy sites with warnings', () => {
		const p = polymorphFromCif(
			minimal(
				'loop_\n_atom_site_label\n_atom_site_fract_x\n_atom_site_fract_y\n_atom_site_fract_z\n_atom_site_occupancy\n_atom_site_calc_flag\n' +
					'C12 0.1 0.2 0.3 1 d\nCl1 0.5(1) 0.5 0.5 0.5 d\nCA1 0 0 0 . d\nH3A 0 0 0 1 calc\nD1 0 0 0 1 d\nQ9 ? ? ? 1 d\nX1 0 0 0 1 dum\n'
			)
		);
		expect(p.atomSites.map((s) => [s.label, s.element, s.occupancy])).toEqual([
			['C12', 'C', 1],
			['Cl1', 'Cl', 0.5],
			['CA1', 'C', 1],
			['H3A', 'H', 1],
			['D1', 'H', 1]
		]);
		expect(p.atomSites[1].fract).toEqual([0.5, 0.5, 0.5]);
		expect(p.warnings).toEqual([
			'line 20: atom site Q9 has unknown coordinates; skipped',
			'line 21: atom site X1 is a dummy site (calc_flag dum); skipped'
		]);
		expect(p.z).toBeUndefined();
		expect(p.densityGPerCm3).toBeUndefined();
	});
	it('uses the newer space-group tags and strips charges from type symbols', () => {
		const p = polymorphFromCif(
			minimal(
				"_space_group_name_H-M_alt 'P 21/c'\n_space_group_IT_number 14\n_cell_formula_units_Z 4\n_chemical_formula_sum 'C14 H10'\n" +
					'_cell_measurement_temperature 293\nloop_\n_atom_site_label\n_atom_site_type_symbol\n_atom_site_fract_x\n_atom_site_fract_y\n_atom_site_fract_z\nO1 O2- 0 0 0\nF1 Fe3+ 0 0 0\n'
			)
		);
		expect(p.spaceGroup).toEqual({ hermannMauguin: 'P 21/c', number: 14 });
		expect(p.temperatureK).toEqual({ value: 293 });
		expect(p.atomSites.map((s) => s.element)).toEqual(['O', 'Fe']);
		expect(p.densityGPerCm3).toBeGreaterThan(0);
	});
	it('warns when printed volume or density disagree with the computed ones', () => {
		const p = polymorphFromCif(minimal("_cell_volume 300\n_cell_formula_units_Z 2\n_chemical_formula_sum 'C6 H6'\n_exptl_crystal_density_diffrn 9.9\n"));
		expect(p.warnings).toHaveLength(2);
		expect(p.warnings[0]).toMatch(/^_cell_volume 300 Å³ differs from the volume computed from the cell, 206\.81 Å³$/);
	});
	it('picks a named block, or the first with a cell', () => {
		const two = 'data_meta\n_journal_year 2005\n' + minimal('').replace('data_m', 'data_crystal');
		expect(polymorphFromCif(two).blockName).toBe('crystal');
		expect(polymorphFromCif(two, { blockName: 'CRYSTAL' }).blockName).toBe('crystal');
		expect(() => polymorphFromCif(two, { blockName: 'nope' })).toThrow("no data block named 'nope' (found: meta, crystal)");
	});
});

describe('polymorphFromCif errors', () => {
	it('missing required cell tag names the data block line', () => {
		expect(() => polymorphFromCif('# header\ndata_m\n_cell_length_a 5\n_cell_length_b 6\n')).toThrow(
			err(2, "data block 'm' is missing the required cell tag _cell_length_c")
		);
	});
	it('unknown or non-numeric cell values', () => {
		expect(() => polymorphFromCif(minimal('').replace('_cell_length_b 6', '_cell_length_b ?'))).toThrow(
			err(3, "required cell tag _cell_length_b has no value ('?')")
		);
		expect(() => polymorphFromCif(minimal('').replace('_cell_angle_beta 100', '_cell_angle_beta wide'))).toThrow(
			err(6, '_cell_angle_beta value "wide" is not a number')
		);
	});
	it('a non-physical cell', () => {
		expect(() => polymorphFromCif(minimal('').replace('_cell_angle_beta 100', '_cell_angle_beta 0'))).toThrow(
			err(2, 'the cell is not physical: cell angle betaDeg must be a finite number strictly between 0 and 180 degrees, got 0')
		);
	});
	it('bad Z, space-group number, formula, occupancy or element', () => {
		expect(() => polymorphFromCif(minimal('_cell_formula_units_Z 2.5\n'))).toThrow(
			err(8, '_cell_formula_units_Z must be a whole number >= 1, got 2.5')
		);
		expect(() => polymorphFromCif(minimal('_symmetry_Int_Tables_number 231\n'))).toThrow(
			err(8, '_symmetry_int_tables_number must be a whole number from 1 to 230, got 231')
		);
		expect(() => polymorphFromCif(minimal("_chemical_formula_sum 'C6 Xx2'\n"))).toThrow(
			err(8, "_chemical_formula_sum: unknown element 'Xx' at position 4 of 'C6 Xx2'")
		);
		expect(() =>
			polymorphFromCif(minimal('loop_\n_atom_site_label\n_atom_site_fract_x\n_atom_site_fract_y\n_atom_site_fract_z\n_atom_site_occupancy\nC1 0 0 0 1.5\n'))
		).toThrow(err(14, 'atom site C1: occupancy 1.5 is outside 0..1'));
		expect(() =>
			polymorphFromCif(minimal('loop_\n_atom_site_label\n_atom_site_fract_x\n_atom_site_fract_y\n_atom_site_fract_z\n9X 0 0 0\n'))
		).toThrow(err(13, 'atom site 9X: no _atom_site_type_symbol and no element symbol at the start of the label'));
	});
	it('syntax errors from parseCif pass through with their line', () => {
		expect(() => polymorphFromCif(minimal("_title 'open\n"))).toThrow(expect.objectContaining({ name: 'CifParseError', line: 8 }));
	});
});
