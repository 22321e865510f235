#!/usr/bin/env node
// Kappaline's bootstrap: `npm start` and `npm test` both land here.
// Uses only Node's built-ins, so it runs before node_modules exists.
//
//   start: deps -> PostgreSQL (project-local cluster) -> migrate -> seed demo -> fake SMTP -> build -> serve
//   test:  deps -> PostgreSQL (separate test cluster) -> Chromium, NWChem -> svelte-check -> lint -> build
//          -> server on a fresh database -> Vitest (unit + integration) -> engine runs (NWChem)
//          -> end-to-end in Chromium
import { spawn, spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { asPg, freePort, giveToPostgres, initCluster, isRoot, pgBinDir, portIsFree, startPg } from './pg-local.mjs';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const DATA = join(ROOT, '.data');
const mode = process.argv[2] ?? 'start';
const children = [];
let stopping = false;

const log = (msg) => console.log(`[kappaline] ${msg}`);
const elapsed = (t0) => `${((Date.now() - t0) / 1000).toFixed(1)} s`;

function run(cmd, args, opts = {}) {
	const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: ROOT, ...opts });
	if (r.error) throw r.error;
	if (r.status !== 0 && !opts.allowFail) throw new Error(`${cmd} ${args.join(' ')} exited with ${r.status}`);
	return r.status ?? 1;
}

function bin(name) {
	return join(ROOT, 'node_modules', '.bin', name);
}

// ---------------------------------------------------------------- dependencies
function ensureDeps() {
	const lock = readFileSync(join(ROOT, 'package-lock.json'));
	const hash = createHash('sha256').update(lock).update(readFileSync(join(ROOT, 'package.json'))).digest('hex');
	const stamp = join(ROOT, 'node_modules', '.kappaline-deps');
	if (existsSync(stamp) && readFileSync(stamp, 'utf8') === hash) return;
	const t0 = Date.now();
	log('installing dependencies (npm ci) ...');
	run('npm', ['ci', '--no-audit', '--no-fund']);
	writeFileSync(stamp, hash);
	log(`dependencies installed in ${elapsed(t0)}`);
}

// ---------------------------------------------------------------- system packages
function aptInstall(pkgs, before) {
	if (!isRoot) throw new Error(`missing ${pkgs.join(', ')}: install them with your package manager (not root, so not installing)`);
	const t0 = Date.now();
	log(`installing ${pkgs.join(', ')} from Debian's packages ...`);
	before?.();
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	run('apt-get', ['update', '-qq'], { env });
	run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...pkgs], { env });
	log(`installed ${pkgs.join(', ')} in ${elapsed(t0)}`);
}

function ensurePostgresBinaries() {
	let dir = pgBinDir();
	if (dir) return dir;
	aptInstall(['postgresql'], () => {
		// Do not let the package create and start a system-wide cluster: we run our own.
		mkdirSync('/etc/postgresql-common/createcluster.d', { recursive: true });
		writeFileSync('/etc/postgresql-common/createcluster.d/kappaline.conf', 'create_main_cluster = false\n');
	});
	dir = pgBinDir();
	if (!dir) throw new Error('PostgreSQL server binaries not found after install');
	return dir;
}

function ensureChromium() {
	if (existsSync('/usr/bin/chromium')) return;
	aptInstall(['chromium']);
}

/** Is a command on the PATH? */
function onPath(name) {
	return (process.env.PATH ?? '').split(':').some((d) => d && existsSync(join(d, name)));
}

/**
 * NWChem and mpirun for the engine runs (Debian's `nwchem` package pulls in Open MPI). Returns true
 * when they are there. Missing and not root: under CI=true a hard failure, otherwise a loud warning
 * and the engine step is skipped.
 */
function ensureNwchem() {
	if (onPath('nwchem') && onPath('mpirun')) return true;
	if (isRoot) {
		aptInstall(['nwchem']);
		if (onPath('nwchem') && onPath('mpirun')) return true;
		throw new Error('nwchem or mpirun still not on the PATH after installing Debian\'s nwchem package');
	}
	const msg = 'NWChem (nwchem and mpirun) is not installed and this is not root, so it cannot be installed here: apt-get install nwchem';
	if (process.env.CI === 'true') throw new Error(`${msg} (CI=true: the engine runs are required)`);
	console.warn(`\n[kappaline] ${'!'.repeat(70)}\n[kappaline] WARNING: ${msg}.\n[kappaline] The step "engine runs (NWChem)" is SKIPPED: the decks are not checked against the engine.\n[kappaline] ${'!'.repeat(70)}\n`);
	return false;
}

