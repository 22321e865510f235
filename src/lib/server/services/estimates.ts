import type { SolidStateEstimate } from '$lib/science/screening';
import type { Executor } from '../db';
import { ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import type { Actor } from './actor';
import { polymorphLevels, type LevelsOptions } from './levels-api';

/** Bumped when the estimate's formulas change, so estimates stored by older code show as stale. */
export const ESTIMATE_VERSION = 'solid-state-estimate/1';

interface Sources {
	studyId: string;
	studyResultHash: string | null;
	epsilon: number;
	epsilonEntryId: string | null;
	volumePerMoleculeA3: number;
	codeVersion: string;
}

export interface StoredEstimate {
	id: string;
	label: string;
	options: LevelsOptions;
	sources: Sources;
	result: SolidStateEstimate;
	createdAt: Date;
	createdBy: string | null;
	/** Why the stored numbers no longer match their sources (empty when current). */
	staleReasons: string[];
	/** The estimate recomputed from today's sources, when they can still be read. */
	current: SolidStateEstimate | null;
}

async function compute(db: Executor, workspaceId: string, polymorphId: string, options: LevelsOptions) {
	const r = await polymorphLevels(db, workspaceId, polymorphId, options);
	const study = await db.selectFrom('tuning_study').select('result_input_hash').where('id', '=', r.tuned.studyId).executeTakeFirst();
	const sources: Sources = {
		studyId: r.tuned.studyId,
		studyResultHash: study?.result_input_hash ?? null,
		epsilon: r.input.epsilon,
		epsilonEntryId: options.epsilon === undefined ? (r.epsilonInUse?.entryId ?? null) : null,
		volumePerMoleculeA3: r.volumePerMoleculeA3,
		codeVersion: ESTIMATE_VERSION
	};
	return { estimate: r.estimate, sources };
}

function staleReasons(then: Sources, now: Sources | null, error: string | null): string[] {
	if (!now) return [`its sources can no longer be read: ${error}`];
	const r: string[] = [];
	if (then.studyId !== now.studyId) r.push('another tuning study is now current');
	else if (then.studyResultHash !== now.studyResultHash) r.push("the tuning study's saved analysis changed");
	if (then.epsilonEntryId !== now.epsilonEntryId) r.push('another epsilon is now in use');
	else if (then.epsilon !== now.epsilon) r.push('the epsilon in use changed');
	if (Math.abs(then.volumePerMoleculeA3 - now.volumePerMoleculeA3) > 1e-9) r.push('the cell (V/Z) changed');
	if (then.codeVersion !== now.codeVersion) r.push(`computed by ${then.codeVersion}, now ${now.codeVersion}`);
	return r;
}

export async function saveEstimate(db: Executor, actor: Actor, polymorphId: string, label: string, options: LevelsOptions): Promise<StoredEstimate> {
	const clean = label.trim() || 'estimate';
	if (clean.length > 200) throw new ValidationError('a label has at most 200 characters', 'label');
	const { estimate, sources } = await compute(db, actor.workspaceId, polymorphId, options);
	const row = await db
		.insertInto('solid_estimate')
		.values({ workspace_id: actor.workspaceId, polymorph_id: polymorphId, label: clean, options: JSON.stringify(options), sources: JSON.stringify(sources), result: JSON.stringify(estimate), created_by: actor.userId })
		.returning(['id', 'created_at'])
		.executeTakeFirstOrThrow();
	await logActivity(db, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'polymorph', entityId: polymorphId, action: 'update', summary: `saved the solid-state estimate “${clean}” (ε = ${sources.epsilon}, gap ${estimate.gapSolidEv.toFixed(2)} eV)` });
	return { id: row.id, label: clean, options, sources, result: estimate, createdAt: row.created_at, createdBy: null, staleReasons: [], current: estimate };
}

/** Stored estimates, each checked against today's sources and flagged stale with the reasons. */
export async function listEstimates(db: Executor, workspaceId: string, polymorphId: string): Promise<StoredEstimate[]> {
	const rows = await db
		.selectFrom('solid_estimate as e')
		.leftJoin('User as u', 'u.id', 'e.created_by')
		.selectAll('e')
		.select('u.email')
		.where('e.workspace_id', '=', workspaceId)
		.where('e.polymorph_id', '=', polymorphId)
		.orderBy('e.created_at', 'desc')
		.execute();
	const out: StoredEstimate[] = [];
	for (const r of rows) {
		const options = r.options as LevelsOptions;
		const then = r.sources as Sources;
		let now: Awaited<ReturnType<typeof compute>> | null = null;
		let error: string | null = null;
		try {
			now = await compute(db, workspaceId, polymorphId, options);
		} catch (e) {
			if (!(e instanceof ValidationError)) throw e;
			error = e.message;
		}
		out.push({ id: r.id, label: r.label, options, sources: then, result: r.result as SolidStateEstimate, createdAt: r.created_at, createdBy: r.email, staleReasons: staleReasons(then, now?.sources ?? null, error), current: now?.estimate ?? null });
	}
	return out;
}
