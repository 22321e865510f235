import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { atLeast, type Role } from '$lib/roles';
import { db } from './db';
import { findMembership } from './repo/workspaces';
import type { Actor } from './services/actor';

export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
}

/** The signed-in user, or a redirect to sign-in (pages) / 401 (API). */
export function requireUser(event: RequestEvent): SessionUser {
	const user = event.locals.user;
	if (user) return user;
	if (event.url.pathname.startsWith('/api/')) error(401, 'sign in, or send a valid token');
	redirect(303, `/signin?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`);
}

/**
 * Membership and role check used by every protected load, action and API handler.
 * Non-members get 404 (a workspace's records are invisible to outsiders); members below the
 * needed role get 403.
 */
export async function requireRole(event: RequestEvent, workspaceId: string, need: Role): Promise<Actor & { workspaceName: string; isDemo: boolean }> {
	const user = requireUser(event);
	const token = event.locals.token;
	if (token && token.workspaceId !== workspaceId) error(404, 'Not found');
	const m = await findMembership(db(), workspaceId, user.id);
	if (!m) error(404, 'Not found');
	if (token && !atLeast(token.role, need)) error(403, `this needs the ${need} role; the token has the ${token.role} role`);
	if (!atLeast(m.role, need)) error(403, `this needs the ${need} role; you are ${m.role === 'viewer' ? 'a viewer' : `an ${m.role}`} in this workspace`);
	return { userId: user.id, workspaceId, role: token?.role ?? m.role, workspaceName: m.name, isDemo: m.is_demo };
}
