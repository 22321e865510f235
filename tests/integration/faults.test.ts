// Faults: a PostgreSQL cluster that stops and comes back, and a mail server that is down.
// This file never touches the shared test cluster (other files use it in parallel runs): it makes a
// throwaway cluster in a temp folder, migrates it, and starts its own instance of the built server
// (`node build`) against it, with an SMTP port where nothing listens until the fake SMTP is started.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { sql, type Migration } from 'kysely';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../src/lib/server/db/create-db';
import { migrateToLatest } from '../../src/lib/server/db/migrate';
import { signUp } from '../../src/lib/server/services/accounts';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { createMolecule } from '../../src/lib/server/services/molecules';
import { freePort, giveToPostgres, initCluster, pgBinDir, startPg, stopPg } from '../../scripts/pg-local.mjs';
import { WATER_XYZ } from './fixtures';

const ROOT = resolve(__dirname, '..', '..');
const migrations = import.meta.glob<Migration>('/migrations/*.ts', { eager: true });
const PASSWORD = 'fault-test-password-1';
/** No request may take longer than this while the database is down (the pool's connect timeout is 5 s). */
const BOUND_MS = 8000;

let binDir: string;
let dir: string;
let pgdata: string;
let pgPort: number;
let dbUrl: string;
let db: Db;
let app: ChildProcess | undefined;
let smtp: ChildProcess | undefined;
let base: string;
let smtpPort: number;
let mailDir: string;
let cookie: string;
let apiToken: string;
let ws: string;
let appLog = '';

async function waitFor<T>(what: string, fn: () => Promise<T | undefined>, timeoutMs = 30_000): Promise<T> {
	const t0 = Date.now();
	let last: unknown;
	while (Date.now() - t0 < timeoutMs) {
		try {
			const v = await fn();
			if (v !== undefined) return v;
		} catch (e) {
			last = e;
		}
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`${what} did not happen within ${timeoutMs / 1000} s${last ? ` (${(last as Error).message})` : ''}\n--- server log ---\n${appLog.slice(-3000)}`);
}

interface Timed {
	status: number;
	ms: number;
	body: string;
	type: string;
	retryAfter: string | null;
}

type Init = Omit<RequestInit, 'headers'> & { headers?: Record<string, string> };

async function timed(path: string, init: Init = {}): Promise<Timed> {
	const t0 = performance.now();
	const r = await fetch(`${base}${path}`, { redirect: 'manual', signal: AbortSignal.timeout(BOUND_MS + 5000), ...init, headers: { origin: base, ...(init.headers ?? {}) } });
	const body = await r.text();
	return { status: r.status, ms: performance.now() - t0, body, type: r.headers.get('content-type') ?? '', retryAfter: r.headers.get('retry-after') };
}

const asUser = (path: string, init: Init = {}) => timed(path, { ...init, headers: { cookie, ...(init.headers ?? {}) } });
const asToken = (path: string, init: Init = {}) => timed(path, { ...init, headers: { authorization: `Bearer ${apiToken}`, ...(init.headers ?? {}) } });

function expectDown(r: Timed, what: string) {
	expect(r.status, `${what}: ${r.body.slice(0, 300)}`).toBe(503);
	expect(r.retryAfter, what).toMatch(/^\d+$/);
	expect(r.ms, what).toBeLessThan(BOUND_MS);
}

function expectApiDown(r: Timed, what: string) {
	expectDown(r, what);
	const body = JSON.parse(r.body);
	expect(body.error.type, what).toBe('database_unavailable');
	expect(body.error.message, what).toMatch(/database is not reachable/);
}

