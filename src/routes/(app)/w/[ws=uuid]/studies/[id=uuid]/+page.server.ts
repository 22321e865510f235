import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { ScanTableError, applyMapping, parseScanTable, type ScanMapping } from '$lib/formats/scan-table';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { NotFoundError, ValidationError } from '$lib/server/errors';
import { formFailure } from '$lib/server/http';
import { listActivity } from '$lib/server/repo/activity';
import { exclusionInput, studyInput, tuningObjective } from '$lib/schemas/tuning';
import { deleteStudy, getStudy, importPoints, markCurrent, saveAnalysis, setPointExclusion, updatePoint, updateStudy } from '$lib/server/services/tuning';
import { latestPendingUpload } from '$lib/server/services/output-uploads';
import { uploadFormActions } from '$lib/server/upload-routes';
import { canEdit } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, event.params.ws, 'viewer');
	try {
		const study = await getStudy(db(), event.params.ws, event.params.id);
		const activity = await listActivity(db(), event.params.ws, { entityIds: [study.id, ...study.points.map((p) => p.id)], limit: 30 });
		const pendingUpload = canEdit(actor.role) ? await latestPendingUpload(db(), actor, { kind: 'study', id: study.id }) : null;
		return { study, activity, pendingUpload };
	} catch (e) {
		if (e instanceof NotFoundError) error(404, 'Not found');
		throw e;
	}
};

const form = async (event: { request: Request }) => Object.fromEntries(await event.request.formData()) as Record<string, string>;
const version = z.coerce.number().int().min(1, 'send the version you read');
const uuid = z.uuid('not a valid id');
const ingestActions = uploadFormActions('study', 'ingest');

const importForm = z.object({
	text: z.string().min(1, 'paste or upload a scan table first').max(1024 * 1024, 'the table is larger than 1 MiB'),
	mapping: z.string().min(2, 'the column mapping is missing'),
	energyUnit: z.enum(['hartree', 'eV']),
	gammaUnit: z.enum(['bohr^-1', 'angstrom^-1']).default('bohr^-1'),
	source: z.string().max(200).optional(),
	version
});

const saveForm = z.object({
	objective: tuningObjective,
	exclusions: z.string().default('[]'),
	version
});
const exclusionList = z.array(z.object({ pointId: uuid, version: z.number().int().min(1), excluded: z.boolean(), reason: z.string().max(500).optional() }));

const energyCell = z.preprocess((v) => (v === '' || v === undefined ? null : v), z.coerce.number({ error: 'must be a number' }).finite().nullable());
const pointForm = z.object({
	pointId: uuid,
	version,
	gammaBohrInv: z.coerce.number({ error: 'gamma must be a number' }).finite().min(0),
	eNeutralHartree: energyCell,
	eCationHartree: energyCell,
	eAnionHartree: energyCell,
	homoNeutralHartree: energyCell,
	lumoNeutralHartree: energyCell,
	homoAnionHartree: energyCell
});

export const actions: Actions = {
	update: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		try {
			await updateStudy(db(), actor, event.params.id, version.parse(values.version), studyInput.parse(values));
		} catch (e) {
			return formFailure(e, { ...values, _section: 'update' });
		}
		return { saved: 'study' };
	},
	delete: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		let moleculeId: string;
		try {
			const s = await getStudy(db(), actor.workspaceId, event.params.id);
			moleculeId = s.moleculeId;
			await deleteStudy(db(), actor, event.params.id, version.parse(values.version));
		} catch (e) {
			return formFailure(e, values);
		}
		redirect(303, `/w/${actor.workspaceId}/molecules/${moleculeId}`);
	},
	ingest: ingestActions.preview,
	confirmIngest: ingestActions.confirm,
	discardIngest: ingestActions.discard,
	import: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		try {
			const f = importForm.parse(values);
			let mapping: ScanMapping;
			try {
				mapping = JSON.parse(f.mapping) as ScanMapping;
			} catch {
				throw new ValidationError('the column mapping is not valid JSON', 'mapping');
			}
			let points;
			try {
				// The same pure parser the preview used, so what was previewed is what is stored.
				points = applyMapping(parseScanTable(f.text), mapping, { energyUnit: f.energyUnit, gammaUnit: f.gammaUnit });
			} catch (e) {
				if (e instanceof ScanTableError) throw new ValidationError(e.message, 'text'); // the message names line and column
				throw e;
			}
			const r = await importPoints(db(), actor, event.params.id, points, { expectedVersion: f.version, source: f.source || 'a pasted table' });
			return { imported: r.inserted };
		} catch (e) {
			const { text: _t, ...rest } = values;
			return formFailure(e, { ...rest, _section: 'import' });
		}
	},
	save: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		try {
			const f = saveForm.parse(values);
			let raw: unknown;
			try {
				raw = JSON.parse(f.exclusions);
			} catch {
				throw new ValidationError('the exclusion list is not valid JSON', 'exclusions');
			}
			await saveAnalysis(db(), actor, event.params.id, f.version, { objective: f.objective, exclusions: exclusionList.parse(raw) });
		} catch (e) {
			return formFailure(e, { ...values, _section: 'save' });
		}
		return { saved: 'result' };
	},
	markCurrent: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		try {
			await markCurrent(db(), actor, event.params.id, version.parse(values.version));
		} catch (e) {
			return formFailure(e, { ...values, _section: 'current' });
		}
		return { saved: 'current' };
	},
	excludePoint: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		try {
			const { excluded, reason } = exclusionInput.parse({ excluded: values.excluded === 'true', reason: values.reason });
			await setPointExclusion(db(), actor, uuid.parse(values.pointId), version.parse(values.version), excluded, reason);
		} catch (e) {
			return formFailure(e, { ...values, _section: 'points' });
		}
		return { saved: 'point' };
	},
	editPoint: async (event) => {
		const actor = await requireRole(event, event.params.ws, 'editor');
		const values = await form(event);
		try {
			const { pointId, version: v, ...patch } = pointForm.parse(values);
			await updatePoint(db(), actor, pointId, v, patch);
		} catch (e) {
			return formFailure(e, { ...values, _section: 'points' });
		}
		return { saved: 'point' };
	}
};
