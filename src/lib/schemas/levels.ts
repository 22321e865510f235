import { z } from 'zod';

const optionalNumber = (name: string) => z.preprocess((v) => (v === '' || v === null || v === undefined ? undefined : v), z.coerce.number({ error: `${name} must be a number` }).optional());

/** Query of the levels endpoints (all optional: defaults are the epsilon in use and the V/Z cavity). */
export const levelsQuery = z
	.object({
		epsilon: optionalNumber('epsilon'),
		radius: optionalNumber('radius (Å)'),
		substrateEpsilon: z.string().optional(),
		distance: optionalNumber('distance (Å)')
	})
	.refine((q) => (q.substrateEpsilon === undefined) === (q.distance === undefined), { message: 'substrateEpsilon and distance go together', path: ['distance'] });

export const sweepQuery = z.object({
	epsilons: z.string().optional().meta({ description: 'a list, e.g. 2,2.5,3' }),
	from: optionalNumber('from'),
	to: optionalNumber('to'),
	step: optionalNumber('step'),
	radius: optionalNumber('radius (Å)'),
	substrateEpsilon: z.string().optional(),
	distance: optionalNumber('distance (Å)')
});

export const rerunInput = z.object({
	epsilon: z.number().min(1, 'epsilon must be >= 1'),
	alpha: z.number().min(0).max(1),
	gammaBohrInv: z.number().gt(0),
	homoHartree: z.number(),
	lumoHartree: z.number().nullable().optional()
});
export const rerunsBody = z.object({ results: z.array(rerunInput).min(1).max(200) });

export function substrateOf(q: { substrateEpsilon?: string; distance?: number }) {
	if (q.substrateEpsilon === undefined || q.distance === undefined) return null;
	const eps = q.substrateEpsilon === 'metal' ? ('metal' as const) : Number(q.substrateEpsilon);
	if (eps !== 'metal' && !Number.isFinite(eps)) throw new z.ZodError([{ code: 'custom', path: ['substrateEpsilon'], message: 'substrateEpsilon must be a number or "metal"', input: q.substrateEpsilon }]);
	return { distanceA: q.distance, epsilon: eps };
}