// ---------------------------------------------------------------- PostgreSQL cluster
async function startCluster(name) {
	const binDir = ensurePostgresBinaries();
	const dir = join(DATA, name);
	const pgdata = join(dir, 'pgdata');
	const portFile = join(dir, 'port');
	mkdirSync(dir, { recursive: true });
	giveToPostgres(dir);
	if (!existsSync(join(pgdata, 'PG_VERSION'))) {
		const t0 = Date.now();
		initCluster(binDir, pgdata);
		log(`initialised PostgreSQL cluster in ${pgdata} (${elapsed(t0)})`);
	}
	let port = existsSync(portFile) ? Number(readFileSync(portFile, 'utf8')) : 0;
	const status = asPg(join(binDir, 'pg_ctl'), ['-D', pgdata, 'status']);
	const ready = () => asPg(join(binDir, 'pg_isready'), ['-h', '127.0.0.1', '-p', String(port), '-t', '2']).status === 0;
	if (status.status === 0 && port && ready()) {
		log(`reusing running PostgreSQL on 127.0.0.1:${port}`);
		return { binDir, pgdata, port, startedHere: false };
	}
	if (status.status === 0) asPg(join(binDir, 'pg_ctl'), ['-D', pgdata, '-m', 'immediate', 'stop']);
	const stalePid = join(pgdata, 'postmaster.pid');
	if (existsSync(stalePid)) rmSync(stalePid);
	if (!port || !(await portIsFree(port))) port = await freePort();
	writeFileSync(portFile, String(port));
	const t0 = Date.now();
	try {
		startPg(binDir, pgdata, port, { fast: name.includes('test') });
	} catch (e) {
		const logText = existsSync(join(pgdata, 'server.log')) ? readFileSync(join(pgdata, 'server.log'), 'utf8').slice(-2000) : '';
		throw new Error(`${e.message}\n${logText}`);
	}
	log(`PostgreSQL started on 127.0.0.1:${port} (${elapsed(t0)})`);
	return { binDir, pgdata, port, startedHere: true };
}

function stopCluster(cluster) {
	if (!cluster?.startedHere) return;
	asPg(join(cluster.binDir, 'pg_ctl'), ['-D', cluster.pgdata, '-m', 'fast', '-w', 'stop']);
	log('PostgreSQL stopped');
}

function psql(cluster, sqlText, db = 'postgres') {
	const r = asPg(join(cluster.binDir, 'psql'), ['-h', '127.0.0.1', '-p', String(cluster.port), '-U', 'postgres', '-d', db, '-v', 'ON_ERROR_STOP=1', '-qAtc', sqlText]);
	if (r.status !== 0) throw new Error(`psql failed: ${r.stderr}`);
	return r.stdout.trim();
}

function ensureDatabase(cluster, name, { fresh = false } = {}) {
	if (fresh) psql(cluster, `drop database if exists ${name} with (force)`);
	const exists = psql(cluster, `select 1 from pg_database where datname = '${name}'`);
	if (!exists) psql(cluster, `create database ${name}`);
	return `postgres://postgres@127.0.0.1:${cluster.port}/${name}`;
}

// ---------------------------------------------------------------- processes
function startChild(name, cmd, args, env) {
	const child = spawn(cmd, args, { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'inherit', 'inherit'] });
	children.push({ name, child });
	child.on('exit', (code, signal) => {
		if (!stopping) {
			log(`${name} exited (${signal ?? code})`);
			if (name === 'app') shutdown(typeof code === 'number' && code !== 0 ? code : 1);
		}
	});
	return child;
}

async function waitForHttp(url, timeoutMs = 60_000) {
	const t0 = Date.now();
	while (Date.now() - t0 < timeoutMs) {
		try {
			const r = await fetch(url);
			if (r.status < 500) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 250));
	}
	throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

async function waitForPortFile(file, timeoutMs = 15_000) {
	const t0 = Date.now();
	while (Date.now() - t0 < timeoutMs) {
		// The file can exist before its content is written: wait for a real port number.
		const port = existsSync(file) ? Number(readFileSync(file, 'utf8')) : 0;
		if (Number.isInteger(port) && port > 0) return port;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`fake SMTP server did not start (no ${file})`);
}

