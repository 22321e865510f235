// Bundle generation: a tuning scan of 100 gamma values x 3 states (one deck per state), planned (decks,
// scripts, README, manifest with SHA-256 per file) and zipped with JSZip, for each engine the builder
// supports. Baseline in the same run: joining the same number of strings of deck size. Target for both
// engines together: < 200 ms.
import { figure, time, timeAsync, type MicroFigure } from '../timing';
import { planBundle, zipBundle, type BundleInput } from '../../src/lib/formats/bundle';
import { SO2_ATOMS } from '../../src/lib/formats/bundle/so2.testdata';

export const BUNDLE_ENGINES = ['nwchem', 'psi4'] as const;

export async function bundleBench(): Promise<MicroFigure[]> {
	const gammas = Array.from({ length: 100 }, (_, i) => Number((0.05 + 0.005 * i).toFixed(4)));
	const input = (engine: (typeof BUNDLE_ENGINES)[number]): BundleInput => ({
		engine: engine as BundleInput['engine'],
		molecule: { name: 'sulfur dioxide (benchmark)', atoms: SO2_ATOMS, charge: 0, multiplicity: 1 },
		alpha: 0.2,
		tuning: { gammasBohrInv: gammas, layout: 'per-state' },
		appVersion: '0.1.0',
		createdAt: '2026-12-01T12:00:00.000Z'
	});
	const engines: (typeof BUNDLE_ENGINES)[number][] = [];
	for (const e of BUNDLE_ENGINES) {
		try {
			await planBundle(input(e));
			engines.push(e);
		} catch (err) {
			console.warn(`bundle benchmark: ${e} bundles cannot be built (${(err as Error).message})`);
		}
	}
	const plans = await Promise.all(engines.map((e) => planBundle(input(e))));
	const decks = plans.reduce((n, p) => n + p.files.filter((f) => f.deck).length, 0);
	const deckSize = plans[0].files.find((f) => f.deck)!.text.length;
	const base = { name: `joining ${decks} strings of ${deckSize} characters`, ...time(() => Array.from({ length: decks }, (_, i) => 'x'.repeat(deckSize) + i).join('\n').length) };
	const label = `${gammas.length} gammas x 3 states x ${engines.length} engine(s) (${engines.join(' + ')}), ${decks} decks`;
	return [
		figure(`bundle plan (decks, scripts, manifest, SHA-256): ${label}`, await timeAsync(() => Promise.all(engines.map((e) => planBundle(input(e))))), { baseline: base }),
		figure(`bundle plan + zip: ${label}`, await timeAsync(async () => Promise.all((await Promise.all(engines.map((e) => planBundle(input(e))))).map(zipBundle))), { baseline: base, targetMs: 200 })
	];
}
