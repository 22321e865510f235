import { redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { readMoleculeForm } from '$lib/server/forms';
import { formFailure } from '$lib/server/http';
import { moleculeInput } from '$lib/schemas/molecule';
import { createMolecule } from '$lib/server/services/molecules';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'editor');
	return {};
};

export const actions: Actions = {
	create: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		let values: Record<string, string> = {};
		let id: string;
		try {
			values = await readMoleculeForm(event.request);
			id = (await createMolecule(db(), actor, moleculeInput.parse(values))).id;
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/w/${actor.workspaceId}/molecules/${id}`);
	}
};
