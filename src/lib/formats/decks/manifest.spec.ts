import { describe, expect, it } from 'vitest';
import { DECK_MANIFEST_SCHEMA, deckManifest } from './manifest';
import { writeNwchemScreenedJob, writeNwchemTuningScan } from './nwchem';

const job = {
	jobName: 'h2o',
	molecule: {
		charge: 0,
		multiplicity: 1,
		atoms: [
			{ element: 'O', x: 0, y: 0, z: 0.1173 },
			{ element: 'H', x: 0.7572, y: 0, z: -0.4692 },
			{ element: 'H', x: -0.7572, y: 0, z: -0.4692 }
		]
	},
	alpha: 0.2,
	provenance: { molecule: 'water', appVersion: '0.1.0' }
};

describe('deckManifest', () => {
	it('lists every deck with its path, parameters and states', () => {
		const decks = [...writeNwchemTuningScan({ ...job, gammasBohrInv: [0.2, 0.3] }), writeNwchemScreenedJob({ ...job, gammaBohrInv: 0.3, epsilon: 3 })];
		const m = deckManifest(decks, job.provenance);
		expect(m.schema).toBe(DECK_MANIFEST_SCHEMA);
		expect(m.entries.map((e) => e.path)).toEqual(['g0p2000/h2o_g0p2000.nw', 'g0p3000/h2o_g0p3000.nw', 'screened_e3p0000/h2o_g0p3000_e3p0000.nw']);
		expect(m.entries[2]).toMatchObject({ kind: 'screened', alpha: 0.2, gammaBohrInv: 0.3, epsilon: 3 });
		expect(m.entries[2].beta).toBeCloseTo(1 / 3 - 0.2, 15);
		expect(m.entries[0].states.map((s) => s.label)).toEqual(['neutral', 'cation', 'anion']);
		expect(JSON.parse(JSON.stringify(m))).toEqual(m);
	});

	it('refuses two decks at the same path', () => {
		const d = writeNwchemScreenedJob({ ...job, gammaBohrInv: 0.3, epsilon: 3 });
		expect(() => deckManifest([d, d], job.provenance)).toThrow('decks[1]: two decks share the path screened_e3p0000/h2o_g0p3000_e3p0000.nw');
	});
});
