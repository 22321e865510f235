/**
 * What the engines' deck writers share about scans and file names: the gamma list of a tuning scan
 * (non-empty, bounded, no two gammas with the same folder tag), the layout (all three states in one
 * deck, or one deck per state) and how deck files are named.
 */
import { DeckInputError } from './errors';
import { gammaTag } from './names';

/** Most gamma points accepted in one scan. */
export const MAX_SCAN_POINTS = 200;

/**
 * `start` (default): `<start name>.<ext>`, unique across a whole scan. `state`: after what the deck
 * holds (`neutral`, `cation`, `anion`, `neutral-cation-anion` for the three states in one deck), for
 * layouts where the folder carries gamma or epsilon.
 */
export type DeckFileNames = 'start' | 'state';

/** `combined`: one deck per gamma; `per-state`: three decks per gamma. */
export type ScanLayout = 'combined' | 'per-state';

export function checkFileNames(options: { fileNames?: DeckFileNames } | undefined): DeckFileNames {
	const f = options?.fileNames ?? 'start';
	if (f !== 'start' && f !== 'state') throw new DeckInputError('fileNames', `fileNames must be start or state, got ${JSON.stringify(f)}`);
	return f;
}

export function checkScanLayout(layout: ScanLayout | undefined): ScanLayout {
	const l = layout ?? 'combined';
	if (l !== 'combined' && l !== 'per-state') {
		throw new DeckInputError('layout', `layout must be combined or per-state, got ${JSON.stringify(l)}`);
	}
	return l;
}

/** Check the gammas of a scan: at least one, at most {@link MAX_SCAN_POINTS}, no duplicated tag. */
export function checkScanGammas(gammas: readonly number[] | undefined): readonly number[] {
	if (!Array.isArray(gammas) || gammas.length === 0) {
		throw new DeckInputError('gammasBohrInv', 'at least one gamma is needed');
	}
	if (gammas.length > MAX_SCAN_POINTS) {
		throw new DeckInputError('gammasBohrInv', `at most ${MAX_SCAN_POINTS} gammas per scan, got ${gammas.length}`);
	}
	const seen = new Map<string, number>();
	gammas.forEach((g, i) => {
		const tag = gammaTag(g, `gammasBohrInv[${i}]`);
		const prev = seen.get(tag);
		if (prev !== undefined) {
			throw new DeckInputError(`gammasBohrInv[${i}]`, `gamma ${g} duplicates gammasBohrInv[${prev}] = ${gammas[prev]} (tag ${tag})`);
		}
		seen.set(tag, i);
	});
	return gammas;
}

/** File name of a deck named after its states: `neutral.in`, `neutral-cation-anion.nw`. */
export function stateFileName(states: readonly { label: string }[], extension: 'nw' | 'in'): string {
	return `${states.map((s) => s.label).join('-')}.${extension}`;
}

/**
 * The decks of a whole scan, in the order of the gammas: one `combined` deck per gamma, or the
 * `per-state` decks, from the engine's own single-gamma writers.
 */
export function scanDecks<J extends { gammaBohrInv: number }, D>(
	scan: Omit<J, 'gammaBohrInv'> & { gammasBohrInv: readonly number[] },
	options: { layout?: ScanLayout; fileNames?: DeckFileNames },
	combined: (job: J, options: { fileNames: DeckFileNames }) => D,
	perState: (job: J, options: { fileNames: DeckFileNames }) => D[]
): D[] {
	const layout = checkScanLayout(options.layout);
	const fileNames = checkFileNames(options);
	const gammas = checkScanGammas(scan?.gammasBohrInv);
	const { gammasBohrInv: _omit, ...rest } = scan;
	return gammas.flatMap((g) => {
		const job = { ...rest, gammaBohrInv: g } as unknown as J;
		return layout === 'combined' ? [combined(job, { fileNames })] : perState(job, { fileNames });
	});
}
