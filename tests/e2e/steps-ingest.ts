// End-to-end steps for reading engine outputs back: the demo flow with real NWChem 7.0.2 outputs of SO2
// (src/lib/formats/decks/fixtures: one deck per gamma with neutral, cation and anion, alpha 0.2,
// aug-cc-pVDZ, gamma 0.2 / 0.3 / 0.4 bohr^-1, and the screened neutral at epsilon 3, gamma 0.3).
// The scan bundle is downloaded in the browser, the outputs are put beside its decks as a user would
// after running it, the zip is uploaded, previewed and confirmed; then the same for a screened rerun.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import JSZip from 'jszip';
import type { BrowserContext, Download, Page } from 'playwright-core';
import { readNwchemOutput } from '../../src/lib/formats/decks/nwchem-output';
import { assert, newContext, shot, step } from './harness';
import { signInAndCreateSo2Study, type TuningStepsState } from './steps-tuning';

const FIXTURES = join(process.cwd(), 'src/lib/formats/decks/fixtures');
const fixture = (name: string) => readFileSync(join(FIXTURES, name), 'utf8');
const SCAN_OUTPUTS: Record<string, string> = { '0.2': 'so2_g0p2000.out', '0.3': 'so2_g0p3000.out', '0.4': 'so2_g0p4000.out' };
const SCREENED_OUTPUT = 'so2_g0p3000_e3p0000.out';

interface DeckEntry {
	role: string;
	path: string;
	deck?: { kind: 'tuning' | 'screened'; gammaBohrInv: number; epsilon: number; states: string[]; output: string };
}

