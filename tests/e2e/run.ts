// End-to-end: sign up, sign in by e-mail link, create a molecule from an XYZ upload, add a polymorph,
// invite a viewer, and check that the viewer sees read-only pages. Screenshots go to test-results/e2e.
import type { Page } from 'playwright-core';
import { assert, cspViolations, firstLink, newContext, runSteps, shot, step, waitForMail } from './harness';
import { registerDielectricSteps } from './steps-dielectric';
import { registerIngestSteps } from './steps-ingest';
import { registerTuningSteps } from './steps-tuning';

const run = Date.now().toString(36);
const alice = { email: `alice-${run}@example.test`, password: 'correct-horse-battery', name: 'Alice Lindqvist' };
const bob = { email: `bob-${run}@example.test`, password: 'another-long-password', name: 'Bob Okafor' };
const XYZ = `12
benzene, idealised
C 1.400 0.000 0.000
C 0.700 1.212 0.000
C -0.700 1.212 0.000
C -1.400 0.000 0.000
C -0.700 -1.212 0.000
C 0.700 -1.212 0.000
H 2.480 0.000 0.000
H 1.240 2.148 0.000
H -1.240 2.148 0.000
H -2.480 0.000 0.000
H -1.240 -2.148 0.000
H 1.240 -2.148 0.000
`;

const ctx = await newContext();
let page: Page = await ctx.newPage();
const consoleErrors: string[] = [];
page.on('pageerror', (e) => consoleErrors.push(e.message));
let workspaceUrl = '';
let moleculeUrl = '';
let inviteLink = '';

