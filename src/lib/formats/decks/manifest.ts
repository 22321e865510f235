/**
 * A manifest describing a set of generated decks (for a bundle's `manifest.json`): which file holds
 * which state at which parameters, so outputs can be matched back to the scan without parsing names.
 */
import { DeckInputError } from './errors';
import type { DeckStateLabel } from './molecule';
import type { NwchemDeck } from './nwchem';
import type { DeckProvenance } from './provenance';
import type { Psi4Deck } from './psi4';

export const DECK_MANIFEST_SCHEMA = 'kappaline.decks/1';

export interface DeckManifestEntry {
	engine: 'nwchem' | 'psi4';
	kind: 'tuning' | 'screened';
	/** Path inside the bundle: `<folder>/<fileName>`. */
	path: string;
	folder: string;
	fileName: string;
	jobName: string;
	alpha: number;
	beta: number;
	gammaBohrInv: number;
	epsilon: number;
	states: { label: DeckStateLabel; charge: number; multiplicity: number; electrons: number; unrestricted: boolean }[];
}

export interface DeckManifest {
	schema: typeof DECK_MANIFEST_SCHEMA;
	provenance: DeckProvenance;
	entries: DeckManifestEntry[];
}

/** Build the manifest of a set of decks; refuses two decks at the same path. */
export function deckManifest(decks: readonly (NwchemDeck | Psi4Deck)[], provenance: DeckProvenance): DeckManifest {
	const seen = new Set<string>();
	const entries = decks.map((d, i) => {
		const path = `${d.folder}/${d.fileName}`;
		if (seen.has(path)) throw new DeckInputError(`decks[${i}]`, `two decks share the path ${path}`);
		seen.add(path);
		return {
			engine: d.engine,
			kind: d.kind,
			path,
			folder: d.folder,
			fileName: d.fileName,
			jobName: d.jobName,
			alpha: d.parameters.alpha,
			beta: d.parameters.beta,
			gammaBohrInv: d.parameters.gammaBohrInv,
			epsilon: d.parameters.epsilon,
			states: d.states.map((s) => ({
				label: s.label,
				charge: s.charge,
				multiplicity: s.multiplicity,
				electrons: s.electrons,
				unrestricted: s.unrestricted
			}))
		};
	});
	return { schema: DECK_MANIFEST_SCHEMA, provenance: { ...provenance }, entries };
}
