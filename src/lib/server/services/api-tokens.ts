import { sql } from 'kysely';
import { randomBytes } from 'node:crypto';
import { atLeast, roleRank, type Role } from '$lib/roles';
import type { Executor } from '../db';
import { hashToken } from '../tokens';
import { findMembership } from '../repo/workspaces';
import { NotFoundError, ValidationError } from '../errors';

export const TOKEN_PREFIX = 'kl_';

export interface ApiTokenSummary {
	id: string;
	name: string;
	prefix: string;
	role: Role;
	workspaceId: string;
	workspaceName: string;
	expiresAt: Date | null;
	lastUsedAt: Date | null;
	revokedAt: Date | null;
	createdAt: Date;
}

/** Creates a token; the secret is returned once and only its hash is stored. */
export async function createApiToken(
	db: Executor,
	userId: string,
	input: { workspaceId: string; name: string; role: Role; expiresInDays: number | null }
): Promise<{ token: string; id: string }> {
	const m = await findMembership(db, input.workspaceId, userId);
	if (!m) throw new NotFoundError('workspace');
	if (!atLeast(m.role, input.role)) throw new ValidationError(`a token cannot have more rights than you: your role here is ${m.role}`, 'role');
	const name = input.name.trim();
	if (!name || name.length > 100) throw new ValidationError('a token name has 1 to 100 characters', 'name');
	if (input.expiresInDays !== null && (!Number.isInteger(input.expiresInDays) || input.expiresInDays < 1 || input.expiresInDays > 3650))
		throw new ValidationError('expiry is a whole number of days from 1 to 3650, or none', 'expiresInDays');
	const token = TOKEN_PREFIX + randomBytes(32).toString('base64url');
	const row = await db
		.insertInto('api_token')
		.values({
			user_id: userId,
			workspace_id: input.workspaceId,
			name,
			token_hash: hashToken(token),
			prefix: token.slice(0, 10),
			role: input.role,
			expires_at: input.expiresInDays === null ? null : new Date(Date.now() + input.expiresInDays * 86_400_000)
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	return { token, id: row.id };
}

export async function listApiTokens(db: Executor, userId: string): Promise<ApiTokenSummary[]> {
	const rows = await db
		.selectFrom('api_token as t')
		.innerJoin('workspace as w', 'w.id', 't.workspace_id')
		.select(['t.id', 't.name', 't.prefix', 't.role', 't.workspace_id', 'w.name as workspace_name', 't.expires_at', 't.last_used_at', 't.revoked_at', 't.created_at'])
		.where('t.user_id', '=', userId)
		.orderBy('t.created_at', 'desc')
		.execute();
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		prefix: r.prefix,
		role: r.role,
		workspaceId: r.workspace_id,
		workspaceName: r.workspace_name,
		expiresAt: r.expires_at,
		lastUsedAt: r.last_used_at,
		revokedAt: r.revoked_at,
		createdAt: r.created_at
	}));
}

export async function revokeApiToken(db: Executor, userId: string, id: string): Promise<void> {
	const r = await db.updateTable('api_token').set({ revoked_at: new Date() }).where('id', '=', id).where('user_id', '=', userId).where('revoked_at', 'is', null).executeTakeFirst();
	if (!r.numUpdatedRows) throw new NotFoundError('token');
}

export interface TokenIdentity {
	tokenId: string;
	user: { id: string; email: string; name: string | null };
	workspaceId: string;
	/** The token's role, never above the owner's current role in the workspace. */
	role: Role;
}

/** Resolves a bearer token: null when unknown, revoked, expired, or its owner left the workspace. */
export async function authenticateToken(db: Executor, token: string): Promise<TokenIdentity | null> {
	if (!token.startsWith(TOKEN_PREFIX)) return null;
	const row = await db
		.selectFrom('api_token as t')
		.innerJoin('User as u', 'u.id', 't.user_id')
		.leftJoin('membership as m', (j) => j.onRef('m.workspace_id', '=', 't.workspace_id').onRef('m.user_id', '=', 't.user_id'))
		.select(['t.id', 't.role', 't.workspace_id', 't.expires_at', 't.revoked_at', 'u.id as user_id', 'u.email', 'u.name', 'm.role as member_role'])
		.where('t.token_hash', '=', hashToken(token))
		.executeTakeFirst();
	if (!row || row.revoked_at || !row.member_role) return null;
	if (row.expires_at && new Date(row.expires_at) <= new Date()) return null;
	// "Last used" to the minute: one write per token per minute instead of a contended row update on every
	// request (measured by the load benchmark, bench/http/load.ts).
	await db
		.updateTable('api_token')
		.set({ last_used_at: new Date() })
		.where('id', '=', row.id)
		.where((eb) => eb.or([eb('last_used_at', 'is', null), eb('last_used_at', '<', sql<Date>`now() - interval '1 minute'`)]))
		.execute();
	const role = roleRank(row.role) <= roleRank(row.member_role) ? row.role : row.member_role;
	return { tokenId: row.id, user: { id: row.user_id, email: row.email, name: row.name }, workspaceId: row.workspace_id, role };
}