function startApp(port: number) {
	const origin = `http://127.0.0.1:${port}`;
	const env = {
		...process.env,
		DATABASE_URL: dbUrl,
		APP_DATABASE_URL: '',
		PORT: String(port),
		HOST: '127.0.0.1',
		ORIGIN: origin,
		PUBLIC_ORIGIN: origin,
		AUTH_SECRET: randomBytes(32).toString('base64url'),
		SMTP_HOST: '127.0.0.1',
		SMTP_PORT: String(smtpPort),
		MAIL_DIR: mailDir,
		KAPPALINE_DEV_MAIL: '1',
		KAPPALINE_TEST: '1',
		BODY_SIZE_LIMIT: '5M'
	};
	app = spawn(process.execPath, [join(ROOT, 'build')], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
	const keep = (c: Buffer) => {
		appLog = (appLog + c.toString()).slice(-20_000);
	};
	app.stdout?.on('data', keep);
	app.stderr?.on('data', keep);
	return origin;
}

/** SIGTERM, then SIGKILL if the process is still there after 5 s (a server with hung requests can linger). */
async function stopChild(child: ChildProcess | undefined) {
	if (!child?.pid || child.exitCode !== null || child.signalCode !== null) return;
	const exited = new Promise<void>((r) => child.once('exit', () => r()));
	child.kill('SIGTERM');
	const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
	await exited;
	clearTimeout(timer);
}

beforeAll(async () => {
	if (!existsSync(join(ROOT, 'build', 'index.js'))) throw new Error('build/index.js is missing: run `npm run build` (npm test builds before Vitest)');
	const found = pgBinDir();
	if (!found) throw new Error('PostgreSQL server binaries not found under /usr/lib/postgresql (npm test installs them)');
	binDir = found;
	dir = mkdtempSync(join(tmpdir(), 'kappaline-faults-'));
	giveToPostgres(dir);
	pgdata = join(dir, 'pgdata');
	mailDir = join(dir, 'mail');
	initCluster(binDir, pgdata);
	pgPort = await freePort();
	startPg(binDir, pgdata, pgPort, { fast: true });
	dbUrl = `postgres://postgres@127.0.0.1:${pgPort}/postgres`;
	db = createDb(dbUrl, { max: 2 });
	await migrateToLatest(db, Object.fromEntries(Object.entries(migrations).map(([f, m]) => [f.replace(/^.*\/|\.ts$/g, ''), m])));
	const email = `fault-owner-${Date.now()}@example.test`;
	const u = await signUp(db, { email, password: PASSWORD, name: 'Fault owner' });
	ws = u.workspaceId;
	await createMolecule(db, { userId: u.userId, workspaceId: ws, role: 'owner' }, { name: 'Water', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' });
	apiToken = (await createApiToken(db, u.userId, { workspaceId: ws, name: 'fault test', role: 'owner', expiresInDays: 1 })).token;

	smtpPort = await freePort(); // nothing listens here until the fake SMTP is started
	base = startApp(await freePort());
	await waitFor('the server answering /healthz', async () => ((await fetch(`${base}/healthz`)).ok ? true : undefined));
	const r = await fetch(`${base}/auth/callback/credentials`, {
		method: 'POST',
		redirect: 'manual',
		headers: { 'content-type': 'application/x-www-form-urlencoded', origin: base },
		body: new URLSearchParams({ email, password: PASSWORD, callbackUrl: '/' })
	});
	cookie = r.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.join('; ');
	if (!cookie.includes('session-token=')) throw new Error(`sign-in failed (${r.status})`);
}, 120_000);

/** Last resort if the worker ends without running afterAll: nothing of ours may outlive it. */
function killEverythingNow() {
	for (const c of [app, smtp]) if (c?.pid && c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
	if (binDir && pgdata && existsSync(join(pgdata, 'postmaster.pid'))) stopPg(binDir, pgdata, 'immediate');
}
process.once('exit', killEverythingNow);

afterAll(async () => {
	try {
		await Promise.all([stopChild(app), stopChild(smtp)]);
		await db?.destroy().catch(() => undefined);
	} finally {
		killEverythingNow();
		process.removeListener('exit', killEverythingNow);
		if (dir) rmSync(dir, { recursive: true, force: true });
	}
});

describe('PostgreSQL stops and comes back while the server runs', () => {
	const figures: Record<string, number> = {};

	it('answers normally while the database is up', async () => {
		const h = await timed('/healthz');
		expect(h.status).toBe(200);
		expect(JSON.parse(h.body)).toMatchObject({ ok: true, database: 'up' });
		expect((await asUser(`/api/v1/workspaces/${ws}/molecules`)).status).toBe(200);
		expect((await asToken(`/api/v1/workspaces/${ws}/molecules`)).status).toBe(200);
		expect((await asUser(`/w/${ws}/molecules`, { headers: { accept: 'text/html' } })).status).toBe(200);
	});

	it('fails requests in flight and after the stop with a clean 503, and the process stays up', async () => {
		// Hold a lock so the app's molecule queries are in flight (waiting inside PostgreSQL) when the cluster stops.
		const locker = new pg.Client({ connectionString: dbUrl });
		locker.on('error', () => undefined);
		await locker.connect();
		await locker.query('begin');
		await locker.query('lock table molecule in access exclusive mode');
		let stopAt = 0;
		const doneAfterStop = (p: Promise<Timed>) => p.then((r) => ({ ...r, afterStopMs: performance.now() - stopAt }));
		const inflight = [
			doneAfterStop(asUser(`/api/v1/workspaces/${ws}/molecules`)),
			doneAfterStop(asToken(`/api/v1/workspaces/${ws}/molecules`)),
			doneAfterStop(asUser(`/w/${ws}/molecules`, { headers: { accept: 'text/html' } })),
			doneAfterStop(asUser(`/w/${ws}/molecules/__data.json`))
		];
		const settled = Promise.allSettled(inflight); // no unhandled rejection if a step below fails first
		try {
			// Poll from another session: pg_stat_activity is a snapshot that stays fixed inside the locker's transaction.
			await waitFor('four app queries waiting on the lock', async () => {
				const r = await sql<{ n: number }>`select count(*)::int as n from pg_stat_activity where wait_event_type = 'Lock' and datname = current_database()`.execute(db);
				return r.rows[0].n >= 4 ? true : undefined;
			});
			stopAt = performance.now();
			const stop = stopPg(binDir, pgdata, 'fast');
			figures.stopSeconds = (performance.now() - stopAt) / 1000;
			expect(stop.status, stop.stderr?.toString()).toBe(0);
		} finally {
			await locker.end().catch(() => undefined);
			await settled;
		}
		const [api, tok, page, data] = await Promise.all(inflight);
		figures.inflightMaxMsAfterStop = Math.max(api.afterStopMs, tok.afterStopMs, page.afterStopMs, data.afterStopMs);
		expectApiDown(api, 'API request in flight');
		expectApiDown(tok, 'token API request in flight');
		expectDown(page, 'page in flight');
		expect(page.type).toContain('text/html');
		expect(page.body).toMatch(/database is unavailable/i);
		expect(page.body).toMatch(/try again/i);
		expectDown(data, 'data request in flight');

		// After the stop: reads, writes, token auth (which needs the database in the hook), form actions, health.
		const after = [
			['API read', await asUser(`/api/v1/workspaces/${ws}/molecules`)],
			['API write', await asUser(`/api/v1/workspaces/${ws}/molecules`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Lost?', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' }) })],
			['token API read', await asToken(`/api/v1/workspaces/${ws}/molecules`)]
		] as const;
		for (const [what, r] of after) expectApiDown(r, what);
		const page2 = await asUser(`/w/${ws}/molecules`, { headers: { accept: 'text/html' } });
		expectDown(page2, 'page after the stop');
		expect(page2.body).toMatch(/database is unavailable/i);
		const action = await asUser(`/w/${ws}/members?/rename`, { method: 'POST', headers: { accept: 'application/json', 'x-sveltekit-action': 'true' }, body: new URLSearchParams({ name: 'x', version: '1' }) });
		expectDown(action, 'form action after the stop');
		expect(JSON.parse(action.body)).toMatchObject({ type: 'error', error: { message: expect.stringMatching(/database/) } });
		const health = await timed('/healthz');
		expectDown(health, '/healthz');
		expect(JSON.parse(health.body)).toMatchObject({ ok: false, database: 'down' });
		figures.downMaxMs = Math.max(...after.map(([, r]) => r.ms), page2.ms, action.ms, health.ms);
		expect(app?.exitCode).toBeNull();
		expect(appLog).not.toMatch(/\[error [0-9a-f]{8}\]/); // every failure was recognised as "database down", none fell through as a 500
	});

	it('recovers by itself when the database is back, without a server restart', async () => {
		const pid = app?.pid;
		const t0 = performance.now();
		startPg(binDir, pgdata, pgPort, { fast: true });
		await waitFor('/healthz reporting the database up', async () => ((await timed('/healthz')).status === 200 ? true : undefined), 20_000);
		figures.recoverySeconds = (performance.now() - t0) / 1000;
		expect((await asUser(`/api/v1/workspaces/${ws}/molecules`)).status).toBe(200);
		expect((await asToken(`/api/v1/workspaces/${ws}/molecules`)).status).toBe(200);
		expect((await asUser(`/w/${ws}/molecules`, { headers: { accept: 'text/html' } })).status).toBe(200);
		const created = await asUser(`/api/v1/workspaces/${ws}/molecules`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'After restart', formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER_XYZ, smiles: '', notes: '' }) });
		expect(created.status, created.body).toBe(201);
		// Nothing from the failed write while the database was down was stored.
		const names = (await db.selectFrom('molecule').select('name').where('workspace_id', '=', ws).execute()).map((m) => m.name).sort();
		expect(names).toEqual(['After restart', 'Water']);
		expect(app?.pid).toBe(pid);
		expect(app?.exitCode).toBeNull();
		console.log(`[faults] figures: ${JSON.stringify(figures)}`);
	});
});

