import { describe, expect, it } from 'vitest';
import { optimalGamma } from './optimal-gamma';
import { GRID, syntheticScan } from './synthetic-scan.testdata';
import { TUNING_ANALYSIS_VERSION, inputFingerprintHex, tuningAnalysis } from './tuning-analysis';

describe('tuningAnalysis', () => {
	const points = syntheticScan(GRID);

	it('wraps optimalGamma and carries version, input and a stable input fingerprint', () => {
		const a = tuningAnalysis(points, { basisSet: 'aug-cc-pVDZ' });
		expect(a.analysisVersion).toBe(TUNING_ANALYSIS_VERSION);
		expect(a.result).toEqual(optimalGamma(points, { basisSet: 'aug-cc-pVDZ' }));
		expect(a.input.objective).toBe('abs-sum');
		expect(a.inputHash).toMatch(/^[0-9a-f]{16}$/);
		// The same input (a copy) gives the same fingerprint; reproducing from the stored input gives the same result.
		const again = tuningAnalysis(structuredClone(a.input.points), { objective: a.input.objective, basisSet: a.input.basisSet });
		expect(again.inputHash).toBe(a.inputHash);
		expect(again.result.optimum).toEqual(a.result.optimum);
	});

	it('the fingerprint changes with an exclusion, the objective or one energy in the last digit', () => {
		const base = tuningAnalysis(points).inputHash;
		expect(tuningAnalysis(points.map((p, i) => (i === 2 ? { ...p, excluded: true } : p))).inputHash).not.toBe(base);
		expect(tuningAnalysis(points, { objective: 'square-sum' }).inputHash).not.toBe(base);
		const nudged = points.map((p, i) => (i === 0 ? { ...p, eNeutralHartree: p.eNeutralHartree! + 1e-12 } : p));
		expect(tuningAnalysis(nudged).inputHash).not.toBe(base);
	});

	it('gives chart terms in eV for every point, excluded ones flagged, and a refined grid around gamma*', () => {
		const a = tuningAnalysis(points.map((p, i) => (i === 0 ? { ...p, excluded: true } : p)));
		expect(a.chart).toHaveLength(points.length);
		expect(a.chart[0].excluded).toBe(true);
		expect(a.chart.every((c) => c.jIpEv !== null)).toBe(true);
		expect(a.refinedGridBohrInv.length).toBeGreaterThan(0);
		expect(a.refinedGridBohrInv.every((g) => Math.abs(g - a.result.optimum!.gammaBohrInv) <= 0.06)).toBe(true);
	});

	it('fingerprints differ for different texts and are 16 hex digits', () => {
		expect(inputFingerprintHex('a')).not.toBe(inputFingerprintHex('b'));
		expect(inputFingerprintHex('')).toMatch(/^[0-9a-f]{16}$/);
	});
});

describe('tuningAnalysis: the inlined objective and the bit-level fingerprint', () => {
	it('the objective at gamma* equals objectiveValue of the J terms there, for every objective', async () => {
		const { objectiveValue } = await import('./objective-value');
		for (const objective of ['abs-sum', 'square-sum', 'ip-only', 'lumo-variant'] as const) {
			const o = tuningAnalysis(syntheticScan(GRID), { objective }).result.optimum!;
			expect(o.objectiveValue).toBe(objectiveValue({ jIpEv: o.jIpEv, jEaEv: o.jEaEv, jEaLumoEv: o.jEaLumoEv }, { objective }));
		}
	});
	it('a missing energy and a zero energy give different fingerprints; so do basis names', () => {
		const pts = syntheticScan(GRID);
		const a = tuningAnalysis(pts.map((p, i) => (i === 3 ? { ...p, lumoNeutralHartree: null } : p))).inputHash;
		const b = tuningAnalysis(pts.map((p, i) => (i === 3 ? { ...p, lumoNeutralHartree: 0 } : p))).inputHash;
		expect(a).not.toBe(b);
		expect(tuningAnalysis(pts, { basisSet: 'aug-cc-pVDZ' }).inputHash).not.toBe(tuningAnalysis(pts, { basisSet: 'aug-cc-pVTZ' }).inputHash);
	});
});
