import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { ValidationError } from '$lib/server/errors';
import { api } from '$lib/server/http';
import { substrateOf, sweepQuery } from '$lib/schemas/levels';
import { CAUTIONS } from '$lib/science/screening';
import { polymorphSweep } from '$lib/server/services/levels-api';

/** An epsilon sweep (a list, or from/to/step) of the Born estimate for a polymorph, computed without storing. */
export const GET = api(async (event) => {
	await requireRole(event, event.params.ws!, 'viewer');
	const q = sweepQuery.parse(Object.fromEntries(event.url.searchParams));
	let epsilons: number[] | { from: number; to: number; step: number };
	if (q.epsilons !== undefined) {
		epsilons = q.epsilons.split(/[,\s;]+/).filter(Boolean).map(Number);
		if (epsilons.some((x) => !Number.isFinite(x))) throw new ValidationError('epsilons must be numbers separated by commas', 'epsilons');
	} else if (q.from !== undefined && q.to !== undefined && q.step !== undefined) epsilons = { from: q.from, to: q.to, step: q.step };
	else throw new ValidationError('give ?epsilons=2,2.5,3 or ?from=1&to=5&step=0.25', 'epsilons');
	const r = await polymorphSweep(db(), event.params.ws!, event.params.id!, epsilons, { radiusA: q.radius, substrate: substrateOf(q) });
	return json({ ...r, cautions: CAUTIONS });
});
