import { epsilonSweep, solidStateEstimate, ScreeningError } from '$lib/science/screening';
import type { Executor } from '../db';
import { ValidationError } from '../errors';
import { levelsContext } from './levels';
import { getPolymorph } from './polymorphs';

export interface LevelsOptions {
	/** Override of the polymorph's epsilon in use. */
	epsilon?: number;
	radiusA?: number;
	substrate?: { distanceA: number; epsilon: number | 'metal' } | null;
}

/**
 * The solid-state estimate of a polymorph from its molecule's current tuned study and its epsilon in use
 * (or an override), computed on request with the same pure routine the page uses.
 */
export async function polymorphLevels(db: Executor, workspaceId: string, polymorphId: string, opts: LevelsOptions = {}) {
	const p = await getPolymorph(db, workspaceId, polymorphId);
	const ctx = await levelsContext(db, workspaceId, p.id, p.moleculeId);
	if (!ctx.tuned) throw new ValidationError(`no tuned gas-phase parameters for ${p.moleculeName}: ${ctx.tunedMissing}`, 'study');
	const epsilon = opts.epsilon ?? ctx.epsilonInUse?.epsilon;
	if (epsilon === undefined) throw new ValidationError(`polymorph ${p.label} has no epsilon in use: choose one, or pass ?epsilon=`, 'epsilon');
	const input = {
		alpha: ctx.tuned.alpha,
		gammaBohrInv: ctx.tuned.gammaBohrInv,
		ipGasEv: ctx.tuned.ipEv,
		eaGasEv: ctx.tuned.eaEv,
		epsilon,
		cavity: opts.radiusA !== undefined ? { radiusA: opts.radiusA } : { volumePerMoleculeA3: p.derived.volumePerMoleculeA3 },
		substrate: opts.substrate ?? null
	};
	try {
		return {
			polymorphId: p.id,
			volumePerMoleculeA3: p.derived.volumePerMoleculeA3,
			tuned: ctx.tuned,
			epsilonSource: opts.epsilon !== undefined ? 'override' : 'epsilon in use',
			epsilonInUse: ctx.epsilonInUse,
			estimate: solidStateEstimate(input),
			input
		};
	} catch (e) {
		if (e instanceof ScreeningError) throw new ValidationError(e.message, (e as { field?: string }).field);
		throw e;
	}
}

export async function polymorphSweep(db: Executor, workspaceId: string, polymorphId: string, epsilons: number[] | { from: number; to: number; step: number }, opts: Omit<LevelsOptions, 'epsilon'> = {}) {
	const base = await polymorphLevels(db, workspaceId, polymorphId, { ...opts, epsilon: 1 });
	try {
		return {
			polymorphId,
			tuned: base.tuned,
			...epsilonSweep({
				alpha: base.tuned.alpha,
				ipGasEv: base.tuned.ipEv,
				eaGasEv: base.tuned.eaEv,
				radiusA: base.estimate.radiusA,
				epsilons,
				imageCharge: opts.substrate ? { distanceA: opts.substrate.distanceA, substrateEpsilon: opts.substrate.epsilon } : null
			})
		};
	} catch (e) {
		if (e instanceof ScreeningError) throw new ValidationError(e.message, (e as { field?: string }).field);
		throw e;
	}
}