step('landing page says what the product does', async () => {
	await page.goto('/');
	await page.getByRole('heading', { name: /shrink your molecule's gap/ }).waitFor();
	await shot(page, '01-landing');
});

step('sign up creates a personal workspace', async () => {
	await page.goto('/signup');
	await page.getByLabel('Name').fill(alice.name);
	await page.getByLabel('E-mail').fill(alice.email);
	await page.locator('input[name=password]').fill(alice.password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.waitForURL(/\/w\/[0-9a-f-]+\/molecules/);
	workspaceUrl = new URL(page.url()).pathname.replace(/\/molecules.*/, '');
	assert((await page.getByTestId('signed-in-as').textContent())?.includes(alice.email), 'signed-in e-mail not shown');
	assert((await page.getByTestId('role').textContent())?.trim() === 'owner', 'new user should own the personal workspace');
});

step('sign out, then sign in with an e-mail link from the fake SMTP inbox', async () => {
	await page.getByRole('button', { name: 'Sign out' }).click();
	await page.waitForURL((u) => u.pathname === '/');
	await page.goto('/signin');
	await page.locator('form[action="?/link"]').getByLabel('E-mail').fill(alice.email);
	await page.getByRole('button', { name: 'E-mail me a link' }).click();
	await page.waitForURL(/check-email/);
	const mail = await waitForMail(alice.email, 'sign-in link');
	await page.goto(firstLink(mail.text));
	await page.waitForURL(/\/w\/[0-9a-f-]+\/molecules/);
	assert((await page.getByTestId('signed-in-as').textContent())?.includes(alice.email), 'magic link did not sign in');
});

step('a wrong password is refused with a clear message', async () => {
	const other = await newContext();
	const p = await other.newPage();
	await p.goto('/signin');
	const f = p.locator('form[action="?/password"]');
	await f.getByLabel('E-mail').fill(alice.email);
	await f.locator('input[name=password]').fill('wrong-password-123');
	await f.getByRole('button', { name: 'Sign in' }).click();
	await p.getByText('Wrong e-mail or password.').waitFor();
	await shot(p, '02-wrong-password');
	await other.close();
});

step('an XYZ with a bad line is refused, naming the line', async () => {
	await page.goto(`${workspaceUrl}/molecules/new`);
	await page.getByLabel('Name').fill('Broken benzene');
	await page.getByTestId('xyz-file').setInputFiles({ name: 'broken.xyz', mimeType: 'text/plain', buffer: Buffer.from(XYZ.replace('C -1.400 0.000 0.000', 'Xq -1.400 0.000 0.000')) });
	await page.getByRole('button', { name: 'Create molecule' }).click();
	const msg = await page.getByTestId('geometry-error').textContent();
	assert(msg?.includes('line 6'), `error should name line 6, got: ${msg}`);
	await shot(page, '02-xyz-error');
});

step('create a molecule by uploading an XYZ file', async () => {
	await page.goto(`${workspaceUrl}/molecules/new`);
	await page.getByLabel('Name').fill('Benzene test');
	await page.getByTestId('xyz-file').setInputFiles({ name: 'benzene.xyz', mimeType: 'text/plain', buffer: Buffer.from(XYZ) });
	await page.getByRole('button', { name: 'Create molecule' }).click();
	await page.waitForURL(/\/molecules\/[0-9a-f-]{36}$/);
	moleculeUrl = new URL(page.url()).pathname;
	await page.getByRole('heading', { name: 'Benzene test' }).waitFor();
	assert(await page.getByText('C6H6').first().isVisible(), 'formula C6H6 not derived from the geometry');
	await page.locator('[data-testid="molecule-viewer"][data-status="ready"]').waitFor({ timeout: 20_000 });
	await shot(page, '03-molecule');
});

step('add a polymorph; volume and density are computed', async () => {
	await page.goto(moleculeUrl);
	await page.getByText('Add a polymorph').click();
	const f = page.locator('form[action="?/addPolymorph"]');
	await f.getByLabel('Label').fill('form I');
	await f.getByLabel('Space group').fill('Pbca');
	await f.getByLabel('Z (molecules per cell)').fill('4');
	for (const [label, v] of [['a (Å)', '7.39'], ['b (Å)', '9.42'], ['c (Å)', '6.81'], ['α (°)', '90'], ['β (°)', '90'], ['γ (°)', '90']])
		await f.getByLabel(label, { exact: true }).fill(v);
	await f.getByRole('button', { name: 'Add polymorph' }).click();
	await page.waitForURL(/\/polymorphs\/[0-9a-f-]{36}$/);
	const vol = await page.getByTestId('cell-volume').textContent();
	// 7.39 × 9.42 × 6.81 = 474.06 Å^3 for an orthorhombic cell (arithmetic)
	assert(vol?.startsWith('474.0'), `cell volume shown as ${vol}`);
	await shot(page, '04-polymorph');
});

step('solid-state levels: screened parameters, Born estimate, sweep chart, measurement', async () => {
	await page.getByRole('link', { name: 'Solid-state levels' }).click();
	await page.waitForURL(/\/levels$/);
	await page.getByTestId('cautions').waitFor();
	assert((await page.getByTestId('estimate-missing').textContent())?.includes('epsilon in use'), 'missing-epsilon message not shown');
	await page.getByTestId('typed-ip').fill('9.2');
	await page.getByTestId('typed-ea').fill('-0.8');
	await page.getByTestId('epsilon-override').fill('2.5');
	// beta = 1/2.5 - 0.2 = 0.2 (science notes section 2)
	await page.getByTestId('beta').getByText('0.2000').waitFor();
	const gap = Number(await page.getByTestId('gap-solid').textContent());
	// V/Z = 474.06/4 Å^3 -> a = (3 V/(4 pi))^(1/3) = 3.0472 Å; P = 14.399645/(2a) (1 - 1/2.5) = 1.4177 eV;
	// gap = 10.0 - 2 P = 7.165 eV (hand arithmetic)
	assert(Math.abs(gap - 7.165) < 0.002, `solid gap shown as ${gap}`);
	await page.locator('[data-testid="sweep-chart"] canvas').first().waitFor();
	await page.getByText('Add a measurement').click();
	const f = page.locator('form[action="?/addMeasurement"]');
	await f.getByLabel('IP (eV)').fill('8.9');
	await f.getByLabel('EA (eV)').fill('-0.4');
	await f.getByLabel('Optical gap (eV)').fill('5.0');
	await f.getByLabel('Method').fill('UPS / IPES');
	await f.getByRole('button', { name: 'Add measurement' }).click();
	// exciton binding = (8.9 - (-0.4)) - 5.0 = 4.30 eV
	await page.getByRole('cell', { name: '4.30' }).waitFor();
	await page.getByTestId('typed-ip').fill('9.2');
	await page.getByTestId('typed-ea').fill('-0.8');
	await page.getByTestId('epsilon-override').fill('2.5');
	await page.getByTestId('level-diagram').waitFor();
	const download = page.waitForEvent('download');
	await page.getByRole('button', { name: 'Download SVG' }).click();
	assert((await download).suggestedFilename().endsWith('.svg'), 'diagram SVG not downloaded');
	await page.getByRole('button', { name: 'Preview files' }).click();
	await page.getByTestId('bundle-preview').getByRole('button', { name: 'manifest.json' }).click();
	await page.getByTestId('bundle-preview').getByText('"schemaVersion": 1').waitFor();
	const zip = page.waitForEvent('download');
	await page.getByTestId('bundle-form').getByRole('button', { name: /Download rerun bundle/ }).click();
	assert((await zip).suggestedFilename().endsWith('.zip'), 'rerun bundle not downloaded');
	// The same rerun as Psi4 inputs: the preview lists .in files whose header states the Psi4 release needed.
	await page.getByTestId('bundle-engine').selectOption('psi4');
	await page.getByRole('button', { name: 'Preview files' }).click();
	await page.getByTestId('bundle-preview').getByRole('button', { name: /neutral\.in$/ }).first().click();
	await page.getByTestId('bundle-preview').getByText(/Needs Psi4 1\.4 or newer/).first().waitFor();
	const psi4Zip = page.waitForEvent('download');
	await page.getByTestId('bundle-form').getByRole('button', { name: /Download rerun bundle/ }).click();
	assert(/-psi4-.*\.zip$/.test((await psi4Zip).suggestedFilename()), 'Psi4 rerun bundle not downloaded');
	await page.reload();
	await page.getByRole('link', { name: /kappaline-.*\.zip/ }).first().waitFor();
	await page.getByTestId('typed-ip').fill('9.2');
	await page.getByTestId('typed-ea').fill('-0.8');
	await page.getByTestId('epsilon-override').fill('2.5');
	await shot(page, '04b-levels');
});

step('the molecule list filters as you type', async () => {
	await page.goto(`${workspaceUrl}/molecules`);
	await page.getByTestId('molecule-filter').fill('zzz-no-such');
	await page.getByText('No molecules match').waitFor();
	await page.getByTestId('molecule-filter').fill('Benz');
	await page.getByRole('link', { name: 'Benzene test' }).waitFor();
});

step('invite a second user as viewer', async () => {
	await page.goto(`${workspaceUrl}/members`);
	const f = page.locator('form[action="?/invite"]');
	await f.getByLabel('E-mail').fill(bob.email);
	await f.getByLabel('Role').selectOption('viewer');
	await f.getByRole('button', { name: 'Send invitation' }).click();
	await page.getByText(`Invitation for ${bob.email} sent`).waitFor();
	inviteLink = firstLink((await waitForMail(bob.email, 'invited')).text);
	await shot(page, '05-members');
});

step('the invitee signs up, joins as viewer and finds the pages read-only', async () => {
	await ctx.clearCookies();
	page = await ctx.newPage();
	await page.goto(inviteLink);
	await page.getByRole('main').getByRole('link', { name: 'Create account' }).click();
	await page.getByLabel('Name').fill(bob.name);
	await page.getByLabel('E-mail').fill(bob.email);
	await page.locator('input[name=password]').fill(bob.password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.waitForURL(/\/invite\//);
	await page.getByRole('button', { name: 'Accept and join' }).click();
	await page.waitForURL(new RegExp(`${workspaceUrl}/molecules`));
	assert((await page.getByTestId('role').textContent())?.trim() === 'viewer', 'invitee should be a viewer');
	assert((await page.getByRole('link', { name: 'New molecule' }).count()) === 0, 'viewer sees "New molecule"');
	await page.goto(moleculeUrl);
	assert((await page.getByRole('button', { name: 'Edit' }).count()) === 0, 'viewer sees an Edit button');
	assert((await page.getByRole('button', { name: 'Delete molecule' }).count()) === 0, 'viewer sees Delete');
	await shot(page, '06-viewer-molecule');
	const r = await page.request.get(`${workspaceUrl}/molecules/new`);
	assert(r.status() === 403, `viewer opening the create page got ${r.status()}, expected 403`);
	const api = await page.request.post(`/api/v1/workspaces/${workspaceUrl.split('/')[2]}/molecules`, { data: { name: 'x', geometryXyz: XYZ } });
	assert(api.status() === 403, `viewer POST to the API got ${api.status()}, expected 403`);
});

registerDielectricSteps(consoleErrors);
registerTuningSteps({ user: alice, workspaceUrl: () => workspaceUrl, consoleErrors });
registerIngestSteps({ user: alice, workspaceUrl: () => workspaceUrl, consoleErrors });

step('no uncaught errors and no Content-Security-Policy violations in the pages', async () => {
	assert(consoleErrors.length === 0, `page errors: ${consoleErrors.join('; ')}`);
	assert(cspViolations.length === 0, `CSP violations: ${cspViolations.join('; ')}`);
});

const failed = await runSteps(async (name) => shot(page, `failed-${name}`));
await ctx.close();
process.exit(failed ? 1 : 0);
