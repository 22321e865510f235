// Runs every migration in ../migrations against DATABASE_URL. Used by the start and test commands.
import { readdirSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Migration } from 'kysely';
import { createDb } from '../src/lib/server/db/create-db';
import { migrateToLatest } from '../src/lib/server/db/migrate';

export async function loadMigrations(): Promise<Record<string, Migration>> {
	const dir = join(dirname(fileURLToPath(import.meta.url)), '..', 'migrations');
	const modules: Record<string, Migration> = {};
	for (const f of readdirSync(dir).filter((f) => f.endsWith('.ts')).sort()) {
		modules[f.replace(/\.ts$/, '')] = (await import(pathToFileURL(join(dir, f)).href)) as Migration;
	}
	return modules;
}

async function main() {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set');
	const db = createDb(url, { max: 1 });
	try {
		const applied = await migrateToLatest(db, await loadMigrations());
		console.log(applied.length ? `migrations applied: ${applied.join(', ')}` : 'migrations: up to date');
	} finally {
		await db.destroy();
	}
}

if (import.meta.url === pathToFileURL(process.argv[1]).href) {
	main().catch((e) => {
		console.error(e.message ?? e);
		process.exit(1);
	});
}
