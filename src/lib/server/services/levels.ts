import type { Executor } from '../db';
import { getEpsilonInUse } from './dielectric';
import { listMeasurements, type Measurement } from './measurements';
import { currentStudyOf } from './tuning';

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
	/** Why `tuned` is null, in words the page shows. */
	tunedMissing: string | null;
	epsilonInUse: EpsilonChoice | null;
	measurements: Measurement[];
}

const KIND_LABEL: Record<string, string> = { scalar: 'scalar', tensor: 'tensor', refractive_index: 'n²', clausius_mossotti: 'Clausius–Mossotti' };

/** Everything the levels page needs for a polymorph: the current tuned study, the epsilon in use, the measurements. */
export async function levelsContext(db: Executor, workspaceId: string, polymorphId: string, moleculeId: string): Promise<LevelsContext> {
	const [study, eps, measurements] = await Promise.all([
		currentStudyOf(db, workspaceId, moleculeId),
		getEpsilonInUse(db, workspaceId, polymorphId),
		listMeasurements(db, workspaceId, polymorphId)
	]);
	let tuned: TunedParameters | null = null;
	let tunedMissing: string | null = null;
	if (!study) tunedMissing = 'no tuning study of this molecule is marked current';
	else if (study.gammaStarBohrInv === null || study.ipEv === null || study.eaEv === null) tunedMissing = `the current study “${study.name}” has no saved analysis with gamma*, IP and EA`;
	else tuned = { studyId: study.id, studyLabel: study.name, alpha: study.alpha, gammaBohrInv: study.gammaStarBohrInv, ipEv: study.ipEv, eaEv: study.eaEv };
	const epsilonInUse = eps
		? { entryId: eps.entryId, epsilon: eps.entry.epsilon, uncertainty: eps.entry.epsilonUncertainty, label: `${KIND_LABEL[eps.entry.kind] ?? eps.entry.kind}, ${eps.entry.frequency}${eps.entry.source.method ? ` — ${eps.entry.source.method}` : ''}` }
		: null;
	return { tuned, tunedMissing, epsilonInUse, measurements };
}