async function startFakeSmtp(mailDir) {
	mkdirSync(mailDir, { recursive: true });
	const portFile = join(mailDir, '.port');
	if (existsSync(portFile)) rmSync(portFile);
	startChild('fake-smtp', process.execPath, [join(ROOT, 'scripts', 'fake-smtp.mjs')], { MAIL_DIR: mailDir, SMTP_PORT_FILE: portFile });
	return waitForPortFile(portFile);
}

let cluster = null;
function shutdown(code = 0) {
	if (stopping) return;
	stopping = true;
	for (const { child } of children.reverse()) {
		if (child.exitCode === null && child.pid) {
			try {
				process.kill(child.pid, 'SIGTERM');
			} catch {
				/* already gone */
			}
		}
	}
	const wait = Date.now();
	const done = () => {
		const alive = children.some(({ child }) => child.exitCode === null && child.signalCode === null);
		if (alive && Date.now() - wait < 8000) return setTimeout(done, 100);
		stopCluster(cluster);
		process.exit(code);
	};
	done();
}

function secret(file) {
	if (existsSync(file)) return readFileSync(file, 'utf8').trim();
	const s = randomBytes(32).toString('base64url');
	mkdirSync(dirname(file), { recursive: true });
	writeFileSync(file, s, { mode: 0o600 });
	return s;
}

// ---------------------------------------------------------------- commands
/** Starts the built app (`node build`) on a free port with a fresh fake SMTP; resolves once /healthz answers. */
async function startBuiltApp(databaseUrl, mailFolder, extraEnv = {}) {
	const mailDir = join(DATA, mailFolder);
	rmSync(mailDir, { recursive: true, force: true });
	const smtpPort = await startFakeSmtp(mailDir);
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const appEnv = {
		DATABASE_URL: databaseUrl,
		PORT: String(port),
		HOST: '127.0.0.1',
		ORIGIN: origin,
		AUTH_SECRET: randomBytes(32).toString('base64url'),
		SMTP_HOST: '127.0.0.1',
		SMTP_PORT: String(smtpPort),
		MAIL_DIR: mailDir,
		PUBLIC_ORIGIN: origin,
		BODY_SIZE_LIMIT: '52M',
		...extraEnv
	};
	startChild('app', process.execPath, ['build'], appEnv);
	await waitForHttp(`${origin}/healthz`);
	return { origin, appEnv };
}

async function start() {
	const t0 = Date.now();
	ensureDeps();
	cluster = await startCluster('pg');
	const databaseUrl = ensureDatabase(cluster, 'kappaline');
	const env = { DATABASE_URL: databaseUrl };
	run(bin('svelte-kit'), ['sync']); // generates the tsconfig paths ($lib) that tsx resolves
	run(bin('tsx'), ['scripts/migrate.ts'], { env: { ...process.env, ...env } });
	run(bin('tsx'), ['scripts/seed.ts'], { env: { ...process.env, ...env } });
	const mailDir = join(DATA, 'mail');
	const smtpPort = await startFakeSmtp(mailDir);
	log('building the app ...');
	run(bin('vite'), ['build', '--logLevel', 'warn']);
	const port = Number(process.env.PORT) || (await freePort());
	const origin = `http://127.0.0.1:${port}`;
	startChild('app', process.execPath, ['build'], {
		...env,
		PORT: String(port),
		HOST: '127.0.0.1',
		ORIGIN: origin,
		AUTH_SECRET: process.env.AUTH_SECRET ?? secret(join(DATA, 'auth-secret')),
		SMTP_HOST: '127.0.0.1',
		SMTP_PORT: String(smtpPort),
		MAIL_DIR: mailDir,
		KAPPALINE_DEV_MAIL: '1',
		PUBLIC_ORIGIN: origin,
		BODY_SIZE_LIMIT: '52M'
	});
	await waitForHttp(`${origin}/healthz`);
	const demo = JSON.parse(readFileSync(join(ROOT, 'scripts', 'demo-credentials.json'), 'utf8'));
	console.log(`
  Kappaline is running at ${origin}   (ready in ${elapsed(t0)})
  Demo sign-in:   ${demo.email}   /   ${demo.password}
  Captured e-mail: ${origin}/dev/mail   (files in .data/mail)
  Press Ctrl-C to stop the app and its PostgreSQL cluster.
`);
}

