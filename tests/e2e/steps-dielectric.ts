// End-to-end steps for polymorphs and dielectric screening: import a CIF (a broken one first), upload a
// tensor, add a refractive index and a Clausius–Mossotti estimate, pick the epsilon in use, and compare two
// polymorphs. Runs in its own browser context as a new user. The molecule and its first polymorph are a
// published structure (COD 1501936, Org. Lett. 13 (2011) 720; see src/lib/formats/fixtures/README.md); the
// second polymorph's cell, the tensor, refractive index and polarizability are an invented scenario.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { assert, newContext, shot, step } from './harness';

const FIXTURES = join(process.cwd(), 'src', 'lib', 'formats', 'fixtures');
const TRICLINIC = readFileSync(join(FIXTURES, 'cod-1501936.cif'));
const MOLECULE_XYZ = readFileSync(join(FIXTURES, 'cod-1501936-molecule.xyz'));
const TENSOR_CSV = '# invented linear-response tensor (electronic)\n,x,y,z\nx,3.10,0.05,0.00\ny,0.05,2.80,0.12\nz,0.00,0.12,4.20\n';

export function registerDielectricSteps(consoleErrors: string[]): void {
	const run = Date.now().toString(36);
	const carol = { email: `carol-${run}@example.test`, password: 'dielectric-long-password', name: 'Carol Ndiaye' };
	let ctx: BrowserContext;
	let page: Page;
	let moleculeUrl = '';
	let firstPolymorphUrl = '';

	const addEntry = async (tab: string, fill: () => Promise<void>, button: string) => {
		await page.getByRole('tab', { name: tab }).click();
		await fill();
		await page.getByRole('button', { name: button }).click();
		await page.waitForLoadState('load');
	};

	step('dielectric: a new editor creates a molecule', async () => {
		ctx = await newContext();
		page = await ctx.newPage();
		page.on('pageerror', (e) => consoleErrors.push(e.message));
		await page.goto('/signup');
		await page.getByLabel('Name').fill(carol.name);
		await page.getByLabel('E-mail').fill(carol.email);
		await page.locator('input[name=password]').fill(carol.password);
		await page.getByRole('button', { name: 'Create account' }).click();
		await page.waitForURL(/\/w\/[0-9a-f-]+\/molecules/);
		const ws = new URL(page.url()).pathname.replace(/\/molecules.*/, '');
		await page.goto(`${ws}/molecules/new`);
		await page.getByLabel('Name').fill('Polymorph study');
		await page.getByTestId('xyz-file').setInputFiles({ name: 'cod-1501936-molecule.xyz', mimeType: 'text/plain', buffer: MOLECULE_XYZ });
		await page.getByRole('button', { name: 'Create molecule' }).click();
		await page.waitForURL(/\/molecules\/[0-9a-f-]{36}$/);
		moleculeUrl = new URL(page.url()).pathname;
	});

	step('dielectric: a CIF with a broken loop is refused naming the line, nothing stored', async () => {
		await page.goto(moleculeUrl);
		await page.getByText('Import a polymorph from CIF').click();
		const broken = TRICLINIC.toString().replace('O2 O 0.25690(11) 0.06668(12) 0.48190(6) 0.0318(2) Uani 1 1 d .', 'O2 O 0.25690(11) 0.06668(12) 0.48190(6) 0.0318(2) Uani 1 1 d');
		await page.getByTestId('cif-file').setInputFiles({ name: 'broken.cif', mimeType: 'chemical/x-cif', buffer: Buffer.from(broken) });
		await page.getByRole('button', { name: 'Import CIF' }).click();
		const msg = await page.getByTestId('cif-error').textContent();
		assert(msg?.trim().startsWith('line 73: loop_ has 11 tags') && msg.trim().endsWith('(in broken.cif)'), `error should name the loop line once, got: ${msg}`);
		assert((await page.getByTestId('compare-row').count()) === 0, 'a refused CIF must not create a polymorph');
		await shot(page, '20-cif-error');
	});

	step('dielectric: import a triclinic polymorph from its CIF; the unit cell is shown in 3D', async () => {
		await page.getByTestId('cif-file').setInputFiles({ name: 'cod-1501936.cif', mimeType: 'chemical/x-cif', buffer: TRICLINIC });
		await page.getByLabel('Label (optional)').fill('form I (triclinic)');
		await page.getByRole('button', { name: 'Import CIF' }).click();
		await page.waitForURL(/\/polymorphs\/[0-9a-f-]{36}$/);
		firstPolymorphUrl = new URL(page.url()).pathname;
		const vol = await page.getByTestId('cell-volume').textContent();
		assert(vol?.startsWith('860.5'), `cell volume of COD 1501936 shown as ${vol} (printed 860.57(5) Å³)`);
		const density = await page.getByTestId('density').textContent();
		assert(density?.startsWith('1.32'), `density shown as ${density} (printed 1.321 g/cm³)`);
		assert((await page.getByTestId('cif-note').count()) === 0, 'a matching CIF should raise no notes');
		await page.locator('[data-testid="unit-cell-viewer"][data-status="ready"]').waitFor({ timeout: 20_000 });
		await shot(page, '21-polymorph-from-cif');
	});

	step('dielectric: upload a tensor; principal values, means and a direction are computed instantly', async () => {
		await page.getByRole('tab', { name: 'Tensor' }).click();
		await page.getByTestId('tensor-file').setInputFiles({ name: 'eps.csv', mimeType: 'text/csv', buffer: Buffer.from(TENSOR_CSV) });
		const preview = page.getByTestId('tensor-preview');
		await preview.getByTestId('tensor-mean').waitFor();
		assert((await preview.getByTestId('tensor-mean').textContent())?.trim() === '3.367', 'trace/3 of the tensor should be 3.367');
		await preview.getByTestId('direction-input').fill('0 0 1');
		const dir = await preview.getByTestId('directional-value').textContent();
		assert(dir && Number(dir) > 2.8 && Number(dir) < 4.2, `epsilon along [001] should lie between the principal values, got ${dir}`);
		await page.getByLabel('Method').fill('linear response (invented)');
		await shot(page, '22-tensor-preview');
		await page.getByRole('button', { name: 'Add tensor entry' }).click();
		await page.waitForLoadState('load');
		assert((await page.locator('[data-testid="entry-row"][data-kind="tensor"]').count()) === 1, 'tensor entry not listed');
	});

	step('dielectric: add a refractive index with its wavelength', async () => {
		await addEntry(
			'Refractive index',
			async () => {
				await page.getByLabel('Refractive index n').fill('1.78');
				await page.getByLabel('Wavelength (nm)').fill('633');
			},
			'Add refractive index entry'
		);
		assert((await page.locator('[data-testid="entry-row"][data-kind="refractive_index"]').count()) === 1, 'refractive-index entry not listed');
	});

	step('dielectric: a Clausius–Mossotti estimate shows its formula; x >= 1 has no finite solution; static is explained', async () => {
		await page.getByRole('tab', { name: 'Clausius–Mossotti' }).click();
		await page.getByTestId('polarizability').fill('120');
		await page.getByTestId('cm-no-solution').waitFor();
		await page.getByLabel('static (ε₀, with ionic response)').check();
		await page.getByTestId('static-note').waitFor();
		await shot(page, '23-cm-no-solution');
		await page.getByLabel('electronic (ε∞, high-frequency)').check();
		await page.getByTestId('polarizability').fill('36');
		const formula = await page.getByTestId('cm-formula').textContent();
		assert(formula?.includes('430.29 Å³'), `formula should substitute V/Z = 430.29 Å³, got ${formula}`);
		await page.getByRole('button', { name: 'Add clausius–mossotti entry' }).click();
		await page.waitForLoadState('load');
		assert((await page.locator('[data-testid="entry-row"][data-kind="clausius_mossotti"]').count()) === 1, 'CM entry not listed');
	});

	step('dielectric: pick the epsilon in use with a reason', async () => {
		const form = page.getByTestId('choose-form');
		const tensorOption = await form.locator('option', { hasText: 'Tensor' }).getAttribute('value');
		await form.getByLabel('Epsilon in use').selectOption(tensorOption as string);
		await form.getByLabel('Reason').fill('linear-response tensor of the measured cell; trace/3');
		await form.getByRole('button', { name: 'Use this ε' }).click();
		await page.waitForLoadState('load');
		const v = await page.getByTestId('epsilon-in-use-value').textContent();
		assert(v?.includes('3.367'), `epsilon in use shown as ${v}`);
		assert((await page.getByTestId('activity').textContent())?.includes('set the epsilon in use'), 'choice not in the activity');
		await shot(page, '24-epsilon-in-use');
	});

	step('dielectric: a second polymorph; the molecule compares both', async () => {
		// An invented thin-film cell for the same molecule, typed in by hand.
		await page.goto(moleculeUrl);
		await page.getByText('Add a polymorph').click();
		const f = page.locator('form[action="?/addPolymorph"]');
		await f.getByLabel('Label').fill('form II (invented thin-film cell)');
		await f.getByLabel('Space group').fill('P-1');
		await f.getByLabel('Z (molecules per cell)').fill('2');
		for (const [label, value] of [['a (Å)', '8.05'], ['b (Å)', '8.52'], ['c (Å)', '13.40'], ['α (°)', '81.0'], ['β (°)', '83.5'], ['γ (°)', '78.6']])
			await f.getByLabel(label, { exact: true }).fill(value);
		await f.getByRole('button', { name: 'Add polymorph' }).click();
		await page.waitForURL(/\/polymorphs\/[0-9a-f-]{36}$/);
		assert(new URL(page.url()).pathname !== firstPolymorphUrl, 'the second polymorph should be a new record');
		await addEntry('Scalar', async () => page.getByLabel('ε (scalar)').fill('3.05'), 'Add scalar entry');
		const form = page.getByTestId('choose-form');
		await form.getByLabel('Reason').fill('only value so far');
		await form.getByRole('button', { name: 'Use this ε' }).click();
		await page.waitForLoadState('load');
		await page.goto(moleculeUrl);
		const rows = page.getByTestId('compare-row');
		assert((await rows.count()) === 2, 'compare table should list two polymorphs');
		const eps = (await page.getByTestId('compare-epsilon').allTextContents()).map((s) => s.trim());
		assert(eps.includes('3.37') && eps.includes('3.05'), `compare table epsilon values: ${eps.join(', ')}`);
		await page.getByTestId('compare-polymorphs').scrollIntoViewIfNeeded();
		await shot(page, '25-compare-polymorphs');
		await ctx.close();
	});
}
