import { z } from 'zod';
import { TUNING_OBJECTIVES } from '$lib/science/tuning/types';

const optionalText = (max: number) =>
	z
		.string()
		.max(max, `at most ${max} characters`)
		.optional()
		.transform((s) => (s ?? '').trim());

export const tuningObjective = z.enum(TUNING_OBJECTIVES, { error: `objective must be one of ${TUNING_OBJECTIVES.join(', ')}` });

export const studyInput = z.object({
	name: z.string().trim().min(1, 'a name is required').max(200),
	engine: z.string().trim().min(1, 'the engine is required (e.g. NWChem)').max(60),
	engineVersion: optionalText(60),
	semilocalBase: z.string().trim().max(60).optional().transform((s) => (s && s.length ? s : 'PBE')),
	basisSet: z.string().trim().min(1, 'the basis set is required (e.g. aug-cc-pVDZ)').max(80),
	alpha: z.coerce.number({ error: 'alpha must be a number' }).min(0, 'alpha must be between 0 and 1').max(1, 'alpha must be between 0 and 1'),
	objective: tuningObjective.optional().default('abs-sum'),
	notes: optionalText(20_000)
});
export type StudyInput = z.infer<typeof studyInput>;
export const studyPatch = studyInput.partial();
export type StudyPatch = z.infer<typeof studyPatch>;

const energy = z.number({ error: 'energies must be numbers (hartree) or null' }).finite().nullable().optional();

/** One scan point as sent by the API or the import preview: energies in hartree, gamma in bohr^-1. */
export const scanPointInput = z.object({
	gammaBohrInv: z.number({ error: 'gammaBohrInv must be a number' }).finite().min(0, 'gamma must be >= 0').max(100, 'gamma must be < 100 bohr^-1'),
	eNeutralHartree: energy,
	eCationHartree: energy,
	eAnionHartree: energy,
	homoNeutralHartree: energy,
	lumoNeutralHartree: energy,
	homoAnionHartree: energy,
	excluded: z.boolean().optional(),
	excludedReason: z.string().max(500).optional()
});
export type ScanPointInput = z.infer<typeof scanPointInput>;

export const MAX_POINTS_PER_IMPORT = 2000;
export const bulkPointsBody = z.object({
	points: z.array(scanPointInput, { error: 'points must be an array' }).min(1, 'send at least one point').max(MAX_POINTS_PER_IMPORT, `at most ${MAX_POINTS_PER_IMPORT} points at once`)
});

export const pointPatch = scanPointInput.partial();
export type PointPatch = z.infer<typeof pointPatch>;

export const exclusionInput = z.object({
	excluded: z.boolean(),
	reason: z.string().trim().max(500).optional().default('')
});
