import { describe, expect, it } from 'vitest';
import { DeckInputError } from './errors';
import { checkMolecule, tuningStates } from './molecule';

// Symbols and atomic numbers come from the science core's element table ($lib/science/elements,
// IUPAC 2013 standard atomic weights report, H to Rn).
describe('checkMolecule with the shared element table', () => {
	it('normalises symbols and counts electrons from atomic numbers', () => {
		const m = checkMolecule({
			atoms: [
				{ element: ' cl ', x: 0, y: 0, z: 0 },
				{ element: 'CL', x: 1.99, y: 0, z: 0 }
			],
			charge: 0,
			multiplicity: 1
		});
		expect(m.atoms.map((a) => a.element)).toEqual(['Cl', 'Cl']);
		expect(m.nuclearCharge).toBe(34);
		expect(tuningStates(m).map((s) => [s.label, s.electrons, s.multiplicity])).toEqual([
			['neutral', 34, 1],
			['cation', 33, 2],
			['anion', 35, 2]
		]);
	});

	it('knows the heaviest element of the table (Rn, Z = 86)', () => {
		expect(checkMolecule({ atoms: [{ element: 'Rn', x: 0, y: 0, z: 0 }], charge: 0, multiplicity: 1 }).electrons).toBe(86);
	});

	it('refuses symbols outside the table', () => {
		for (const element of ['Xx', 'Og', '']) {
			expect(() => checkMolecule({ atoms: [{ element, x: 0, y: 0, z: 0 }], charge: 0, multiplicity: 1 })).toThrow(DeckInputError);
		}
		expect(() => checkMolecule({ atoms: [{ element: 'Og', x: 0, y: 0, z: 0 }], charge: 0, multiplicity: 1 })).toThrow(
			'molecule.atoms[0].element: unknown element symbol "Og"'
		);
	});
});
