// Project-local PostgreSQL helpers shared by the bootstrap (scripts/kappaline-dev.mjs) and tests that
// need a cluster of their own (tests/integration/faults.test.ts). Node built-ins only.
// postgres refuses to run as root, so as root every PostgreSQL binary runs through `runuser -u postgres`.
import { spawnSync, execFileSync } from 'node:child_process';
import { chmodSync, existsSync, readdirSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import { dirname, join } from 'node:path';

export const isRoot = process.getuid?.() === 0;

/** The newest Debian PostgreSQL server binaries folder, or null when none is installed. */
export function pgBinDir() {
	const base = '/usr/lib/postgresql';
	if (!existsSync(base)) return null;
	const versions = readdirSync(base)
		.filter((v) => existsSync(join(base, v, 'bin', 'initdb')))
		.sort((a, b) => Number(b) - Number(a));
	return versions.length ? join(base, versions[0], 'bin') : null;
}

/**
 * Runs a PostgreSQL binary as the postgres user when we are root.
 * @param {string} binary
 * @param {string[]} args
 * @param {import('node:child_process').SpawnSyncOptions} [opts]
 */
export function asPg(binary, args, opts = {}) {
	const cmd = isRoot ? 'runuser' : binary;
	const full = isRoot ? ['-u', 'postgres', '--', binary, ...args] : args;
	return spawnSync(cmd, full, { encoding: 'utf8', cwd: '/', ...opts });
}

/**
 * The postgres user must be able to enter every parent of a data folder.
 * @param {string} dir
 */
export function makeEnterable(dir) {
	if (!isRoot) return;
	let d = dir;
	while (d !== '/') {
		const st = statSync(d);
		if ((st.mode & 0o001) === 0) chmodSync(d, st.mode | 0o001);
		d = dirname(d);
	}
}

/**
 * Hands a folder to the postgres user (as root), so initdb can create the data folder inside it.
 * @param {string} dir
 */
export function giveToPostgres(dir) {
	if (!isRoot) return;
	const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
	const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
	makeEnterable(dir);
	spawnSync('chown', [`${uid}:${gid}`, dir]);
}

/**
 * Creates a cluster in `pgdata` (trust auth for local connections, UTF-8).
 * @param {string} binDir
 * @param {string} pgdata
 */
export function initCluster(binDir, pgdata) {
	const r = asPg(join(binDir, 'initdb'), ['-D', pgdata, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
	if (r.status !== 0) throw new Error(`initdb failed:\n${r.stdout}\n${r.stderr}`);
}

/**
 * Starts a cluster on 127.0.0.1:port with its socket inside the data folder, waiting until it accepts connections.
 * @param {string} binDir
 * @param {string} pgdata
 * @param {number} port
 * @param {{ fast?: boolean }} [opts] fast: fsync and synchronous commit off (test clusters)
 */
export function startPg(binDir, pgdata, port, opts = {}) {
	const o = `-p ${port} -k ${pgdata} -c listen_addresses=127.0.0.1` + (opts.fast ? ' -c fsync=off -c synchronous_commit=off -c full_page_writes=off' : '');
	const r = asPg(join(binDir, 'pg_ctl'), ['-D', pgdata, '-o', o, '-l', join(pgdata, 'server.log'), '-w', 'start']);
	if (r.status !== 0) throw new Error(`PostgreSQL did not start:\n${r.stdout}\n${r.stderr}`);
}

/**
 * Stops a cluster: `fast` ends sessions cleanly, `immediate` aborts like a crash.
 * @param {string} binDir
 * @param {string} pgdata
 * @param {'smart' | 'fast' | 'immediate'} [mode]
 */
export function stopPg(binDir, pgdata, mode = 'fast') {
	return asPg(join(binDir, 'pg_ctl'), ['-D', pgdata, '-m', mode, '-w', 'stop']);
}

/** A free TCP port on 127.0.0.1. @returns {Promise<number>} */
export function freePort() {
	return new Promise((res, rej) => {
		const srv = createServer();
		srv.unref();
		srv.on('error', rej);
		srv.listen(0, '127.0.0.1', () => {
			const addr = srv.address();
			const port = typeof addr === 'object' && addr ? addr.port : 0;
			srv.close(() => res(port));
		});
	});
}

/** @param {number} port @returns {Promise<boolean>} */
export function portIsFree(port) {
	return new Promise((res) => {
		const srv = createServer();
		srv.once('error', () => res(false));
		srv.listen(port, '127.0.0.1', () => srv.close(() => res(true)));
	});
}
