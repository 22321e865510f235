import { z } from 'zod';
import { ROLES } from '$lib/roles';
import { requireUser } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { formFailure } from '$lib/server/http';
import { createApiToken, listApiTokens, revokeApiToken } from '$lib/server/services/api-tokens';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return { tokens: await listApiTokens(db(), user.id) };
};

const createSchema = z.object({
	name: z.string().trim().min(1, 'give the token a name').max(100),
	workspaceId: z.uuid('choose a workspace'),
	role: z.enum(ROLES),
	expiresInDays: z.preprocess((v) => (v === '' || v === 'never' ? null : v), z.coerce.number().int().min(1).max(3650).nullable())
});

export const actions: Actions = {
	create: async (event) => {
		const user = requireUser(event);
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			const input = createSchema.parse(values);
			const { token } = await createApiToken(db(), user.id, input);
			return { created: token, name: input.name };
		} catch (e) {
			return formFailure(e, values);
		}
	},
	revoke: async (event) => {
		const user = requireUser(event);
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		try {
			await revokeApiToken(db(), user.id, z.uuid().parse(values.id));
		} catch (e) {
			return formFailure(e, values);
		}
		return { revoked: true };
	}
};
