import js from '@eslint/js';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default ts.config(
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } }
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			parserOptions: { projectService: true, extraFileExtensions: ['.svelte'], parser: ts.parser, svelteConfig }
		}
	},
	{
		rules: {
			'@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
			'svelte/no-navigation-without-resolve': 'off'
		}
	},
	{
		// Migrations are frozen and schema-agnostic: Kysely<any> is the documented pattern.
		files: ['migrations/**'],
		rules: { '@typescript-eslint/no-explicit-any': 'off' }
	},
	{
		// Zones 1 and 2 (science core and formats) stay free of framework, server and database imports.
		files: ['src/lib/science/**', 'src/lib/formats/**'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					patterns: [
						{ group: ['$app/*', '$env/*', '$lib/server/*', '$lib/server', 'svelte', 'svelte/*', '@sveltejs/*', 'kysely', 'pg', 'node:*', 'fs', 'path'], message: 'science and formats modules are pure: no framework, server, database or I/O imports' }
					]
				}
			]
		}
	},
	{
		ignores: ['build/', '.svelte-kit/', 'node_modules/', '.data/', 'test-results/', 'static/']
	}
);
