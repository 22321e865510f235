import { error, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { formFailure } from '$lib/server/http';
import { studyInput } from '$lib/schemas/tuning';
import { getMolecule } from '$lib/server/services/molecules';
import { createStudy } from '$lib/server/services/tuning';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'editor');
	try {
		const m = await getMolecule(db(), event.params.ws, event.params.id);
		return { molecule: { id: m.id, name: m.name, formula: m.formula, atomCount: m.atomCount } };
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
};

export const actions: Actions = {
	create: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		let id: string;
		try {
			id = (await createStudy(db(), actor, event.params.id, studyInput.parse(values))).id;
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/w/${actor.workspaceId}/studies/${id}`);
	}
};
