import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { api } from '$lib/server/http';
import { TuningInputError, tuningAnalysis } from '$lib/science/tuning';
import { analysisPoints, getStudy } from '$lib/server/services/tuning';

/**
 * The analysis of a study: the saved result (with its analysis version, input hash and input) when it
 * matches the current points, otherwise a fresh analysis of the current points (`saved: false`), so a job
 * script can read gamma* right after pushing its scan.
 */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const s = await getStudy(db(), event.params.ws!, event.params.id!);
	if (!s.points.length) throw new ValidationError('the study has no scan points yet: push a scan first', 'points');
	let fresh;
	try {
		fresh = tuningAnalysis(analysisPoints(s.points), { objective: s.objective, basisSet: s.basisSet });
	} catch (e) {
		if (e instanceof TuningInputError) throw new ValidationError(e.message, e.field ?? 'points');
		throw e;
	}
	const saved = s.result && s.resultInputHash === fresh.inputHash;
	const body = saved
		? { studyId: s.id, saved: true, savedAt: s.resultSavedAt, ...s.result, analysisVersion: s.resultAnalysisVersion, inputHash: s.resultInputHash }
		: { studyId: s.id, saved: false, savedAt: null, ...fresh };
	return json(body, { headers: { etag: `"${s.version}"` } });
});
