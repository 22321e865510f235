import { error, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { readMoleculeForm } from '$lib/server/forms';
import { formFailure } from '$lib/server/http';
import { listActivity } from '$lib/server/repo/activity';
import { moleculeInput } from '$lib/schemas/molecule';
import { polymorphInput } from '$lib/schemas/polymorph';
import { deleteMolecule, getMolecule, updateMolecule } from '$lib/server/services/molecules';
import { createPolymorph, listPolymorphs } from '$lib/server/services/polymorphs';
import { readFormWithFile } from '$lib/server/dielectric-forms';
import { cifImportInput, MAX_CIF_BYTES } from '$lib/schemas/dielectric';
import { importPolymorphFromCif } from '$lib/server/services/cif-import';
import { epsilonInUseByPolymorph } from '$lib/server/services/dielectric';
import { listStudies } from '$lib/server/services/tuning';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	let molecule;
	try {
		molecule = await getMolecule(db(), event.params.ws, event.params.id);
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
	const polymorphs = await listPolymorphs(db(), event.params.ws, { moleculeId: molecule.id });
	const tuningStudies = await listStudies(db(), event.params.ws, { moleculeId: molecule.id });
	const activity = await listActivity(db(), event.params.ws, { entityIds: [molecule.id, ...polymorphs.map((p) => p.id)], limit: 20 });
	const epsilonInUse = await epsilonInUseByPolymorph(db(), event.params.ws, polymorphs.map((p) => p.id));
	return { molecule, polymorphs, activity, epsilonInUse, tuningStudies };
};

export const actions: Actions = {
	update: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		let values: Record<string, string> = {};
		try {
			values = await readMoleculeForm(event.request);
			await updateMolecule(db(), actor, event.params.id, Number(values.version), moleculeInput.parse(values));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: true };
	},
	delete: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await deleteMolecule(db(), actor, event.params.id, Number(values.version));
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/w/${actor.workspaceId}/molecules`);
	},
	addPolymorph: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		let id: string;
		try {
			id = (await createPolymorph(db(), actor, event.params.id, polymorphInput.parse(values))).id;
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/w/${actor.workspaceId}/polymorphs/${id}`);
	},
	importCif: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		let values: Record<string, string> = {};
		let id: string;
		try {
			values = await readFormWithFile(event.request, 'cifFile', 'cif', MAX_CIF_BYTES);
			id = (await importPolymorphFromCif(db(), actor, cifImportInput.parse({ ...values, moleculeId: event.params.id }))).polymorph.id;
		} catch (e) {
			const { cif: _cif, ...rest } = values;
			return formFailure(e, { ...rest, _section: 'cif' });
		}
		redirect(303, `/w/${actor.workspaceId}/polymorphs/${id}`);
	}
};
