// Demo workspace content. The scenario is invented: the fictional "Fjordlight Photonics" thin-film
// group screens acene crystals for an imaginary organic photodetector stack. Geometries are built
// from idealised ring geometry (C–C 1.40 Å, C–H 1.08 Å), not optimised; cells are invented,
// plausible values for illustration only. Nothing here is a measurement.
import type { MoleculeInput } from '../src/lib/schemas/molecule';
import type { PolymorphInput } from '../src/lib/schemas/polymorph';
import type { ScanPointInput } from '../src/lib/schemas/tuning';
import { HARTREE_EV } from '../src/lib/science/units';

/** A linear acene with n fused rings, planar in the xy plane, as XYZ text. */
export function aceneXyz(rings: number, name: string): string {
	const cc = 1.4;
	const ch = 1.08;
	const h = (cc * Math.sqrt(3)) / 2; // half-width of a ring along y
	const atoms: [string, number, number, number][] = [];
	const carbons: [number, number][] = [];
	// ring centres along x, spaced by 2h (fused hexagons sharing vertical edges)
	for (let i = 0; i <= rings; i++) {
		const x = (i - rings / 2) * 2 * h;
		carbons.push([x, cc / 2], [x, -cc / 2]);
	}
	for (let i = 0; i < rings; i++) {
		const x = (i - rings / 2) * 2 * h + h;
		carbons.push([x, cc], [x, -cc]);
	}
	for (const [x, y] of carbons) atoms.push(['C', x, y, 0]);
	// hydrogens on the top/bottom apex carbons and on the four end carbons
	for (let i = 0; i < rings; i++) {
		const x = (i - rings / 2) * 2 * h + h;
		atoms.push(['H', x, cc + ch, 0], ['H', x, -cc - ch, 0]);
	}
	for (const end of [0, rings]) {
		const x = (end - rings / 2) * 2 * h;
		const sx = end === 0 ? -1 : 1;
		for (const sy of [1, -1]) {
			atoms.push(['H', x + sx * ch * Math.cos(Math.PI / 6), sy * (cc / 2 + ch * Math.sin(Math.PI / 6)), 0]);
		}
	}
	const lines = atoms.map(([el, x, y, z]) => `${el.padEnd(2)} ${x.toFixed(6).padStart(12)} ${y.toFixed(6).padStart(12)} ${z.toFixed(6).padStart(12)}`);
	return `${atoms.length}\n${name} (idealised planar geometry, demo)\n${lines.join('\n')}\n`;
}

export interface DemoMolecule {
	molecule: MoleculeInput;
	polymorphs: PolymorphInput[];
}

const demoNote = 'Demo record: invented values for illustration, not a measurement.';

export function demoMolecules(): DemoMolecule[] {
	const acene = (rings: number, name: string, notes: string, polymorphs: PolymorphInput[]): DemoMolecule => ({
		molecule: { name, formula: '', netCharge: 0, multiplicity: 1, geometryXyz: aceneXyz(rings, name), smiles: '', notes: `${notes}\n${demoNote}` },
		polymorphs
	});
	const p = (label: string, spaceGroup: string, a: number, b: number, c: number, alphaDeg: number, betaDeg: number, gammaDeg: number, z: number, structureSource: string): PolymorphInput => ({
		label, spaceGroup, a, b, c, alphaDeg, betaDeg, gammaDeg, z, temperatureK: 295, structureSource, notes: demoNote
	});
	return [
		acene(2, 'Naphthalene (reference donor)', 'Small reference for the tuning workflow.', [
			p('bulk (demo)', 'P2_1/a', 8.1, 5.9, 8.6, 90, 124, 90, 2, 'invented demo cell')
		]),
		acene(3, 'Anthracene (interlayer candidate)', 'Candidate hole-transport interlayer for the photodetector stack.', [
			p('bulk (demo)', 'P2_1/a', 8.6, 6.0, 11.2, 90, 125, 90, 2, 'invented demo cell'),
			p('thin film on oxide (demo)', 'P-1', 6.0, 7.7, 11.6, 88, 92, 95, 2, 'invented demo cell')
		]),
		acene(4, 'Tetracene (absorber)', 'Absorber layer: compare bulk and film screening.', [
			p('bulk (demo)', 'P-1', 6.1, 7.8, 13.0, 77, 72, 85, 2, 'invented demo cell')
		]),
		acene(5, 'Pentacene (absorber, long wavelength)', 'Long-wavelength absorber; two phases seen in the group’s films.', [
			p('bulk (demo)', 'P-1', 6.3, 7.7, 14.4, 77, 88, 84, 2, 'invented demo cell'),
			p('thin-film phase (demo)', 'P-1', 5.9, 7.6, 15.6, 81, 87, 90, 2, 'invented demo cell')
		])
	];
}

/** Demo electronic dielectric constants per polymorph label: invented, plausible for acene crystals (2.5-4.5, common practice). */
export const DEMO_EPSILON: Record<string, number> = {
	'bulk (demo)': 3.3,
	'thin film on oxide (demo)': 3.0,
	'thin-film phase (demo)': 3.1
};

// Demo tuning scans: generated from smooth model functions (J terms nearly linear in gamma with a
// chosen root, IP and EA drifting slowly with gamma). Invented demo data, not engine runs; the IP/EA
// magnitudes are round numbers in the range known for acenes (recalled from memory, illustration only).
export interface DemoScanModel {
	/** Where J_IP and J_EA cross zero (bohr^-1); the demo's gamma*. */
	gammaStar: number;
	ipEv: number;
	eaEv: number;
}

/** A scan of 9 points around the model's optimum, in hartree, as the API and importer take it. */
export function demoScan(model: DemoScanModel): ScanPointInput[] {
	const ev = (x: number) => x / HARTREE_EV;
	return Array.from({ length: 9 }, (_, i) => {
		const g = Number((model.gammaStar - 0.107 + i * 0.03).toFixed(4)); // grid not centred on the optimum
		const d = g - model.gammaStar;
		// Total energy rises smoothly with gamma, as range-separated hybrids' energies do (arbitrary reference).
		const eNeutral = -500 + 0.12 * g + 0.3 * g * g;
		const ip = model.ipEv + 0.8 * d; // total-energy IP drifts slowly with gamma
		const ea = model.eaEv - 0.5 * d;
		const jIp = -4.0 * d + 1.5 * d * d; // eV; crosses zero at gammaStar
		const jEa = -3.2 * (d - 0.012) - 1.0 * d * d; // J_EA crosses a little above J_IP, as real scans do
		return {
			gammaBohrInv: g,
			eNeutralHartree: eNeutral,
			eCationHartree: eNeutral + ev(ip),
			eAnionHartree: eNeutral - ev(ea),
			homoNeutralHartree: ev(jIp - ip), // J_IP = eps_HOMO + IP
			lumoNeutralHartree: ev(-ea - 0.15 + 2.5 * d),
			homoAnionHartree: ev(jEa - ea) // J_EA = eps_HOMO(N+1) + EA
		};
	});
}

export const DEMO_TUNING: Record<string, DemoScanModel> = {
	'Naphthalene (reference donor)': { gammaStar: 0.27, ipEv: 8.1, eaEv: -0.3 },
	'Anthracene (interlayer candidate)': { gammaStar: 0.235, ipEv: 7.4, eaEv: 0.5 },
	'Tetracene (absorber)': { gammaStar: 0.21, ipEv: 6.9, eaEv: 1.0 },
	'Pentacene (absorber, long wavelength)': { gammaStar: 0.195, ipEv: 6.55, eaEv: 1.35 }
};

