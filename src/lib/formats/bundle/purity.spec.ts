import { describe, expect, it } from 'vitest';

// Zone 2 rule (style guide, "The shape of the house"): formats modules are pure TypeScript, with no
// framework, server, database or I/O imports. Vite's import.meta.glob reads the sources without node:fs.
const sources = import.meta.glob(['./*.ts', '!./*.spec.ts'], { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

describe('bundle modules stay pure', () => {
	it('finds the modules', () => expect(Object.keys(sources).length).toBeGreaterThanOrEqual(10));
	for (const [file, text] of Object.entries(sources)) {
		it(`${file} imports only sibling modules, the deck writers, $lib/science/* and jszip`, () => {
			const specifiers = [...text.matchAll(/^\s*(?:import|export)[^'"]*from\s+['"]([^'"]+)['"]/gm)].map((m) => m[1]);
			for (const s of specifiers) {
				const ok = s.startsWith('./') || s === '../decks' || /^\$lib\/science\/[\w/-]+$/.test(s) || s === 'jszip';
				expect(ok, `${file} imports ${s}`).toBe(true);
			}
		});
	}
	it('uses no Node built-ins or file-system access', () => {
		for (const [file, text] of Object.entries(sources)) expect(/\b(require\(|process\.|Buffer\b|node:)/.test(text), file).toBe(false);
	});
});
