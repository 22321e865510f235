import { describe, expect, it } from 'vitest';

// Zone 2 rule (style guide, "The shape of the house"): formats modules are pure TypeScript, with no
// framework, server, database or I/O imports. Vite's import.meta.glob reads the sources without node:fs.
const sources = import.meta.glob(['./*.ts', '!./*.spec.ts'], { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

describe('deck modules stay pure', () => {
	it('finds the modules', () => expect(Object.keys(sources).length).toBeGreaterThanOrEqual(10));
	for (const [file, text] of Object.entries(sources)) {
		it(`${file} imports only sibling modules and $lib/science/*`, () => {
			const specifiers = [...text.matchAll(/^\s*(?:import|export)[^'"]*from\s+['"]([^'"]+)['"]/gm)].map((m) => m[1]);
			for (const s of specifiers) expect(s.startsWith('./') || /^\$lib\/science\/[\w/-]+$/.test(s), `${file} imports ${s}`).toBe(true);
		});
	}
});
