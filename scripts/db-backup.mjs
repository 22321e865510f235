#!/usr/bin/env node
// Backups of Kappaline's database with PostgreSQL's own tools (pg_dump / pg_restore, Debian's packages).
//
//   npm run db:backup [-- --file PATH]        writes a custom-format dump (default .data/backups/<time>.dump)
//   npm run db:restore -- --file PATH          restores it, replacing what is in the database
//
// The database is DATABASE_URL, or the project-local cluster that `npm start` runs (.data/pg).
// Uses only Node's built-ins.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const mode = process.argv[2];
const { values } = parseArgs({ args: process.argv.slice(3), options: { file: { type: 'string' } } });

function pgBin(name) {
	const base = '/usr/lib/postgresql';
	if (existsSync(base)) {
		const v = readdirSync(base).filter((d) => existsSync(join(base, d, 'bin', name))).sort((a, b) => Number(b) - Number(a))[0];
		if (v) return join(base, v, 'bin', name);
	}
	return name; // on PATH
}

function databaseUrl() {
	if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
	const portFile = join(ROOT, '.data', 'pg', 'port');
	if (!existsSync(portFile)) throw new Error('no DATABASE_URL and no local cluster (.data/pg): run `npm start` once, or set DATABASE_URL');
	return `postgres://postgres@127.0.0.1:${readFileSync(portFile, 'utf8').trim()}/kappaline`;
}

function run(cmd, args) {
	const r = spawnSync(cmd, args, { stdio: ['ignore', 'inherit', 'pipe'], encoding: 'utf8' });
	if (r.error) throw r.error;
	if (r.status !== 0) throw new Error(`${cmd} failed (${r.status}): ${r.stderr.trim()}`);
}

try {
	const url = databaseUrl();
	if (mode === 'backup') {
		const file = resolve(values.file ?? join(ROOT, '.data', 'backups', `kappaline-${new Date().toISOString().replace(/[:.]/g, '-')}.dump`));
		mkdirSync(dirname(file), { recursive: true });
		run(pgBin('pg_dump'), ['--format=custom', '--no-owner', '--file', file, url]);
		console.log(`backup written to ${file}`);
	} else if (mode === 'restore') {
		if (!values.file) throw new Error('give the dump to restore: npm run db:restore -- --file PATH');
		if (!existsSync(values.file)) throw new Error(`no such file: ${values.file}`);
		run(pgBin('pg_restore'), ['--clean', '--if-exists', '--no-owner', '--single-transaction', '--dbname', url, values.file]);
		console.log(`restored ${values.file}`);
	} else {
		throw new Error('usage: node scripts/db-backup.mjs backup|restore [--file PATH]');
	}
} catch (e) {
	console.error(`[kappaline] ${e.message}`);
	process.exit(1);
}
