/**
 * Shared test data for the bundle specs (not used by the app): the SO2 molecule of the deck fixtures
 * and a bundle request that reproduces the fixture decks (decks/fixtures/README.md).
 */
import { readNwchemOutput } from '../decks';
import type { BundleInput } from './build';

const r = 1.4308;
const half = ((119.33 / 2) * Math.PI) / 180;

/** SO2 at its experimental equilibrium geometry, r(S-O) = 1.4308 Å, angle 119.33°, as in the fixtures. */
export const SO2_ATOMS = [
	{ element: 'S', x: 0, y: 0, z: 0 },
	{ element: 'O', x: r * Math.sin(half), y: 0, z: -r * Math.cos(half) },
	{ element: 'O', x: -r * Math.sin(half), y: 0, z: -r * Math.cos(half) }
];

/** The request behind the SO2 fixtures: alpha 0.2, gammas 0.2/0.3/0.4, epsilon 3, aug-cc-pVDZ, grid fine. */
export function so2BundleInput(over: Partial<BundleInput> = {}): BundleInput {
	return {
		molecule: { name: 'sulfur dioxide (SO2)', atoms: SO2_ATOMS, charge: 0, multiplicity: 1 },
		jobName: 'so2',
		alpha: 0.2,
		tuning: { gammasBohrInv: [0.2, 0.3, 0.4] },
		screened: { gammaBohrInv: 0.3, epsilons: [3, 6], epsilonSource: 'user scalar' },
		settings: { basis: 'aug-cc-pvdz', grid: 'fine', energyConvergence: 1e-8, memoryMb: 1000 },
		appVersion: '0.1.0',
		createdAt: '2026-12-01T12:00:00.000Z',
		study: 'deck fixture runs',
		...over
	};
}

/** The files at the top of every bundle, in zip order. */
export const BUNDLE_TOP_FILES = ['README.txt', 'manifest.json', 'run-local.sh', 'submit-slurm.sh', 'submit-pbs.sh'];

/** A scan point as the ingestion should give it: the neutral, cation and anion tasks of one gamma. */
export function scanPointOf(
	gammaBohrInv: number,
	[n, c, a]: readonly { totalEnergyHartree: number | null; homoHartree: number | null; lumoHartree: number | null }[]
) {
	return {
		gammaBohrInv,
		eNeutralHartree: n.totalEnergyHartree,
		eCationHartree: c.totalEnergyHartree,
		eAnionHartree: a.totalEnergyHartree,
		homoNeutralHartree: n.homoHartree,
		lumoNeutralHartree: n.lumoHartree,
		homoAnionHartree: a.homoHartree
	};
}

/**
 * The scan point a combined tuning output gives (tasks in the order neutral, cation, anion), read with
 * the project's NWChem reader: what the ingestion must produce from the same file.
 */
export function scanPointFromOutput(text: string, gammaBohrInv: number) {
	return scanPointOf(gammaBohrInv, readNwchemOutput(text).tasks);
}
