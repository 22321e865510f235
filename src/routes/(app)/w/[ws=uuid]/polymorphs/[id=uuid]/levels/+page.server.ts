import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { formFailure } from '$lib/server/http';
import { measurementInput } from '$lib/schemas/measurement';
import { levelsContext } from '$lib/server/services/levels';
import { addMeasurement, deleteMeasurement } from '$lib/server/services/measurements';
import { listBundles } from '$lib/server/services/bundles';
import { getPolymorph } from '$lib/server/services/polymorphs';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	let polymorph;
	try {
		polymorph = await getPolymorph(db(), event.params.ws, event.params.id);
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
	const context = await levelsContext(db(), event.params.ws, polymorph.id, polymorph.moleculeId);
	const bundles = await listBundles(db(), event.params.ws, { polymorphId: polymorph.id });
	return { polymorph, ...context, bundles };
};

export const actions: Actions = {
	addMeasurement: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await addMeasurement(db(), actor, event.params.id, measurementInput.parse(values));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: 'measurement' };
	},
	deleteMeasurement: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await deleteMeasurement(db(), actor, event.params.id, z.uuid().parse(values.id));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: 'deleted' };
	}
};
