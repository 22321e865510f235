import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		// Unit tests live beside the code (*.spec.ts); integration tests against the real
		// PostgreSQL live in tests/integration (*.test.ts). End-to-end runs are separate
		// (scripts/e2e.ts), since they drive Chromium against the built server.
		include: ['src/**/*.spec.ts', 'tests/integration/**/*.test.ts'],
		environment: 'node',
		fileParallelism: false,
		testTimeout: 30_000,
		hookTimeout: 60_000
	}
});
