// Screened rerun read-back: a real NWChem output (NWChem 7.0.2, SO2, aug-cc-pVDZ, alpha 0.2,
// gamma 0.3, epsilon 3; see src/lib/formats/decks/fixtures/README.md) uploaded as a bundle zip.
import JSZip from 'jszip';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import screenedDeck from '../../src/lib/formats/decks/fixtures/so2_g0p3000_e3p0000.nw?raw';
import screenedOut from '../../src/lib/formats/decks/fixtures/so2_g0p3000_e3p0000.out?raw';
import { readNwchemOutput } from '../../src/lib/formats/decks/nwchem-output';
import type { Db } from '../../src/lib/server/db/create-db';
import { ValidationError } from '../../src/lib/server/errors';
import { ingestReruns, listReruns } from '../../src/lib/server/services/reruns';
import { appDb, teamFixture } from './fixtures';

let db: Db;
let fx: Awaited<ReturnType<typeof teamFixture>>;
beforeAll(async () => {
	db = appDb();
	fx = await teamFixture(db);
});
afterAll(async () => db?.destroy());

describe('screened rerun read-back', () => {
	it('stores the HOMO and LUMO the engine printed, from a single output file', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		const expected = readNwchemOutput(screenedOut).tasks[0];
		const r = await ingestReruns(db, actor, fx.polymorph.id, 'screened/eps3p000/so2_g0p3000_e3p0000.out', new TextEncoder().encode(screenedOut));
		expect(r.stored).toHaveLength(1);
		expect(r.stored[0].epsilon).toBeCloseTo(3, 3);
		expect(r.stored[0].homoHartree).toBe(expected.homoHartree);
		// IP_s = -eps_HOMO in eV (CODATA 2018 hartree)
		expect(r.stored[0].ipEv).toBeCloseTo(-expected.homoHartree! * 27.211386245988, 9);
		expect((await listReruns(db, fx.ws, fx.polymorph.id)).some((x) => x.id === r.stored[0].id)).toBe(true);
	});

	it('refuses an archive with a path-traversal entry and stores nothing', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		const before = (await listReruns(db, fx.ws, fx.polymorph.id)).length;
		const zip = new JSZip();
		zip.file('screened/eps3p000/deck.nw', screenedDeck);
		zip.file('../../etc/evil.out', screenedOut);
		const bytes = await zip.generateAsync({ type: 'uint8array' });
		const err = await ingestReruns(db, actor, fx.polymorph.id, 'outputs.zip', bytes).catch((e) => e);
		expect(err).toBeInstanceOf(ValidationError);
		expect(err.message).toMatch(/"\.\.".*outside the extraction folder/);
		expect((await listReruns(db, fx.ws, fx.polymorph.id)).length).toBe(before);
	});

	it('says why when an upload holds no screened result', async () => {
		const actor = { userId: fx.editor.id, workspaceId: fx.ws, role: 'editor' as const };
		await expect(ingestReruns(db, actor, fx.polymorph.id, 'notes.out', new TextEncoder().encode('hello'))).rejects.toThrow(/no screened rerun result found in notes\.out/);
	});
});
