import type { Role } from '$lib/roles';
import type { Executor } from '../db';
import { NotFoundError, ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import { newToken } from '../tokens';
import type { Actor } from './actor';
import { inTransaction } from '../db/transaction';
import { INVITE_DAYS } from './accounts';

/** Sends one message; the route passes the SMTP sender, tests a fake. */
export type MailSender = (to: string, subject: string, text: string) => Promise<void>;

export interface InvitationSummary {
	id: string;
	email: string;
	role: Role;
	expiresAt: Date;
	acceptedAt: Date | null;
	sentAt: Date | null;
	createdAt: Date;
	sendAttempts: number;
	lastAttemptAt: Date | null;
	lastSendError: string | null;
	state: 'accepted' | 'expired' | 'sent' | 'unsent';
}

export interface DeliveryOutcome {
	email: string;
	sent: boolean;
	/** The link, returned so the owner can pass it on by hand when the e-mail failed. */
	link: string;
	error: string | null;
	attempts: number;
}

function invitationText(workspaceName: string, role: Role, link: string): string {
	return `You have been invited to the Kappaline workspace "${workspaceName}" as ${role}.\n\nAccept within ${INVITE_DAYS} days (single use):\n\n${link}\n`;
}

/**
 * Tries to e-mail an invitation link and records the attempt (count, time, error or sent time) on the
 * invitation and in the activity log. A failed send keeps the invitation stored, marked unsent.
 */
export async function deliverInvitation(
	db: Executor,
	actor: Actor & { workspaceName: string },
	inv: { id: string; email: string; role: Role; token: string },
	origin: string,
	send: MailSender
): Promise<DeliveryOutcome> {
	const link = `${origin}/invite/${inv.token}`;
	let error: string | null = null;
	try {
		await send(inv.email, `You are invited to ${actor.workspaceName} on Kappaline`, invitationText(actor.workspaceName, inv.role, link));
	} catch (e) {
		error = (e instanceof Error ? e.message : String(e)).slice(0, 300) || 'unknown mail error';
	}
	const now = new Date();
	const row = await inTransaction(db, async (tx) => {
		const r = await tx
			.updateTable('invitation')
			.set((eb) => ({ send_attempts: eb('send_attempts', '+', 1), last_attempt_at: now, last_send_error: error, ...(error ? {} : { sent_at: now }) }))
			.where('id', '=', inv.id)
			.returning('send_attempts')
			.executeTakeFirstOrThrow();
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'invitation',
			entityId: inv.id,
			action: 'invite',
			summary: error ? `invitation e-mail to ${inv.email} not sent (attempt ${r.send_attempts}): ${error}` : `invitation e-mail sent to ${inv.email} (attempt ${r.send_attempts})`
		});
		return r;
	});
	return { email: inv.email, sent: !error, link, error, attempts: row.send_attempts };
}

/**
 * Sends an open invitation again. Only a hash of the link's token is stored, so a resend makes a new
 * link (and a fresh expiry); links sent or shown earlier for this invitation stop working.
 */
export async function resendInvitation(db: Executor, actor: Actor & { workspaceName: string }, id: string, origin: string, send: MailSender): Promise<DeliveryOutcome> {
	const { token, hash } = newToken();
	const inv = await inTransaction(db, async (tx) => {
		const row = await tx
			.selectFrom('invitation')
			.select(['id', 'email', 'role', 'accepted_at', 'revoked_at'])
			.where('workspace_id', '=', actor.workspaceId)
			.where('id', '=', id)
			.forUpdate()
			.executeTakeFirst();
		if (!row || row.revoked_at) throw new NotFoundError('invitation');
		if (row.accepted_at) throw new ValidationError(`${row.email} has already accepted this invitation`, 'id');
		await tx
			.updateTable('invitation')
			.set({ token_hash: hash, expires_at: new Date(Date.now() + INVITE_DAYS * 86_400_000) })
			.where('id', '=', id)
			.execute();
		return row;
	});
	return deliverInvitation(db, actor, { id: inv.id, email: inv.email, role: inv.role, token }, origin, send);
}

export async function listInvitations(db: Executor, workspaceId: string, limit = 50): Promise<InvitationSummary[]> {
	const rows = await db
		.selectFrom('invitation')
		.select(['id', 'email', 'role', 'expires_at', 'accepted_at', 'sent_at', 'created_at', 'send_attempts', 'last_attempt_at', 'last_send_error'])
		.where('workspace_id', '=', workspaceId)
		.where('revoked_at', 'is', null)
		.orderBy('created_at', 'desc')
		.limit(limit)
		.execute();
	const now = Date.now();
	return rows.map((r) => ({
		id: r.id,
		email: r.email,
		role: r.role,
		expiresAt: r.expires_at,
		acceptedAt: r.accepted_at,
		sentAt: r.sent_at,
		createdAt: r.created_at,
		sendAttempts: r.send_attempts,
		lastAttemptAt: r.last_attempt_at,
		lastSendError: r.last_send_error,
		state: r.accepted_at ? 'accepted' : r.expires_at.getTime() < now ? 'expired' : r.sent_at && !r.last_send_error ? 'sent' : 'unsent'
	}));
}
