import type { Role } from '$lib/roles';
import type { Executor } from '../db';
import { logActivity } from '../repo/activity';
import { countOwners } from '../repo/workspaces';
import { NotFoundError, StaleVersionError, ValidationError } from '../errors';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';

export async function changeRole(db: Executor, actor: Actor, userId: string, role: Role): Promise<void> {
	await inTransaction(db, async (tx) => {
		const m = await tx.selectFrom('membership').select('role').where('workspace_id', '=', actor.workspaceId).where('user_id', '=', userId).forUpdate().executeTakeFirst();
		if (!m) throw new NotFoundError('member');
		if (m.role === 'owner' && role !== 'owner' && (await countOwners(tx, actor.workspaceId)) <= 1)
			throw new ValidationError('a workspace needs at least one owner: make someone else owner first', 'role');
		await tx.updateTable('membership').set({ role }).where('workspace_id', '=', actor.workspaceId).where('user_id', '=', userId).execute();
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'membership', entityId: userId, action: 'role', summary: `changed a member's role from ${m.role} to ${role}`, before: { role: m.role }, after: { role } });
	});
}

export async function removeMember(db: Executor, actor: Actor, userId: string): Promise<void> {
	await inTransaction(db, async (tx) => {
		const m = await tx.selectFrom('membership').select('role').where('workspace_id', '=', actor.workspaceId).where('user_id', '=', userId).forUpdate().executeTakeFirst();
		if (!m) throw new NotFoundError('member');
		if (m.role === 'owner' && (await countOwners(tx, actor.workspaceId)) <= 1) throw new ValidationError('the last owner cannot be removed', 'userId');
		await tx.deleteFrom('membership').where('workspace_id', '=', actor.workspaceId).where('user_id', '=', userId).execute();
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'membership', entityId: userId, action: 'remove', summary: `removed a member (${m.role})` });
	});
}

export async function renameWorkspace(db: Executor, actor: Actor, name: string, expectedVersion: number): Promise<void> {
	const clean = name.trim();
	if (!clean || clean.length > 120) throw new ValidationError('a workspace name has 1 to 120 characters', 'name');
	await inTransaction(db, async (tx) => {
		const w = await tx.selectFrom('workspace').select(['name', 'version']).where('id', '=', actor.workspaceId).forUpdate().executeTakeFirst();
		if (!w) throw new NotFoundError('workspace');
		if (w.version !== expectedVersion) throw new StaleVersionError('workspace');
		await tx.updateTable('workspace').set({ name: clean, version: w.version + 1 }).where('id', '=', actor.workspaceId).execute();
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, entityType: 'workspace', entityId: actor.workspaceId, action: 'rename', summary: `renamed the workspace to ${clean}`, before: { name: w.name }, after: { name: clean } });
	});
}

/** Deletes the workspace and everything in it; the caller must have confirmed by typing its name. */
export async function deleteWorkspace(db: Executor, actor: Actor, confirmName: string): Promise<void> {
	await inTransaction(db, async (tx) => {
		const w = await tx.selectFrom('workspace').select('name').where('id', '=', actor.workspaceId).forUpdate().executeTakeFirst();
		if (!w) throw new NotFoundError('workspace');
		if (w.name !== confirmName.trim()) throw new ValidationError(`type the workspace's name (${w.name}) to confirm`, 'confirm');
		// Explicit, typed-name confirmed and owner-only: the one delete that does not go to the trash (the
		// trash is the workspace's own). Children first: polymorphs and studies block their molecule's delete.
		await tx.deleteFrom('polymorph').where('workspace_id', '=', actor.workspaceId).execute();
		await tx.deleteFrom('tuning_study').where('workspace_id', '=', actor.workspaceId).execute();
		await tx.deleteFrom('molecule').where('workspace_id', '=', actor.workspaceId).execute();
		await tx.deleteFrom('workspace').where('id', '=', actor.workspaceId).execute();
	});
}
