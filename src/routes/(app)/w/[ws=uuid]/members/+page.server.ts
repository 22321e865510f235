import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { ROLES } from '$lib/roles';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { publicOrigin } from '$lib/server/env';
import { formFailure } from '$lib/server/http';
import { sendMail } from '$lib/server/mail';
import { listMembers } from '$lib/server/repo/workspaces';
import { createInvitation } from '$lib/server/services/accounts';
import { deliverInvitation, listInvitations, resendInvitation } from '$lib/server/services/invitations';
import { changeRole, deleteWorkspace, removeMember, renameWorkspace } from '$lib/server/services/workspaces';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, event.params.ws, 'viewer');
	const members = await listMembers(db(), event.params.ws);
	const invitations = actor.role === 'owner' ? await listInvitations(db(), event.params.ws) : [];
	const ws = await db().selectFrom('workspace').select('version').where('id', '=', event.params.ws).executeTakeFirstOrThrow();
	return { members, invitations, workspaceVersion: ws.version, me: actor.userId };
};

const inviteSchema = z.object({ email: z.email('enter a valid e-mail address'), role: z.enum(ROLES) });

export const actions: Actions = {
	invite: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			const input = inviteSchema.parse(values);
			const inv = await createInvitation(db(), actor.workspaceId, actor.userId, input.email, input.role);
			return { delivery: await deliverInvitation(db(), actor, inv, publicOrigin(), sendMail) };
		} catch (e) {
			return formFailure(e, values);
		}
	},
	/** Sends an unsent (or lost) invitation again, with a new link; the attempt and its outcome are recorded. */
	resendInvitation: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			return { delivery: await resendInvitation(db(), actor, z.uuid().parse(values.id), publicOrigin(), sendMail) };
		} catch (e) {
			return formFailure(e, values);
		}
	},
	role: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			const r = z.object({ userId: z.uuid(), role: z.enum(ROLES) }).parse(values);
			await changeRole(db(), actor, r.userId, r.role);
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: true };
	},
	remove: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await removeMember(db(), actor, z.uuid().parse(values.userId));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: true };
	},
	rename: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await renameWorkspace(db(), actor, values.name ?? '', Number(values.version));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: true };
	},
	deleteWorkspace: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'owner');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await deleteWorkspace(db(), actor, values.confirm ?? '');
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, '/workspaces');
	}
};
