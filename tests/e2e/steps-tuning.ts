// End-to-end steps for gas-phase tuning: upload a real NWChem scan (SO2, committed fixture), see gamma*
// and the chart, exclude a point, save, mark current and see the molecule's tuned parameters.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { assert, newContext, shot, step } from './harness';

export interface TuningStepsState {
	user: { email: string; password: string };
	/** The signed-in user's workspace path (/w/<id>), known once the earlier steps ran. */
	workspaceUrl: () => string;
	consoleErrors: string[];
}

const SO2_XYZ = `3
sulfur dioxide, experimental equilibrium geometry
S 0.0000000000 0.0000000000 0.0000000000
O 1.2349051531 0.0000000000 -0.7226326196
O -1.2349051531 0.0000000000 -0.7226326196
`;
const SCAN = readFileSync(join(process.cwd(), 'src/lib/science/tuning/fixtures/so2-alpha0.2-aug-cc-pvdz.csv'));

/** Signs the user in, creates SO2 from its XYZ and a tuning study (alpha 0.2, aug-cc-pVDZ); returns the molecule's path. */
export async function signInAndCreateSo2Study(page: Page, state: TuningStepsState, names: { molecule: string; study: string }): Promise<string> {
	await page.goto('/signin');
	const f = page.locator('form[action="?/password"]');
	await f.getByLabel('E-mail').fill(state.user.email);
	await f.locator('input[name=password]').fill(state.user.password);
	await f.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL(/\/w\//);
	await page.goto(`${state.workspaceUrl()}/molecules/new`);
	await page.getByLabel('Name').fill(names.molecule);
	await page.getByTestId('xyz-file').setInputFiles({ name: 'so2.xyz', mimeType: 'text/plain', buffer: Buffer.from(SO2_XYZ) });
	await page.getByRole('button', { name: 'Create molecule' }).click();
	await page.waitForURL(/\/molecules\/[0-9a-f-]{36}$/);
	const moleculeUrl = new URL(page.url()).pathname;
	await page.getByTestId('new-study').click();
	await page.waitForURL(/\/studies\/new$/);
	await page.getByLabel('Study name').fill(names.study);
	await page.getByLabel('Engine version').fill('7.0.2');
	await page.getByLabel('Basis set').fill('aug-cc-pVDZ');
	await page.getByRole('button', { name: 'Create study' }).click();
	await page.waitForURL(/\/studies\/[0-9a-f-]{36}$/);
	return moleculeUrl;
}

export function registerTuningSteps(state: TuningStepsState): void {
	let ctx: BrowserContext;
	let page: Page;
	let moleculeUrl = '';
	let gammaStar = '';

	step('tuning: create SO2 and a tuning study', async () => {
		ctx = await newContext();
		page = await ctx.newPage();
		page.on('pageerror', (e) => state.consoleErrors.push(`tuning: ${e.message}`));
		moleculeUrl = await signInAndCreateSo2Study(page, state, { molecule: 'Sulfur dioxide', study: 'alpha 0.2, aug-cc-pVDZ' });
		await page.getByTestId('scan-import').waitFor();
		await shot(page, '10-tuning-new-study');
	});

	step('tuning: upload the real scan, preview, store; gamma* and the chart appear', async () => {
		await page.getByTestId('scan-file').setInputFiles({ name: 'so2-scan.csv', mimeType: 'text/csv', buffer: SCAN });
		await page.getByTestId('mapping-ok').waitFor();
		await page.getByTestId('import-preview').waitFor();
		await shot(page, '11-tuning-import-preview');
		await page.getByRole('button', { name: /^Store \d+ point/ }).click();
		await page.getByTestId('imported').waitFor();
		await page.locator('[data-testid="tuning-chart"][data-status="ready"]').waitFor({ timeout: 20_000 });
		gammaStar = (await page.getByTestId('gamma-star').textContent()) ?? '';
		const g = Number(gammaStar);
		// The same fixture's gamma* is checked in src/lib/science/tuning/nwchem-scan.spec.ts; here only its range.
		assert(g > 0.2 && g < 0.5, `gamma* shown as ${gammaStar}`);
		await shot(page, '12-tuning-study');
	});

	step('tuning: excluding a point recomputes at once; saving stores it with its reason', async () => {
		const row = page.locator('tr[data-gamma="0.15"]');
		await row.getByRole('checkbox').uncheck();
		await row.getByRole('textbox').fill('edge point, checking the fit without it');
		const after = (await page.getByTestId('gamma-star').textContent()) ?? '';
		assert(after.length > 0, 'gamma* disappeared after excluding a point');
		await page.getByRole('button', { name: 'Save result' }).click();
		await page.getByText('Result saved.').waitFor();
		assert((await page.locator('tr[data-gamma="0.15"]').getByRole('checkbox').isChecked()) === false, 'exclusion not stored');
		assert((await page.getByTestId('saved-state').textContent())?.includes('Same as the saved result'), 'saved result differs from the page');
		await page.getByTestId('activity').getByText(/excluded the scan point at gamma 0.15/).waitFor();
		gammaStar = (await page.getByTestId('gamma-star').textContent()) ?? '';
		await shot(page, '13-tuning-saved');
	});

	step('tuning: mark current; the molecule page shows the tuned parameters', async () => {
		await page.getByRole('button', { name: 'Mark current' }).click();
		await page.getByTestId('is-current').waitFor();
		await page.goto(moleculeUrl);
		const shown = (await page.getByTestId('current-gamma').textContent()) ?? '';
		assert(shown.startsWith(gammaStar), `molecule page shows gamma* ${shown}, study shows ${gammaStar}`);
		await page.getByTestId('current-tuning').getByRole('link').waitFor();
		await shot(page, '14-tuning-molecule');
		await ctx.close();
	});
}
