import { requireRole } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { listMolecules } from '$lib/server/services/molecules';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 20;
const SORTS = ['name', 'formula', 'updated_at'] as const;

export const load: PageServerLoad = async (event) => {
	await requireRole(event, event.params.ws, 'viewer');
	const sp = event.url.searchParams;
	const sort = (SORTS as readonly string[]).includes(sp.get('sort') ?? '') ? (sp.get('sort') as (typeof SORTS)[number]) : 'name';
	const dir = sp.get('dir') === 'desc' ? 'desc' : 'asc';
	const pageNo = Math.max(1, Number(sp.get('page')) || 1);
	const q = sp.get('q') ?? '';
	const { total, items } = await listMolecules(db(), event.params.ws, { q, sort, dir, limit: PAGE_SIZE, offset: (pageNo - 1) * PAGE_SIZE });
	return {
		q,
		sort,
		dir,
		page: pageNo,
		pageSize: PAGE_SIZE,
		total,
		molecules: items.map((m) => ({ id: m.id, name: m.name, formula: m.formula, atomCount: m.atomCount, netCharge: m.netCharge, multiplicity: m.multiplicity, polymorphCount: m.polymorphCount, updatedAt: m.updatedAt.toISOString() }))
	};
};
