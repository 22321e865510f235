import { Migrator, type Kysely, type Migration, type MigrationProvider } from 'kysely';

/**
 * Migrations are plain modules in the top-level `migrations/` folder. Callers pass them in
 * (a Vite glob in tests, a directory import in the script) so this module stays I/O-free.
 */
export class RecordMigrationProvider implements MigrationProvider {
	constructor(private readonly modules: Record<string, Migration>) {}
	async getMigrations(): Promise<Record<string, Migration>> {
		return this.modules;
	}
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export async function migrateToLatest(db: Kysely<any>, modules: Record<string, Migration>): Promise<string[]> {
	const migrator = new Migrator({ db, provider: new RecordMigrationProvider(modules) });
	const { error, results } = await migrator.migrateToLatest();
	if (error) {
		const failed = results?.find((r) => r.status === 'Error');
		throw new Error(`migration ${failed?.migrationName ?? '?'} failed: ${(error as Error).message ?? error}`);
	}
	return (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
}
