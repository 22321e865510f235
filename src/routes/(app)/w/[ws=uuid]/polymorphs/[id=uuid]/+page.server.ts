import { error, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { formFailure } from '$lib/server/http';
import { listActivity } from '$lib/server/repo/activity';
import { polymorphInput } from '$lib/schemas/polymorph';
import { deletePolymorph, getPolymorph, updatePolymorph } from '$lib/server/services/polymorphs';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	try {
		const polymorph = await getPolymorph(db(), event.params.ws, event.params.id);
		const activity = await listActivity(db(), event.params.ws, { entityIds: [polymorph.id], limit: 20 });
		return { polymorph, activity };
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
};

export const actions: Actions = {
	update: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await updatePolymorph(db(), actor, event.params.id, Number(values.version), polymorphInput.parse(values));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: true };
	},
	delete: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		let moleculeId: string;
		try {
			moleculeId = (await getPolymorph(db(), actor.workspaceId, event.params.id)).moleculeId;
			await deletePolymorph(db(), actor, event.params.id, Number(values.version));
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/w/${actor.workspaceId}/molecules/${moleculeId}`);
	}
};
