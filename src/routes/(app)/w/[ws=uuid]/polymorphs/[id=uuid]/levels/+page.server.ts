import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError } from '$lib/server/errors';
import { formFailure, MAX_UPLOAD_BYTES } from '$lib/server/http';
import { measurementInput } from '$lib/schemas/measurement';
import { levelsContext } from '$lib/server/services/levels';
import { addMeasurement, deleteMeasurement } from '$lib/server/services/measurements';
import { listBundles } from '$lib/server/services/bundles';
import { listEstimates, saveEstimate } from '$lib/server/services/estimates';
import { levelsQuery, substrateOf } from '$lib/schemas/levels';
import { addReruns, deleteRerun, ingestReruns, listReruns } from '$lib/server/services/reruns';
import { HARTREE_EV } from '$lib/science/units';
import { ValidationError } from '$lib/server/errors';
import { getPolymorph } from '$lib/server/services/polymorphs';
import type { Actions, PageServerLoad } from './$types';

const num = (name: string) => z.coerce.number({ error: `${name} must be a number` });
const rerunForm = z.object({
	epsilon: num('epsilon').min(1, 'epsilon must be >= 1'),
	alpha: num('alpha').min(0).max(1),
	gammaBohrInv: num('gamma').gt(0, 'gamma must be > 0'),
	homo: num('eps_HOMO'),
	lumo: z.preprocess((v) => (v === '' || v == null ? undefined : v), num('eps_LUMO').optional()),
	unit: z.enum(['eV', 'hartree'])
});

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
	const [bundles, reruns, estimates] = await Promise.all([listBundles(db(), event.params.ws, { polymorphId: polymorph.id }), listReruns(db(), event.params.ws, polymorph.id), listEstimates(db(), event.params.ws, polymorph.id)]);
	return { polymorph, ...context, bundles, reruns, estimates };
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
	saveEstimate: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			const q = levelsQuery.parse({ epsilon: values.epsilon, radius: values.radius, substrateEpsilon: values.substrateEpsilon || undefined, distance: values.substrateEpsilon ? values.distance : undefined });
			await saveEstimate(db(), actor, event.params.id, values.label ?? '', { epsilon: q.epsilon, radiusA: q.radius, substrate: substrateOf(q) });
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: 'estimate' };
	},
	addRerun: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			const r = rerunForm.parse(values);
			const toHa = (x: number) => (r.unit === 'eV' ? x / HARTREE_EV : x);
			await addReruns(db(), actor, event.params.id, [{ epsilon: r.epsilon, alpha: r.alpha, gammaBohrInv: r.gammaBohrInv, homoHartree: toHa(r.homo), lumoHartree: r.lumo === undefined ? null : toHa(r.lumo) }], 'typed');
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: 'rerun' };
	},
	uploadOutputs: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const form = await event.request.formData();
		const file = form.get('outputs');
		try {
			if (!(file instanceof File) || file.size === 0) throw new ValidationError('choose an NWChem output (.out) or a bundle zip with the outputs beside the decks', 'outputs');
			if (file.size > MAX_UPLOAD_BYTES) throw new ValidationError(`the upload is ${(file.size / 1e6).toFixed(1)} MB, over the limit of ${MAX_UPLOAD_BYTES / 1e6} MB`, 'outputs');
			const r = await ingestReruns(db(), actor, event.params.id, file.name, new Uint8Array(await file.arrayBuffer()));
			return { saved: 'outputs', stored: r.stored.length, problems: r.problems.map((p) => `${p.file}: ${p.message}`) };
		} catch (e) {
			return formFailure(e, {});
		}
	},
	deleteRerun: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await deleteRerun(db(), actor, event.params.id, z.uuid().parse(values.id));
		} catch (e) {
			return formFailure(e, values);
		}
		return { saved: 'deleted' };
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
