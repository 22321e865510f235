/**
 * The molecule a deck describes, and the charged states a gamma-tuning job needs.
 *
 * Kept local to the deck writers on purpose (atoms in Å, integer charge, spin multiplicity 2S+1), so
 * the writers do not depend on other format modules. Element symbols and atomic numbers come from the
 * science core's table (`$lib/science/elements`, H to Rn).
 */
import { DeckInputError } from './errors';
import { elementBySymbol } from '$lib/science/elements';

/** One atom: element symbol and Cartesian position in Å. */
export interface DeckAtom {
	element: string;
	x: number;
	y: number;
	z: number;
}

/** A molecule at a fixed geometry with its total charge and spin multiplicity (2S+1). */
export interface DeckMolecule {
	atoms: readonly DeckAtom[];
	charge: number;
	multiplicity: number;
}

/** Which of the three tuning states a calculation is. */
export type DeckStateLabel = 'neutral' | 'cation' | 'anion';

/** One electronic state of the molecule at the frozen geometry. */
export interface DeckState {
	label: DeckStateLabel;
	/** Total charge of this state (neutral's charge, +1 for the cation, -1 for the anion). */
	charge: number;
	multiplicity: number;
	electrons: number;
	/** Spin-unrestricted (open-shell) treatment; always true for the ions. */
	unrestricted: boolean;
}

/** A validated copy of the molecule: canonical symbols, electron count of the given charge. */
export interface CheckedMolecule extends DeckMolecule {
	atoms: readonly DeckAtom[];
	nuclearCharge: number;
	electrons: number;
}

/** Optional overrides of the ions' multiplicities (default: lowest spin allowed by parity). */
export interface IonMultiplicities {
	cationMultiplicity?: number;
	anionMultiplicity?: number;
}

/** Largest |coordinate| accepted, in Å: beyond this the input is almost surely in the wrong unit. */
const MAX_COORDINATE_A = 1.0e4;
/** Two nuclei closer than this (Å) are the same atom entered twice. */
const MIN_DISTANCE_A = 0.1;

/** Lowest multiplicity compatible with an electron count: 1 for even, 2 for odd. */
export function lowestMultiplicity(electrons: number): number {
	return electrons % 2 === 0 ? 1 : 2;
}

function checkMultiplicity(field: string, multiplicity: number, electrons: number): void {
	if (!Number.isInteger(multiplicity) || multiplicity < 1) {
		throw new DeckInputError(field, `multiplicity must be an integer >= 1, got ${multiplicity}`);
	}
	if (electrons < 1) {
		throw new DeckInputError(field, `the state has ${electrons} electrons; at least 1 is needed`);
	}
	// 2S+1 odd <=> even electron count (S integer); 2S+1 even <=> odd electron count.
	if ((multiplicity - 1) % 2 !== electrons % 2) {
		throw new DeckInputError(
			field,
			`multiplicity ${multiplicity} is impossible with ${electrons} electrons ` +
				`(${electrons % 2 === 0 ? 'an even count needs an odd multiplicity: 1, 3, ...' : 'an odd count needs an even multiplicity: 2, 4, ...'})`
		);
	}
	if (multiplicity - 1 > electrons) {
		throw new DeckInputError(field, `multiplicity ${multiplicity} needs more than ${electrons} unpaired electrons`);
	}
}

/**
 * Validate a molecule: known elements, finite coordinates, no two atoms on top of each other,
 * integer charge, a multiplicity consistent with the electron count. Returns a normalised copy.
 */
export function checkMolecule(molecule: DeckMolecule, field = 'molecule'): CheckedMolecule {
	if (!molecule || !Array.isArray(molecule.atoms) || molecule.atoms.length === 0) {
		throw new DeckInputError(`${field}.atoms`, 'at least one atom is needed');
	}
	const atoms: DeckAtom[] = [];
	let nuclearCharge = 0;
	molecule.atoms.forEach((atom, i) => {
		const f = `${field}.atoms[${i}]`;
		const known = typeof atom?.element === 'string' ? elementBySymbol(atom.element) : undefined;
		if (known === undefined) {
			throw new DeckInputError(`${f}.element`, `unknown element symbol ${JSON.stringify(atom?.element)}`);
		}
		for (const axis of ['x', 'y', 'z'] as const) {
			const v = atom[axis];
			if (typeof v !== 'number' || !Number.isFinite(v)) {
				throw new DeckInputError(`${f}.${axis}`, `coordinate must be a finite number in Å, got ${v}`);
			}
			if (Math.abs(v) > MAX_COORDINATE_A) {
				throw new DeckInputError(`${f}.${axis}`, `|${axis}| = ${Math.abs(v)} Å exceeds ${MAX_COORDINATE_A} Å; check the unit`);
			}
		}
		nuclearCharge += known.atomicNumber;
		atoms.push({ element: known.symbol, x: atom.x, y: atom.y, z: atom.z });
	});
	for (let i = 0; i < atoms.length; i++) {
		for (let j = i + 1; j < atoms.length; j++) {
			const d = Math.hypot(atoms[i].x - atoms[j].x, atoms[i].y - atoms[j].y, atoms[i].z - atoms[j].z);
			if (d < MIN_DISTANCE_A) {
				throw new DeckInputError(
					`${field}.atoms[${j}]`,
					`atoms ${i + 1} and ${j + 1} are ${d.toFixed(4)} Å apart (< ${MIN_DISTANCE_A} Å): duplicated atom?`
				);
			}
		}
	}
	if (!Number.isInteger(molecule.charge)) {
		throw new DeckInputError(`${field}.charge`, `charge must be an integer, got ${molecule.charge}`);
	}
	const electrons = nuclearCharge - molecule.charge;
	checkMultiplicity(`${field}.multiplicity`, molecule.multiplicity, electrons);
	return { atoms, charge: molecule.charge, multiplicity: molecule.multiplicity, nuclearCharge, electrons };
}

/**
 * The neutral (as given), cation (one electron fewer) and anion (one more) at the same geometry.
 * The ions are always spin-unrestricted; their multiplicity defaults to the lowest allowed by the
 * electron-count parity (2 for an odd count, 1 for an even one) and may be overridden.
 */
export function tuningStates(molecule: CheckedMolecule, ions: IonMultiplicities = {}): DeckState[] {
	const nCation = molecule.electrons - 1;
	const nAnion = molecule.electrons + 1;
	const cationMult = ions.cationMultiplicity ?? lowestMultiplicity(nCation);
	const anionMult = ions.anionMultiplicity ?? lowestMultiplicity(nAnion);
	checkMultiplicity('cationMultiplicity', cationMult, nCation);
	checkMultiplicity('anionMultiplicity', anionMult, nAnion);
	return [
		{
			label: 'neutral',
			charge: molecule.charge,
			multiplicity: molecule.multiplicity,
			electrons: molecule.electrons,
			unrestricted: molecule.multiplicity > 1
		},
		{ label: 'cation', charge: molecule.charge + 1, multiplicity: cationMult, electrons: nCation, unrestricted: true },
		{ label: 'anion', charge: molecule.charge - 1, multiplicity: anionMult, electrons: nAnion, unrestricted: true }
	];
}

/** The neutral state alone (used by the screened rerun). */
export function neutralState(molecule: CheckedMolecule): DeckState {
	return {
		label: 'neutral',
		charge: molecule.charge,
		multiplicity: molecule.multiplicity,
		electrons: molecule.electrons,
		unrestricted: molecule.multiplicity > 1
	};
}
