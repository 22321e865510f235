import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ parent }) => {
	const { user, workspaces } = await parent();
	if (user && workspaces.length) redirect(303, `/w/${workspaces[0].id}/molecules`);
	return {};
};
