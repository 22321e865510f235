import { z } from 'zod';
import { defineOperation, WS_ID_PARAMS, WS_PARAM } from './registry';

const trashItem = z.object({
	id: z.uuid(),
	entity: z.string().meta({ description: 'molecule, polymorph, tuning study, dielectric entry, measurement or rerun result' }),
	label: z.string(),
	contents: z.string().meta({ description: 'what was deleted with it, in words' }),
	parentHref: z.string().nullable(),
	deletedAt: z.string(),
	deletedBy: z.string().nullable(),
	restoredAt: z.string().nullable(),
	restoredBy: z.string().nullable()
});

defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/trash', tag: 'Trash', role: 'viewer', summary: 'List deleted records (newest first) with what went with each', params: WS_PARAM, response: { status: 200, description: 'deleted records', schema: z.object({ items: z.array(trashItem) }) } });
defineOperation({
	method: 'post',
	path: '/api/v1/workspaces/{ws}/trash/{id}/restore',
	tag: 'Trash',
	role: 'owner',
	summary: 'Restore a deleted record with everything that went with it',
	description: 'Refused (400) when its parent (molecule, polymorph) is itself in the trash: the message names it.',
	params: WS_ID_PARAMS,
	response: { status: 200, description: 'restored', schema: z.object({ restored: z.string(), notes: z.array(z.string()) }) }
});
