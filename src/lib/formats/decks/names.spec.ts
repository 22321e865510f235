import { describe, expect, it } from 'vitest';
import { checkJobName, deckFileName, epsilonTag, gammaTag, jobNameFrom } from './names';
import { formatReal, formatThreshold, wrapComment } from './text';

describe('gammaTag', () => {
	it('writes at least four decimals and more only when needed (folder names)', () => {
		expect(gammaTag(0.3)).toBe('g0p3000');
		expect(gammaTag(0.15)).toBe('g0p1500');
		expect(gammaTag(0.31255)).toBe('g0p31255');
		expect(gammaTag(1.25)).toBe('g1p2500');
		expect(gammaTag(0.1234567)).toBe('g0p123457');
	});
	it('refuses gamma <= 0', () => expect(() => gammaTag(0)).toThrow('gammaBohrInv: gamma must be > 0 bohr^-1, got 0'));
});

describe('epsilonTag', () => {
	it('writes four decimals', () => {
		expect(epsilonTag(3)).toBe('e3p0000');
		expect(epsilonTag(3.56)).toBe('e3p5600');
	});
	it('refuses epsilon < 1', () => expect(() => epsilonTag(0.5)).toThrow('epsilon: epsilon must be >= 1, got 0.5'));
});

describe('job names', () => {
	it('accepts letters, digits, _ and - after a letter', () => {
		expect(checkJobName('so2_tune-1')).toBe('so2_tune-1');
		expect(deckFileName('so2_g0p3000', 'nw')).toBe('so2_g0p3000.nw');
	});
	it('refuses names that would break a shell or a deck', () => {
		for (const bad of ['1abc', 'a b', 'a;b', 'a/b', '', 'a'.repeat(49)]) expect(() => checkJobName(bad)).toThrow('jobName: job name must start with a letter');
	});
	it('derives names from free text', () => {
		expect(jobNameFrom('Rubrene')).toBe('rubrene');
		expect(jobNameFrom('C60 / PC61BM')).toBe('c60_pc61bm');
		expect(jobNameFrom('6T (sexithiophene)')).toBe('m_6t_sexithiophene');
		expect(jobNameFrom('Perylène')).toBe('perylene');
		expect(() => jobNameFrom('αβγ')).toThrow('jobName: cannot derive a job name from "αβγ"; give jobName');
	});
});

describe('number and comment formatting', () => {
	it('writes plain decimals that round-trip through 12 decimals', () => {
		expect(formatReal(0.8)).toBe('0.8');
		expect(formatReal(1)).toBe('1.0');
		expect(formatReal(0)).toBe('0.0');
		expect(formatReal(-0)).toBe('0.0');
		expect(formatReal(1 / 3 - 0.2)).toBe('0.133333333333');
		expect(formatReal(1 - 0.2 - 0.8)).toBe('0.0');
		expect(formatReal(-1e-13)).toBe('0.0');
		expect(() => formatReal(Number.NaN)).toThrow('number: cannot write non-finite value NaN');
	});
	it('writes thresholds in exponent form', () => {
		expect(formatThreshold(1e-8, 'e')).toBe('1e-8');
		expect(formatThreshold(5e-7, 'e')).toBe('5e-7');
		expect(() => formatThreshold(0, 'e')).toThrow('e: threshold must be a finite number in (0, 1), got 0');
	});
	it('keeps user text on comment lines (line breaks cannot escape a comment)', () => {
		expect(wrapComment('# ', 'study\nname\r\ntask dft energy')).toEqual(['# study name task dft energy']);
	});
});
