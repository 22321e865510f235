import { readFileSync } from 'node:fs';
import type { Db } from '../../../src/lib/server/db/create-db';
import { previewUpload } from '../../../src/lib/server/services/output-uploads';
import type { teamFixture } from '../fixtures';
import type { Need } from './types';

/** Output uploads in two steps (preview, then confirm or discard) for tuning studies and polymorph reruns. */
export const policy: Record<string, Need> = {
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/confirmIngest': 'editor',
	'/(app)/w/[ws=uuid]/studies/[id=uuid] ?/discardIngest': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/confirmOutputs': 'editor',
	'/(app)/w/[ws=uuid]/polymorphs/[id=uuid]/levels ?/discardOutputs': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid]/outputs/[upload=uuid]/confirm POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/studies/[id=uuid]/outputs/[upload=uuid] DELETE': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/reruns/outputs/[upload=uuid]/confirm POST': 'editor',
	'/api/v1/workspaces/[ws=uuid]/polymorphs/[id=uuid]/reruns/outputs/[upload=uuid] DELETE': 'editor'
};

const fixture = (name: string) => ({ name, bytes: readFileSync(new URL(`../../../src/lib/formats/decks/fixtures/${name}`, import.meta.url)) });

/**
 * A pending upload for the tuning policy's study (this file sorts after tuning.ts, so that seed ran)
 * and one for the team's polymorph, each from a real NWChem output.
 */
export async function seed(db: Db, fx: Awaited<ReturnType<typeof teamFixture>>): Promise<Record<string, string>> {
	const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
	const study = await db.selectFrom('tuning_study').select('id').where('workspace_id', '=', fx.ws).where('name', '=', 'role-matrix study').executeTakeFirstOrThrow();
	const s = await previewUpload(db, actor, { kind: 'study', id: study.id }, [fixture('so2_g0p4000.out')]);
	const p = await previewUpload(db, actor, { kind: 'polymorph', id: fx.polymorph.id }, [fixture('so2_g0p3000_e3p0000.out')]);
	return { outputs: s.id, 'reruns/outputs': p.id };
}
