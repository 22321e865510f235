import { error, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError, ValidationError } from '$lib/server/errors';
import { formFailure } from '$lib/server/http';
import { listActivity } from '$lib/server/repo/activity';
import { polymorphInput } from '$lib/schemas/polymorph';
import { deletePolymorph, getPolymorph, updatePolymorph } from '$lib/server/services/polymorphs';
import { readFormWithFile } from '$lib/server/dielectric-forms';
import { cifReplaceInput, dielectricEntryInput, epsilonChoiceInput, MAX_CIF_BYTES, MAX_TENSOR_BYTES } from '$lib/schemas/dielectric';
import { getStoredCif, replaceCellFromCif } from '$lib/server/services/cif-import';
import { addDielectricEntry, chooseEpsilon, deleteDielectricEntry, getEpsilonInUse, listDielectricEntries, STATIC_EPSILON_NOTE } from '$lib/server/services/dielectric';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	try {
		const polymorph = await getPolymorph(db(), event.params.ws, event.params.id);
		const activity = await listActivity(db(), event.params.ws, { entityIds: [polymorph.id], limit: 20 });
		// Dielectric screening section
		const [entries, epsilonInUse, cif] = await Promise.all([
			listDielectricEntries(db(), event.params.ws, polymorph.id),
			getEpsilonInUse(db(), event.params.ws, polymorph.id),
			getStoredCif(db(), event.params.ws, polymorph.id)
		]);
		return { polymorph, activity, dielectric: { entries, epsilonInUse, cif, staticNote: STATIC_EPSILON_NOTE } };
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
};

/** Form values of the add-entry forms: per-kind field names mapped to the schema's. */
function entryFromForm(v: Record<string, string>) {
	const common = { kind: v.kind, frequency: v.frequency || undefined, method: v.method, engine: v.engine, reference: v.reference, note: v.note };
	switch (v.kind) {
		case 'tensor':
			return { ...common, tensor: v.tensorText ?? '', scalar: v.scalar || undefined };
		case 'clausius_mossotti':
			return { ...common, polarizability: v.polarizability ?? '', unit: v.unit, polarizabilityUncertainty: v.polarizabilityUncertainty };
		default:
			return { ...common, ...v, kind: v.kind };
	}
}

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
	},
	// Dielectric screening section
	addEntry: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		let values: Record<string, string> = {};
		try {
			values = await readFormWithFile(event.request, 'tensorFile', 'tensorText', MAX_TENSOR_BYTES);
			values._section = `entry-${values.kind ?? ''}`;
			const entry = await addDielectricEntry(db(), actor, event.params.id, dielectricEntryInput.parse(entryFromForm(values)));
			return { added: entry.id, section: values._section };
		} catch (e) {
			values._section ??= 'entry-';
			return formFailure(e, values);
		}
	},
	deleteEntry: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		values._section = 'entries';
		try {
			if (!values.entryId) throw new ValidationError('choose the entry to delete', 'entryId');
			await deleteDielectricEntry(db(), actor, event.params.id, values.entryId, Number(values.entryVersion) || undefined);
		} catch (e) {
			return formFailure(e, values);
		}
		return { deleted: values.entryId, section: 'entries' };
	},
	chooseEpsilon: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		values._section = 'choose';
		try {
			await chooseEpsilon(db(), actor, event.params.id, epsilonChoiceInput.parse(values));
		} catch (e) {
			return formFailure(e, values);
		}
		return { chosen: values.entryId, section: 'choose' };
	},
	replaceCif: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		let values: Record<string, string> = {};
		try {
			values = await readFormWithFile(event.request, 'cifFile', 'cif', MAX_CIF_BYTES);
			values._section = 'cif';
			await replaceCellFromCif(db(), actor, event.params.id, Number(values.version), cifReplaceInput.parse(values));
		} catch (e) {
			values._section = 'cif';
			delete values.cif;
			return formFailure(e, values);
		}
		return { saved: true, section: 'cif' };
	}
};
