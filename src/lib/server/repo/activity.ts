import type { Executor } from '../db';

export interface ActivityInput {
	workspaceId: string;
	actorId: string | null;
	entityType: 'molecule' | 'polymorph' | 'workspace' | 'membership' | 'invitation' | 'tuning_study' | 'scan_point';
	entityId: string;
	action:
		| 'create' | 'update' | 'delete' | 'invite' | 'join' | 'role' | 'remove' | 'rename'
		| 'cif_import' | 'cif_replace' | 'dielectric_add' | 'dielectric_delete' | 'choose_epsilon'
		| 'import' | 'exclude' | 'include' | 'mark-current' | 'save-result' | 'restore';
	summary: string;
	before?: unknown;
	after?: unknown;
}

export async function logActivity(db: Executor, a: ActivityInput): Promise<void> {
	await db
		.insertInto('activity')
		.values({
			workspace_id: a.workspaceId,
			actor_id: a.actorId,
			entity_type: a.entityType,
			entity_id: a.entityId,
			action: a.action,
			summary: a.summary,
			before: a.before === undefined ? null : JSON.stringify(a.before),
			after: a.after === undefined ? null : JSON.stringify(a.after)
		})
		.execute();
}

export interface ActivityEntry {
	id: string;
	entityType: string;
	entityId: string;
	action: string;
	summary: string;
	before: unknown;
	after: unknown;
	actor: string | null;
	at: Date;
}

export async function listActivity(
	db: Executor,
	workspaceId: string,
	opts: { entityIds?: string[]; limit?: number; before?: string } = {}
): Promise<ActivityEntry[]> {
	const rows = await db
		.selectFrom('activity as a')
		.leftJoin('User as u', 'u.id', 'a.actor_id')
		.select(['a.id', 'a.entity_type', 'a.entity_id', 'a.action', 'a.summary', 'a.before', 'a.after', 'a.created_at', 'u.email'])
		.where('a.workspace_id', '=', workspaceId)
		.$if(!!opts.entityIds?.length, (q) => q.where('a.entity_id', 'in', opts.entityIds!))
		.$if(!!opts.before, (q) => q.where('a.id', '<', opts.before!))
		.orderBy('a.id', 'desc')
		.limit(opts.limit ?? 50)
		.execute();
	return rows.map((r) => ({
		id: String(r.id),
		entityType: r.entity_type,
		entityId: r.entity_id,
		action: r.action,
		summary: r.summary,
		before: r.before,
		after: r.after,
		actor: r.email,
		at: r.created_at
	}));
}
