/**
 * The folder layout of a run bundle, shared by the writer and the ingestion:
 *
 *   <root>/manifest.json, README.txt, run-local.sh, submit-slurm.sh, submit-pbs.sh
 *   <root>/tuning/g0p2500/neutral.nw, cation.nw, anion.nw   (one folder per gamma, one deck per state)
 *   <root>/tuning/g0p2500/neutral-cation-anion.nw           (or the three states in one deck)
 *   <root>/screened/eps3p000/neutral.nw                      (one folder per epsilon)
 *
 * Each output sits beside its deck with the same base name and the extension `.out`.
 * Gamma tags carry at least 4 decimals (bohr^-1), epsilon tags exactly 3.
 */
import { checkEpsilon, gammaTag } from '../decks';

export const TUNING_DIR = 'tuning';
export const SCREENED_DIR = 'screened';

/** Folder of one gamma of the tuning scan: `tuning/g0p2500`. */
export function tuningFolder(gammaBohrInv: number, field = 'gammaBohrInv'): string {
	return `${TUNING_DIR}/${gammaTag(gammaBohrInv, field)}`;
}

/** Tag of an epsilon in a folder name: `eps3p000` for 3, `eps3p560` for 3.56 (3 decimals). */
export function epsilonFolderTag(epsilon: number, field = 'epsilon'): string {
	const e = checkEpsilon(epsilon, field);
	const [int, frac] = e.toFixed(3).split('.');
	return `eps${int}p${frac}`;
}

/** Folder of one screened rerun: `screened/eps3p000`. */
export function screenedFolder(epsilon: number, field = 'epsilon'): string {
	return `${SCREENED_DIR}/${epsilonFolderTag(epsilon, field)}`;
}

/** What a bundle folder holds, read back from its name (null when it is not a bundle folder). */
export type BundleFolder = { kind: 'tuning'; gammaBohrInv: number } | { kind: 'screened'; epsilon: number };

/** Read `tuning/g0p2500` or `screened/eps3p000` (the last two segments of a folder path). */
export function parseBundleFolder(folder: string): BundleFolder | null {
	const parts = folder.split('/').filter(Boolean);
	if (parts.length < 2) return null;
	const [dir, tag] = parts.slice(-2);
	let m: RegExpExecArray | null;
	if (dir === TUNING_DIR && (m = /^g(\d+)p(\d{4,6})$/.exec(tag))) return { kind: 'tuning', gammaBohrInv: Number(`${m[1]}.${m[2]}`) };
	if (dir === SCREENED_DIR && (m = /^eps(\d+)p(\d{3})$/.exec(tag))) return { kind: 'screened', epsilon: Number(`${m[1]}.${m[2]}`) };
	return null;
}

/** Folder part of a path (`a/b/c.out` -> `a/b`, `c.out` -> ``). */
export function dirName(path: string): string {
	const i = path.lastIndexOf('/');
	return i < 0 ? '' : path.slice(0, i);
}

/** File part of a path. */
export function baseName(path: string): string {
	return path.slice(path.lastIndexOf('/') + 1);
}

/** The output path of a deck: same folder and base name, extension `.out`. */
export function outputPathOf(deckPath: string): string {
	return deckPath.replace(/\.[A-Za-z0-9]+$/, '') + '.out';
}
