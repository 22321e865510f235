// Vitest configuration of the engine runs (real NWChem jobs): `npm test` runs it as its own step,
// "engine runs (NWChem)", after the unit and integration tests. The default `vitest run` does not
// pick these files up (vite.config.ts includes only src/**/*.spec.ts and tests/integration).
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	resolve: { alias: { $lib: fileURLToPath(new URL('../../src/lib', import.meta.url)) } },
	test: {
		root: fileURLToPath(new URL('../..', import.meta.url)),
		include: ['tests/engine/**/*.test.ts'],
		environment: 'node',
		fileParallelism: false,
		// One engine job at a time on a shared 2-core machine; the whole file stays within ~3 minutes.
		testTimeout: 240_000,
		hookTimeout: 240_000
	}
});
