import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		typescript: {
			// Type-check the top-level folders too, by extending Kit's generated include list.
			config(tsconfig) {
				tsconfig.include.push(
					'../migrations/**/*.ts',
					'../scripts/**/*.ts',
					'../tests/**/*.ts',
					'../bench/**/*.ts',
					'../vite.config.ts',
					'../tailwind.config.ts'
				);
				return tsconfig;
			}
		}
	}
};

export default config;