async function test() {
	const t0 = Date.now();
	const steps = [];
	const step = (name, fn) => {
		const s = Date.now();
		const status = fn();
		steps.push({ name, status, seconds: (Date.now() - s) / 1000 });
		log(`${name}: ${status === 0 ? 'ok' : 'FAILED'} (${elapsed(s)})`);
		return status;
	};
	ensureDeps();
	ensureChromium();
	const haveNwchem = ensureNwchem();
	cluster = await startCluster('pg-test');
	const appDbUrl = ensureDatabase(cluster, 'kappaline_e2e', { fresh: true });
	const intDbUrl = ensureDatabase(cluster, 'kappaline_int', { fresh: true });
	const env = { ...process.env, NO_COLOR: '1', FORCE_COLOR: '0' };

	let failed = 0;
	failed += step('svelte-check', () => run(bin('svelte-kit'), ['sync'], { allowFail: true }) || run(bin('svelte-check'), ['--tsconfig', './tsconfig.json', '--fail-on-warnings', '--output', 'human'], { allowFail: true, env })) ? 1 : 0;
	failed += step('lint', () => run(bin('eslint'), ['.'], { allowFail: true, env })) ? 1 : 0;
	failed += step('build', () => run(bin('vite'), ['build', '--logLevel', 'warn'], { allowFail: true, env })) ? 1 : 0;
	if (failed) return finish(1);

	run(bin('tsx'), ['scripts/migrate.ts'], { env: { ...env, DATABASE_URL: appDbUrl } });
	const { origin, appEnv } = await startBuiltApp(appDbUrl, 'mail-test', { KAPPALINE_DEV_MAIL: '1', KAPPALINE_TEST: '1' });

	const testEnv = { ...env, ...appEnv, DATABASE_URL: intDbUrl, APP_DATABASE_URL: appDbUrl, APP_URL: origin };
	failed += step('vitest (unit + integration)', () => run(bin('vitest'), ['run'], { allowFail: true, env: testEnv })) ? 1 : 0;
	// Real NWChem jobs on decks and bundles written by the app (tests/engine; serial, -np 1).
	if (haveNwchem) failed += step('engine runs (NWChem)', () => run(bin('vitest'), ['run', '--config', 'tests/engine/vitest.config.ts'], { allowFail: true, env })) ? 1 : 0;
	else steps.push({ name: 'engine runs (NWChem): SKIPPED, NWChem not installed', status: 0, seconds: 0 });
	failed += step('end-to-end (Chromium)', () => run(bin('tsx'), ['tests/e2e/run.ts'], { allowFail: true, env: testEnv })) ? 1 : 0;
	return finish(failed ? 1 : 0);

	function finish(code) {
		console.log('\n[kappaline] test summary');
		for (const s of steps) console.log(`  ${s.status === 0 ? 'ok    ' : 'FAILED'} ${s.name} (${s.seconds.toFixed(1)} s)`);
		console.log(`  total ${elapsed(t0)}`);
		shutdown(code);
	}
}

// `npm run bench` (not part of `npm test`): science micro-benchmarks, then HTTP load with autocannon
// against the freshly built server on a database of its own (.data/pg-bench, database kappaline_bench).
async function bench() {
	ensureDeps();
	cluster = await startCluster('pg-bench');
	const databaseUrl = ensureDatabase(cluster, 'kappaline_bench', { fresh: true });
	const env = { ...process.env, DATABASE_URL: databaseUrl };
	run(bin('svelte-kit'), ['sync']);
	run(bin('tsx'), ['scripts/migrate.ts'], { env });
	log('building the app ...');
	run(bin('vite'), ['build', '--logLevel', 'warn']);
	// The load generator is one client: lift the per-token limit (600/min) so it measures the work, not the 429s.
	const { origin } = await startBuiltApp(databaseUrl, 'mail-bench', { KAPPALINE_TOKEN_RATE_LIMIT: '100000000' });
	const status = run(bin('tsx'), ['--tsconfig', 'tsconfig.cli.json', 'bench/run.ts', ...process.argv.slice(3)], { allowFail: true, env: { ...env, APP_URL: origin } });
	shutdown(status);
}

process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

const commands = { start, test, bench };
if (!commands[mode]) {
	console.error(`usage: node scripts/kappaline-dev.mjs start|test|bench`);
	process.exit(2);
}
commands[mode]().catch((e) => {
	console.error(`[kappaline] ${e.message ?? e}`);
	shutdown(1);
});
