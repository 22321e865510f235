import { fail, redirect } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { acceptInvitation, findInvitation } from '$lib/server/services/accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals }) => {
	const inv = await findInvitation(db(), params.token);
	const usable = !!inv && !inv.accepted_at && !inv.revoked_at && new Date(inv.expires_at) > new Date();
	return {
		invitation: inv && usable ? { email: inv.email, role: inv.role, workspaceName: inv.workspace_name } : null,
		user: locals.user
	};
};

export const actions: Actions = {
	default: async ({ params, locals }) => {
		if (!locals.user) redirect(303, `/signin?redirectTo=/invite/${params.token}`);
		let workspaceId: string;
		try {
			workspaceId = await acceptInvitation(db(), params.token, locals.user.id, locals.user.email);
		} catch (e) {
			if (e instanceof ValidationError) return fail(400, { message: e.message });
			throw e;
		}
		redirect(303, `/w/${workspaceId}/molecules`);
	}
};