describe('mail server down', () => {
	const postAction = (action: string, fields: Record<string, string>) =>
		asUser(`/w/${ws}/members?/${action}`, { method: 'POST', headers: { accept: 'application/json', 'x-sveltekit-action': 'true' }, body: new URLSearchParams(fields) });

	it('stores an invitation marked unsent, and a resend delivers it once SMTP is up', async () => {
		const invitee = `invitee-${Date.now()}@example.test`;
		const first = await postAction('invite', { email: invitee, role: 'editor' });
		expect(first.status, first.body).toBe(200);
		expect(first.body).toContain(invitee);
		expect(first.body).toMatch(/ECONNREFUSED/);
		const row1 = await db.selectFrom('invitation').selectAll().where('workspace_id', '=', ws).where('email', '=', invitee).executeTakeFirstOrThrow();
		expect(row1.sent_at).toBeNull();
		expect(row1.send_attempts).toBe(1);
		expect(row1.last_send_error).toMatch(/ECONNREFUSED|connect/i);
		const page = await asUser(`/w/${ws}/members`, { headers: { accept: 'text/html' } });
		expect(page.body).toMatch(/not sent/);
		expect(page.body).toContain('Send again');

		smtp = spawn(process.execPath, [join(ROOT, 'scripts', 'fake-smtp.mjs')], { cwd: ROOT, env: { ...process.env, SMTP_PORT: String(smtpPort), MAIL_DIR: mailDir, SMTP_PORT_FILE: join(dir, 'smtp-port') }, stdio: 'ignore' });
		await waitFor('the fake SMTP server listening', async () => (existsSync(join(dir, 'smtp-port')) && Number(readFileSync(join(dir, 'smtp-port'), 'utf8')) === smtpPort ? true : undefined));

		const again = await postAction('resendInvitation', { id: row1.id });
		expect(again.status, again.body).toBe(200);
		const row2 = await db.selectFrom('invitation').selectAll().where('id', '=', row1.id).executeTakeFirstOrThrow();
		expect(row2.sent_at).not.toBeNull();
		expect(row2.send_attempts).toBe(2);
		expect(row2.last_send_error).toBeNull();
		expect(row2.token_hash).not.toBe(row1.token_hash); // a new link
		const mail = await waitFor('the invitation e-mail in the mail folder', async () => {
			const f = existsSync(mailDir) ? readdirSync(mailDir).find((n) => n.endsWith('.json')) : undefined;
			return f ? (JSON.parse(readFileSync(join(mailDir, f), 'utf8')) as { to: string[]; text: string }) : undefined;
		});
		expect(mail.to).toEqual([invitee]);
		const link = /https?:\/\/\S+\/invite\/\S+/.exec(mail.text)?.[0];
		expect(link).toBeDefined();
		const invitePage = await timed(new URL(link!).pathname, { headers: { accept: 'text/html' } });
		expect(invitePage.status).toBe(200);
		expect(invitePage.body).toContain('Join');
		const activity = await db.selectFrom('activity').select('summary').where('workspace_id', '=', ws).where('entity_id', '=', row1.id).orderBy('id').execute();
		expect(activity.map((a) => a.summary)).toEqual([`invited ${invitee} as editor`, expect.stringMatching(/not sent \(attempt 1\)/), `invitation e-mail sent to ${invitee} (attempt 2)`]);
		const listed = await asUser(`/w/${ws}/members`, { headers: { accept: 'text/html' } });
		expect(listed.body).not.toMatch(/not sent/);
	});

	it('refuses a resend for an accepted invitation and for one of another workspace', async () => {
		const other = await signUp(db, { email: `other-${Date.now()}@example.test`, password: PASSWORD, name: 'Other' });
		const foreign = await db
			.insertInto('invitation')
			.values({ workspace_id: other.workspaceId, email: 'x@example.test', role: 'viewer', token_hash: randomBytes(16).toString('hex'), expires_at: new Date(Date.now() + 86_400_000) })
			.returning('id')
			.executeTakeFirstOrThrow();
		const r = await postAction('resendInvitation', { id: foreign.id });
		expect(JSON.parse(r.body)).toMatchObject({ type: 'failure', status: 404 });
		const accepted = await db
			.insertInto('invitation')
			.values({ workspace_id: ws, email: 'done@example.test', role: 'viewer', token_hash: randomBytes(16).toString('hex'), expires_at: new Date(Date.now() + 86_400_000), accepted_at: new Date() })
			.returning('id')
			.executeTakeFirstOrThrow();
		const r2 = await postAction('resendInvitation', { id: accepted.id });
		expect(JSON.parse(r2.body)).toMatchObject({ type: 'failure', status: 400 });
		expect(r2.body).toContain('already accepted');
	});
});
