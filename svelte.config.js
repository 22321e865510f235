import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		// Content-Security-Policy: SvelteKit adds nonces for its own inline scripts. 3Dmol.js compiles code at
		// run time ('unsafe-eval'); uPlot and 3Dmol set element styles ('unsafe-inline' for styles only).
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self', 'unsafe-eval'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'worker-src': ['self', 'blob:'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		},
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
