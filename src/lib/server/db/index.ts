import { createDb, type Db } from './create-db';
import { serverEnv } from '../env';

let handle: Db | undefined;

/** The app's single database handle (a pool), created on first use. */
export function db(): Db {
	handle ??= createDb(serverEnv().DATABASE_URL);
	return handle;
}

export async function closeDb(): Promise<void> {
	if (handle) {
		const h = handle;
		handle = undefined;
		await h.destroy();
	}
}

export type { Executor, Db } from './create-db';
