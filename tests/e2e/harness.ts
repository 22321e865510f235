// A small harness for the end-to-end run: Debian's Chromium driven by playwright-core,
// named steps, screenshots saved as artifacts, and a closing "N passed, N failed" line.
import { mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const APP_URL = process.env.APP_URL ?? '';
export const ARTIFACTS = join(process.cwd(), 'test-results', 'e2e');
if (!APP_URL) throw new Error('APP_URL is not set (npm test sets it)');
mkdirSync(ARTIFACTS, { recursive: true });

/** Content-Security-Policy violations reported by any page of any context (the run fails on one). */
export const cspViolations: string[] = [];

export async function newContext(): Promise<BrowserContext> {
	const ctx = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'kappaline-e2e-')), {
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		headless: true,
		baseURL: APP_URL,
		viewport: { width: 1280, height: 900 },
		args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage']
	});
	const watch = (p: Page) => p.on('console', (m) => {
		if (/Content Security Policy|Refused to (load|execute|apply|connect|frame)/.test(m.text())) cspViolations.push(`${p.url()}: ${m.text()}`);
	});
	ctx.pages().forEach(watch);
	ctx.on('page', watch);
	return ctx;
}

export async function shot(page: Page, name: string): Promise<void> {
	await page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage: true });
}

/** The newest captured message to an address, from the fake SMTP server's folder. */
export async function waitForMail(to: string, subjectIncludes: string, timeoutMs = 10_000): Promise<{ subject: string; text: string }> {
	const dir = process.env.MAIL_DIR;
	if (!dir) throw new Error('MAIL_DIR is not set');
	const t0 = Date.now();
	while (Date.now() - t0 < timeoutMs) {
		const hits = readdirSync(dir)
			.filter((f) => f.endsWith('.json'))
			.sort()
			.reverse()
			.map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')))
			.filter((m) => m.to.includes(to) && m.subject.includes(subjectIncludes));
		if (hits.length) return hits[0];
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`no e-mail to ${to} with subject containing "${subjectIncludes}" within ${timeoutMs} ms`);
}

export function firstLink(text: string): string {
	const m = text.match(/https?:\/\/\S+/);
	if (!m) throw new Error(`no link in e-mail:\n${text}`);
	return m[0];
}

export function assert(cond: unknown, message: string): asserts cond {
	if (!cond) throw new Error(message);
}

type Step = { name: string; fn: () => Promise<void> };
const steps: Step[] = [];
export const step = (name: string, fn: () => Promise<void>) => steps.push({ name, fn });

/** Runs the steps in order; after the first failure the rest are reported as failed (they depend on it). */
export async function runSteps(onFailure: (name: string) => Promise<void>): Promise<number> {
	let passed = 0;
	let failed = 0;
	let broken = false;
	for (const s of steps) {
		if (broken) {
			failed++;
			console.log(`  ✗ ${s.name} (skipped after an earlier failure)`);
			continue;
		}
		const t0 = Date.now();
		try {
			await s.fn();
			passed++;
			console.log(`  ✓ ${s.name} (${Date.now() - t0} ms)`);
		} catch (e) {
			failed++;
			broken = true;
			console.log(`  ✗ ${s.name}\n    ${(e as Error).stack ?? e}`);
			await onFailure(s.name.replace(/\W+/g, '-')).catch(() => {});
		}
	}
	console.log(`\ne2e: ${passed} passed, ${failed} failed`);
	return failed;
}