/** Opens a downloaded bundle and puts an output beside each deck, at the path its manifest names. */
async function withOutputs(download: Download, outputFor: (deck: NonNullable<DeckEntry['deck']>) => string): Promise<{ bytes: Buffer; decks: NonNullable<DeckEntry['deck']>[] }> {
	const zip = await JSZip.loadAsync(readFileSync((await download.path()) as string));
	const manifestPath = Object.keys(zip.files).find((n) => n.endsWith('manifest.json'));
	assert(manifestPath, 'the bundle has no manifest.json');
	const root = manifestPath.slice(0, -'manifest.json'.length);
	const manifest = JSON.parse(await zip.file(manifestPath)!.async('string')) as { files: DeckEntry[] };
	const decks = manifest.files.filter((f) => f.role === 'deck' && f.deck).map((f) => f.deck!);
	for (const d of decks) zip.file(`${root}${d.output}`, fixture(outputFor(d)));
	return { bytes: await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' }), decks };
}

export function registerIngestSteps(state: TuningStepsState): void {
	let ctx: BrowserContext;
	let page: Page;
	let moleculeUrl = '';
	let ipText = '';
	let eaText = '';
	/** A step that also saves this context's page when it fails (the run's own failure shot shows another page). */
	const ingestStep = (name: string, fn: () => Promise<void>) =>
		step(name, async () => {
			try {
				await fn();
			} catch (e) {
				if (page) await shot(page, `failed-ingest-page-${name.replace(/\W+/g, '-').slice(0, 60)}`).catch(() => {});
				throw e;
			}
		});

	ingestStep('ingest: SO2 and a study; download the scan bundle for gamma 0.2, 0.3, 0.4', async () => {
		ctx = await newContext();
		page = await ctx.newPage();
		page.on('pageerror', (e) => state.consoleErrors.push(`ingest: ${e.message}`));
		moleculeUrl = await signInAndCreateSo2Study(page, state, { molecule: 'SO2 (engine outputs)', study: 'NWChem scan, alpha 0.2' });
		await page.getByTestId('outputs-limits').getByText(/Up to 50 MB per upload/).waitFor();
	});

	ingestStep('ingest: outputs beside the decks, upload, the preview lists the three gammas and nothing is stored', async () => {
		const form = page.getByTestId('scan-bundle-form');
		await form.getByLabel(/γ values in bohr/).fill('0.2, 0.3, 0.4');
		await form.getByLabel('Decks per γ').selectOption('combined');
		await form.getByLabel('Basis set').fill('aug-cc-pvdz');
		const download = page.waitForEvent('download');
		await form.getByRole('button', { name: /Download scan bundle/ }).click();
		const d = await download;
		const { bytes, decks } = await withOutputs(d, (deck) => SCAN_OUTPUTS[String(deck.gammaBohrInv)]);
		assert(decks.length === 3 && decks.every((x) => x.states.join() === 'neutral,cation,anion'), `expected three decks with the three states, got ${JSON.stringify(decks)}`);
		await page.getByTestId('outputs-file').setInputFiles({ name: d.suggestedFilename().replace(/\.zip$/, '-run.zip'), mimeType: 'application/zip', buffer: bytes });
		await page.getByRole('button', { name: 'Upload and preview' }).click();
		const preview = page.getByTestId('upload-preview');
		await preview.waitFor();
		for (const g of ['0.2', '0.3', '0.4']) {
			const row = preview.locator(`tr[data-gamma="${g}"]`);
			assert((await row.count()) === 1, `preview has no row for gamma ${g}`);
			assert((await row.textContent())?.includes('neutral, cation, anion'), `gamma ${g}: three states not read`);
			assert((await row.textContent())?.includes('new'), `gamma ${g} not new`);
		}
		assert((await preview.getByTestId('upload-files').textContent())?.includes('γ 0.3000: neutral, cation, anion'), 'file list does not say what the gamma 0.3 output fills');
		assert((await page.getByRole('heading', { name: 'Import the scan' }).count()) === 1, 'the preview stored points (the study should still have none)');
		await preview.scrollIntoViewIfNeeded();
		await shot(page, '30-ingest-scan-preview');
	});

	ingestStep('ingest: confirm stores the scan; gamma* appears on the study page', async () => {
		await page.getByTestId('upload-confirm').click();
		await page.getByTestId('ingest-status').waitFor();
		assert((await page.getByTestId('ingest-status').textContent())?.includes('3 scan point(s) added'), 'three points not stored');
		assert((await page.getByTestId('upload-preview').count()) === 0, 'the preview is still shown after confirming');
		await page.locator('[data-testid="tuning-chart"][data-status="ready"]').waitFor({ timeout: 20_000 });
		const g = Number(await page.getByTestId('gamma-star').textContent());
		// J_IP and J_EA of these outputs cross zero between 0.3 and 0.4 bohr^-1 (fixtures README).
		assert(g > 0.3 && g < 0.4, `gamma* shown as ${g}`);
		ipText = ((await page.getByTestId('ip').textContent()) ?? '').replace(/[^\d.-]/g, '');
		eaText = ((await page.getByTestId('ea').textContent()) ?? '').replace(/[^\d.-]/g, '');
		await shot(page, '31-ingest-scan-stored');
	});

	ingestStep('ingest: a polymorph with epsilon 3 in use; the screened rerun bundle with its output, preview, confirm', async () => {
		await page.goto(moleculeUrl);
		await page.getByText('Add a polymorph').click();
		const f = page.locator('form[action="?/addPolymorph"]');
		await f.getByLabel('Label').fill('invented cell for the demo');
		await f.getByLabel('Space group').fill('P1');
		await f.getByLabel('Z (molecules per cell)').fill('2');
		for (const [label, v] of [['a (Å)', '6.0'], ['b (Å)', '6.0'], ['c (Å)', '6.0'], ['α (°)', '90'], ['β (°)', '90'], ['γ (°)', '90']]) await f.getByLabel(label, { exact: true }).fill(v);
		await f.getByRole('button', { name: 'Add polymorph' }).click();
		await page.waitForURL(/\/polymorphs\/[0-9a-f-]{36}$/);
		await page.getByRole('tab', { name: 'Scalar' }).click();
		await page.getByLabel('ε (scalar)').fill('3');
		await page.getByRole('button', { name: 'Add scalar entry' }).click();
		await page.waitForLoadState('load');
		const choose = page.getByTestId('choose-form');
		await choose.getByLabel('Reason').fill('demo value');
		await choose.getByRole('button', { name: 'Use this ε' }).click();
		await page.waitForLoadState('load');
		await page.getByRole('link', { name: 'Solid-state levels' }).click();
		await page.waitForURL(/\/levels$/);
		// The screened output was run at gamma 0.3 (not this study's gamma*), so the quick-look values are typed.
		await page.getByLabel('γ (bohr⁻¹)', { exact: true }).fill('0.3');
		await page.getByTestId('typed-ip').fill(ipText);
		await page.getByTestId('typed-ea').fill(eaText);
		const form = page.getByTestId('bundle-form');
		assert((await form.locator('input[name=epsilons]').inputValue()) === '3.000', 'the bundle form should offer the epsilon in use');
		const download = page.waitForEvent('download');
		await form.getByRole('button', { name: /Download rerun bundle/ }).click();
		const { bytes, decks } = await withOutputs(await download, () => SCREENED_OUTPUT);
		assert(decks.length === 1 && decks[0].kind === 'screened' && decks[0].epsilon === 3, `expected one screened deck at epsilon 3, got ${JSON.stringify(decks)}`);
		await page.getByTestId('outputs-file').setInputFiles({ name: 'so2-rerun.zip', mimeType: 'application/zip', buffer: bytes });
		await page.getByRole('button', { name: 'Upload and preview' }).click();
		const preview = page.getByTestId('upload-preview');
		await preview.waitFor();
		const row = preview.locator('tr[data-epsilon="3"]');
		assert((await row.count()) === 1, 'preview has no row for epsilon 3');
		assert((await row.textContent())?.includes('new'), 'epsilon 3 not new');
		assert((await page.getByTestId('rerun-table').getByText('No rerun results yet.').count()) === 1, 'the preview stored a result');
		await preview.scrollIntoViewIfNeeded();
		await shot(page, '32-ingest-rerun-preview');
		await page.getByTestId('upload-confirm').click();
		await page.getByTestId('ingest-status').waitFor();
		// IP_s = -eps_HOMO of the screened neutral, in eV (CODATA 2018 hartree), read with the project's parser.
		const homo = readNwchemOutput(fixture(SCREENED_OUTPUT)).tasks[0].homoHartree as number;
		const ip = (-homo * 27.211386245988).toFixed(3);
		await page.getByTestId('rerun-table').getByRole('cell', { name: ip, exact: true }).first().waitFor();
		// With the quick-look values typed again, the levels table puts the rerun beside the Born estimate.
		await page.getByLabel('γ (bohr⁻¹)', { exact: true }).fill('0.3');
		await page.getByTestId('typed-ip').fill(ipText);
		await page.getByTestId('typed-ea').fill(eaText);
		await page.getByTestId('levels-table').getByRole('cell', { name: ip, exact: true }).waitFor();
		await shot(page, '33-ingest-rerun-stored');
		await ctx.close();
	});
}
