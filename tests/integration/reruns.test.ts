// Screened rerun read-back: a real NWChem output (NWChem 7.0.2, SO2, aug-cc-pVDZ, alpha 0.2,
// gamma 0.3, epsilon 3; see src/lib/formats/decks/fixtures/README.md), previewed and confirmed.
import JSZip from 'jszip';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import screenedDeck from '../../src/lib/formats/decks/fixtures/so2_g0p3000_e3p0000.nw?raw';
import screenedOut from '../../src/lib/formats/decks/fixtures/so2_g0p3000_e3p0000.out?raw';
import { readNwchemOutput } from '../../src/lib/formats/decks/nwchem-output';
import type { Db } from '../../src/lib/server/db/create-db';
import { ValidationError } from '../../src/lib/server/errors';
import { confirmUpload, previewUpload } from '../../src/lib/server/services/output-uploads';
import { listReruns } from '../../src/lib/server/services/reruns';
import { appDb, teamFixture } from './fixtures';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
});
afterAll(async () => db?.destroy());

const target = () => ({ kind: 'polymorph' as const, id: fx.polymorph.id });

describe('screened rerun read-back', () => {
	it('stores the HOMO and LUMO the engine printed, from a single output file, once confirmed', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		const expected = readNwchemOutput(screenedOut).tasks[0];
		const p = await previewUpload(db, actor, target(), [{ name: 'screened/eps3p000/so2_g0p3000_e3p0000.out', bytes: new TextEncoder().encode(screenedOut) }]);
		expect(await listReruns(db, fx.ws, fx.polymorph.id)).toEqual([]);
		await confirmUpload(db, actor, target(), p.id);
		const stored = await listReruns(db, fx.ws, fx.polymorph.id);
		expect(stored).toHaveLength(1);
		expect(stored[0].epsilon).toBeCloseTo(3, 3);
		expect(stored[0].homoHartree).toBe(expected.homoHartree);
		// IP_s = -eps_HOMO in eV (CODATA 2018 hartree)
		expect(stored[0].ipEv).toBeCloseTo(-expected.homoHartree! * 27.211386245988, 9);
	});

	it('refuses an archive with a path-traversal entry and stores nothing', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		const before = (await listReruns(db, fx.ws, fx.polymorph.id)).length;
		const pending = async () => (await db.selectFrom('output_upload').select('id').where('target_id', '=', fx.polymorph.id).execute()).length;
		const pendingBefore = await pending();
		const zip = new JSZip();
		zip.file('screened/eps3p000/deck.nw', screenedDeck);
		zip.file('../../etc/evil.out', screenedOut);
		const bytes = await zip.generateAsync({ type: 'uint8array' });
		const err = await previewUpload(db, actor, target(), [{ name: 'outputs.zip', bytes }]).catch((e: unknown) => e);
		expect(err).toBeInstanceOf(ValidationError);
		expect((err as Error).message).toMatch(/"\.\.".*outside the extraction folder/);
		expect((await listReruns(db, fx.ws, fx.polymorph.id)).length).toBe(before);
		expect(await pending()).toBe(pendingBefore);
	});

	it('says why when an upload holds no screened result', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		await expect(previewUpload(db, actor, target(), [{ name: 'notes.out', bytes: new TextEncoder().encode('hello') }])).rejects.toThrow(/no screened rerun result found in notes\.out/);
	});
});
