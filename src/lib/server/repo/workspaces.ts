import type { Role } from '$lib/roles';
import type { Executor } from '../db';

export interface WorkspaceSummary {
	id: string;
	name: string;
	isDemo: boolean;
	role: Role;
}

export async function listWorkspacesForUser(db: Executor, userId: string): Promise<WorkspaceSummary[]> {
	const rows = await db
		.selectFrom('membership as m')
		.innerJoin('workspace as w', 'w.id', 'm.workspace_id')
		.select(['w.id', 'w.name', 'w.is_demo', 'm.role'])
		.where('m.user_id', '=', userId)
		.orderBy('w.name')
		.execute();
	return rows.map((r) => ({ id: r.id, name: r.name, isDemo: r.is_demo, role: r.role }));
}

export async function findMembership(db: Executor, workspaceId: string, userId: string) {
	return db
		.selectFrom('membership as m')
		.innerJoin('workspace as w', 'w.id', 'm.workspace_id')
		.select(['w.id', 'w.name', 'w.is_demo', 'w.version', 'm.role'])
		.where('m.workspace_id', '=', workspaceId)
		.where('m.user_id', '=', userId)
		.executeTakeFirst();
}

export async function createWorkspace(db: Executor, name: string, ownerId: string, isDemo = false): Promise<string> {
	const ws = await db.insertInto('workspace').values({ name, is_demo: isDemo }).returning('id').executeTakeFirstOrThrow();
	await db.insertInto('membership').values({ workspace_id: ws.id, user_id: ownerId, role: 'owner' }).execute();
	return ws.id;
}

export async function listMembers(db: Executor, workspaceId: string) {
	return db
		.selectFrom('membership as m')
		.innerJoin('User as u', 'u.id', 'm.user_id')
		.select(['u.id', 'u.email', 'u.name', 'm.role', 'm.created_at'])
		.where('m.workspace_id', '=', workspaceId)
		.orderBy('u.email')
		.execute();
}

export async function countOwners(db: Executor, workspaceId: string): Promise<number> {
	const r = await db
		.selectFrom('membership')
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.where('workspace_id', '=', workspaceId)
		.where('role', '=', 'owner')
		.executeTakeFirstOrThrow();
	return Number(r.n);
}
