import { sql } from 'kysely';
import type { Role } from '$lib/roles';
import type { Executor } from '../db';
import { hashPassword, verifyPassword } from '../passwords';
import { hashToken, newToken } from '../tokens';
import { createWorkspace } from '../repo/workspaces';
import { logActivity } from '../repo/activity';
import { ValidationError } from '../errors';
import { inTransaction } from '../db/transaction';

export const normaliseEmail = (e: string): string => e.trim().toLowerCase();

export async function findUserByEmail(db: Executor, email: string) {
	return db.selectFrom('User').selectAll().where('email', '=', normaliseEmail(email)).executeTakeFirst();
}

/** Creates the user, the password credential and a personal workspace, in one transaction. */
export async function signUp(db: Executor, input: { email: string; password: string; name: string }): Promise<{ userId: string; workspaceId: string }> {
	const email = normaliseEmail(input.email);
	const hash = await hashPassword(input.password);
	return inTransaction(db, async (tx) => {
		const existing = await tx.selectFrom('User').select(['id']).where('email', '=', email).executeTakeFirst();
		if (existing) {
			const cred = await tx.selectFrom('password_credential').select('user_id').where('user_id', '=', existing.id).executeTakeFirst();
			if (cred) throw new ValidationError('an account with this e-mail already exists: sign in, or reset the password', 'email');
			// A user first seen through an e-mail link sets a password now.
			await tx.insertInto('password_credential').values({ user_id: existing.id, hash }).execute();
			const ws = await ensurePersonalWorkspace(tx, existing.id, input.name || email);
			return { userId: existing.id, workspaceId: ws };
		}
		const u = await tx.insertInto('User').values({ email, name: input.name || null }).returning('id').executeTakeFirstOrThrow();
		await tx.insertInto('password_credential').values({ user_id: u.id, hash }).execute();
		const workspaceId = await createWorkspace(tx, `${input.name || email}'s workspace`, u.id);
		return { userId: u.id, workspaceId };
	});
}

/** Every user has at least one workspace; users created through an e-mail link get theirs here. */
export async function ensurePersonalWorkspace(db: Executor, userId: string, label: string): Promise<string> {
	const m = await db.selectFrom('membership').select('workspace_id').where('user_id', '=', userId).executeTakeFirst();
	if (m) return m.workspace_id;
	return createWorkspace(db, `${label}'s workspace`, userId);
}

export async function checkPassword(db: Executor, email: string, password: string) {
	const row = await db
		.selectFrom('User as u')
		.innerJoin('password_credential as p', 'p.user_id', 'u.id')
		.select(['u.id', 'u.email', 'u.name', 'p.hash'])
		.where('u.email', '=', normaliseEmail(email))
		.executeTakeFirst();
	if (!row) {
		// Spend comparable time so response timing does not reveal which e-mails exist.
		await hashPassword(password);
		return null;
	}
	return (await verifyPassword(row.hash, password)) ? { id: row.id, email: row.email, name: row.name } : null;
}

const RESET_MINUTES = 30;

/** Returns a reset token when the account exists (the caller mails it), or null. */
export async function createPasswordReset(db: Executor, email: string): Promise<{ token: string; email: string } | null> {
	const user = await findUserByEmail(db, email);
	if (!user) return null;
	const { token, hash } = newToken();
	await db
		.insertInto('password_reset')
		.values({ token_hash: hash, user_id: user.id, expires_at: new Date(Date.now() + RESET_MINUTES * 60_000) })
		.execute();
	return { token, email: user.email };
}

export async function resetPassword(db: Executor, token: string, password: string): Promise<string> {
	const hash = await hashPassword(password);
	return inTransaction(db, async (tx) => {
		const row = await tx
			.updateTable('password_reset')
			.set({ used_at: new Date() })
			.where('token_hash', '=', hashToken(token))
			.where('used_at', 'is', null)
			.where('expires_at', '>', new Date())
			.returning('user_id')
			.executeTakeFirst();
		if (!row) throw new ValidationError('this reset link is invalid, already used or expired: ask for a new one', 'token');
		await tx
			.insertInto('password_credential')
			.values({ user_id: row.user_id, hash })
			.onConflict((oc) => oc.column('user_id').doUpdateSet({ hash, updated_at: sql`now()` }))
			.execute();
		await tx.updateTable('User').set({ emailVerified: new Date() }).where('id', '=', row.user_id).execute();
		return row.user_id;
	});
}

/** Days an invitation link stays valid (from its creation or its last resend). */
export const INVITE_DAYS = 7;

export async function createInvitation(db: Executor, workspaceId: string, invitedBy: string, email: string, role: Role) {
	const { token, hash } = newToken();
	const inv = await inTransaction(db, async (tx) => {
		const row = await tx
			.insertInto('invitation')
			.values({ workspace_id: workspaceId, email: normaliseEmail(email), role, token_hash: hash, expires_at: new Date(Date.now() + INVITE_DAYS * 86_400_000), invited_by: invitedBy })
			.returning(['id', 'email', 'role', 'expires_at'])
			.executeTakeFirstOrThrow();
		await logActivity(tx, { workspaceId, actorId: invitedBy, entityType: 'invitation', entityId: row.id, action: 'invite', summary: `invited ${row.email} as ${role}` });
		return row;
	});
	return { ...inv, token };
}

export async function findInvitation(db: Executor, token: string) {
	return db
		.selectFrom('invitation as i')
		.innerJoin('workspace as w', 'w.id', 'i.workspace_id')
		.select(['i.id', 'i.email', 'i.role', 'i.expires_at', 'i.accepted_at', 'i.revoked_at', 'w.name as workspace_name', 'w.id as workspace_id'])
		.where('i.token_hash', '=', hashToken(token))
		.executeTakeFirst();
}

/** Single use: the first accept wins; the invitee joins with the invited role (never lowering an existing one). */
export async function acceptInvitation(db: Executor, token: string, userId: string, userEmail: string): Promise<string> {
	return inTransaction(db, async (tx) => {
		const inv = await tx
			.updateTable('invitation')
			.set({ accepted_at: new Date(), accepted_by: userId })
			.where('token_hash', '=', hashToken(token))
			.where('accepted_at', 'is', null)
			.where('revoked_at', 'is', null)
			.where('expires_at', '>', new Date())
			.returning(['workspace_id', 'role', 'email', 'id'])
			.executeTakeFirst();
		if (!inv) throw new ValidationError('this invitation is invalid, already used, revoked or expired: ask the workspace owner for a new one', 'token');
		if (inv.email !== normaliseEmail(userEmail))
			throw new ValidationError(`this invitation was sent to ${inv.email}; you are signed in as ${userEmail}`, 'token');
		const existing = await tx.selectFrom('membership').select('role').where('workspace_id', '=', inv.workspace_id).where('user_id', '=', userId).executeTakeFirst();
		if (!existing) await tx.insertInto('membership').values({ workspace_id: inv.workspace_id, user_id: userId, role: inv.role }).execute();
		await logActivity(tx, { workspaceId: inv.workspace_id, actorId: userId, entityType: 'membership', entityId: inv.id, action: 'join', summary: `${inv.email} joined as ${existing?.role ?? inv.role}` });
		return inv.workspace_id;
	});
}
