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
import { listEstimates, saveEstimate } from '$lib/server/services/estimates';
import { levelsQuery, substrateOf } from '$lib/schemas/levels';
import { addReruns, deleteRerun, listReruns } from '$lib/server/services/reruns';
import { latestPendingUpload } from '$lib/server/services/output-uploads';
import { uploadFormActions } from '$lib/server/upload-routes';
import { canEdit } from '$lib/roles';
import { HARTREE_EV } from '$lib/science/units';
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
	const actor = await requireRole(event, event.params.ws, 'viewer');
	let polymorph;
	try {
		polymorph = await getPolymorph(db(), event.params.ws, event.params.id);
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
	const context = await levelsContext(db(), event.params.ws, polymorph.id, polymorph.moleculeId);
	const [bundles, reruns, estimates] = await Promise.all([listBundles(db(), event.params.ws, { polymorphId: polymorph.id }), listReruns(db(), event.params.ws, polymorph.id), listEstimates(db(), event.params.ws, polymorph.id)]);
	const pendingUpload = canEdit(actor.role) ? await latestPendingUpload(db(), actor, { kind: 'polymorph', id: polymorph.id }) : null;
	return { polymorph, ...context, bundles, reruns, estimates, pendingUpload };
};

const outputActions = uploadFormActions('polymorph', 'outputs');

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
	uploadOutputs: outputActions.preview,
	confirmOutputs: outputActions.confirm,
	discardOutputs: outputActions.discard,
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
