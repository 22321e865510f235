import type { Executor } from '../db';
import { getEpsilonInUse } from './dielectric';
import { listMeasurements, type Measurement } from './measurements';

/** The gas-phase tuned parameters the solid-state estimate starts from (the molecule's current study). */
export interface TunedParameters {
	studyId: string;
	studyLabel: string;
	alpha: number;
	gammaBohrInv: number;
	ipEv: number;
	eaEv: number;
}

/** The polymorph's chosen dielectric constant. */
export interface EpsilonChoice {
	entryId: string;
	epsilon: number;
	uncertainty: number | null;
	label: string;
}

export interface LevelsContext {
	tuned: TunedParameters | null;
	epsilonInUse: EpsilonChoice | null;
	measurements: Measurement[];
}

/**
 * Everything the levels page needs for a polymorph. The tuned parameters and the epsilon in use come
 * from the tuning and dielectric records; until a molecule has a current study (or a polymorph an
 * epsilon in use) they are null and the page says what is missing.
 */
const KIND_LABEL: Record<string, string> = { scalar: 'scalar', tensor: 'tensor', refractive_index: 'n²', clausius_mossotti: 'Clausius–Mossotti' };

export async function levelsContext(db: Executor, workspaceId: string, polymorphId: string, _moleculeId: string): Promise<LevelsContext> {
	const [eps, measurements] = await Promise.all([getEpsilonInUse(db, workspaceId, polymorphId), listMeasurements(db, workspaceId, polymorphId)]);
	const epsilonInUse = eps
		? { entryId: eps.entryId, epsilon: eps.entry.epsilon, uncertainty: eps.entry.epsilonUncertainty, label: `${KIND_LABEL[eps.entry.kind] ?? eps.entry.kind}, ${eps.entry.frequency}${eps.entry.source.method ? ` — ${eps.entry.source.method}` : ''}` }
		: null;
	return { tuned: null, epsilonInUse, measurements };
}
