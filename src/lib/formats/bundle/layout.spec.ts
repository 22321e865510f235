import { describe, expect, it } from 'vitest';
import { epsilonFolderTag, outputPathOf, parseBundleFolder, screenedFolder, tuningFolder } from './layout';

describe('bundle folder layout', () => {
	it('one folder per gamma (bohr^-1, at least 4 decimals) and per epsilon (3 decimals)', () => {
		expect(tuningFolder(0.25)).toBe('tuning/g0p2500');
		expect(tuningFolder(0.31255)).toBe('tuning/g0p31255');
		expect(screenedFolder(3)).toBe('screened/eps3p000');
		expect(epsilonFolderTag(3.56)).toBe('eps3p560');
		expect(epsilonFolderTag(12.3456)).toBe('eps12p346');
	});

	it('reads folder names back', () => {
		expect(parseBundleFolder('tuning/g0p2500')).toEqual({ kind: 'tuning', gammaBohrInv: 0.25 });
		expect(parseBundleFolder('kappaline_so2/tuning/g0p31255')).toEqual({ kind: 'tuning', gammaBohrInv: 0.31255 });
		expect(parseBundleFolder('screened/eps3p560')).toEqual({ kind: 'screened', epsilon: 3.56 });
		expect(parseBundleFolder('screened/e3p0000')).toBeNull();
		expect(parseBundleFolder('g0p2500')).toBeNull();
	});

	it('puts each output beside its deck', () => {
		expect(outputPathOf('tuning/g0p2500/cation.nw')).toBe('tuning/g0p2500/cation.out');
	});

	it('refuses epsilon < 1 with the field', () => expect(() => screenedFolder(0.5, 'epsilons[1]')).toThrow('epsilons[1]: epsilon must be >= 1, got 0.5'));
});
