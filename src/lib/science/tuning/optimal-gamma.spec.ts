import { describe, expect, it } from 'vitest';
import { hartreeToEv } from '../units';
import { optimalGamma } from './optimal-gamma';
import { suggestRefinedGrid } from './suggest-refined-grid';
import {
	DEFAULT_MODEL,
	GRID,
	eaDefault,
	ipModel,
	jModel,
	syntheticScan,
	type ScanModel
} from './synthetic-scan.testdata';
import { TuningInputError } from './tuning-input-error';
import type { ScanPoint, TuningDiagnostic } from './types';

// All scans here are synthetic data from a model J(gamma) with known root (see synthetic-scan.testdata.ts),
// not engine output. The scan step is 0.05 bohr^-1; tolerances are stated per check.

const codes = (ds: TuningDiagnostic[]) => ds.map((d) => d.code);
const withModel = (patch: Partial<ScanModel>): ScanModel => ({ ...DEFAULT_MODEL, ...patch });

describe('optimalGamma on clean synthetic scans', () => {
	const points = syntheticScan(GRID);

	it('abs-sum: gamma* is the J_IP root 0.213 (the steeper term), within 1e-4 bohr^-1', () => {
		// Model: J_IP root 0.213 (slope 0.25 Ha/bohr^-1), J_EA root 0.236 (slope 0.15): between the roots
		// |J_IP| grows faster than |J_EA| shrinks, so |J_IP| + |J_EA| is smallest at the J_IP root.
		// PCHIP on these curved J models misplaces the root by < 1e-5 at this step; 1e-4 leaves margin.
		const r = optimalGamma(points);
		expect(r.objective).toBe('abs-sum');
		expect(r.objectiveUnit).toBe('eV');
		expect(Math.abs(r.optimum!.gammaBohrInv - 0.213)).toBeLessThan(1e-4);
		expect(Math.abs(r.crossings.jIpBohrInv! - 0.213)).toBeLessThan(1e-4);
		expect(Math.abs(r.crossings.jEaBohrInv! - 0.236)).toBeLessThan(1e-4);
		expect(Math.abs(r.crossings.jEaLumoBohrInv! - 0.19)).toBeLessThan(1e-4);
		expect(Math.abs(r.crossings.distanceBohrInv! - 0.023)).toBeLessThan(2e-4);
		expect(r.bestGridPoint).toEqual({ gammaBohrInv: 0.2, objectiveValue: expect.any(Number), row: 3 });
		expect(r.optimum!.objectiveValue).toBeLessThanOrEqual(r.bestGridPoint!.objectiveValue);
		expect(r.usedGammasBohrInv).toEqual(GRID);
	});

	it('no diagnostics on clean data', () => {
		expect(optimalGamma(points).diagnostics).toEqual([]);
	});

	it('levels at gamma* match the model within 1 meV; gap = IP - EA; -eps_HOMO = IP where J_IP = 0', () => {
		const o = optimalGamma(points).optimum!;
		const g = o.gammaBohrInv;
		expect(Math.abs(o.ipEv! - hartreeToEv(ipModel(g)))).toBeLessThan(1e-3);
		expect(Math.abs(o.eaEv! - hartreeToEv(eaDefault(g)))).toBeLessThan(1e-3);
		expect(o.gapEv).toBeCloseTo(o.ipEv! - o.eaEv!, 12);
		expect(Math.abs(o.minusHomoEv! - o.ipEv!)).toBeLessThan(1e-3);
		expect(Math.abs(o.jIpEv)).toBeLessThan(1e-6);
		const lumo = jModel(DEFAULT_MODEL.eaLumo, g) - eaDefault(g);
		expect(Math.abs(o.minusLumoEv! + hartreeToEv(lumo))).toBeLessThan(1e-3);
		expect(o.homoAnionEv!).toBeLessThan(0);
	});

	it('square-sum matches the model minimum of J_IP^2 + J_EA^2 within 2e-4 bohr^-1', () => {
		// Reference: dense search (step 1e-6) on the model functions themselves.
		let best = 0;
		let bestF = Infinity;
		for (let g = 0.15; g <= 0.3; g += 1e-6) {
			const f = jModel(DEFAULT_MODEL.ip, g) ** 2 + jModel(DEFAULT_MODEL.ea, g) ** 2;
			if (f < bestF) [best, bestF] = [g, f];
		}
		const r = optimalGamma(points, { objective: 'square-sum' });
		expect(r.objectiveUnit).toBe('eV^2');
		expect(Math.abs(r.optimum!.gammaBohrInv - best)).toBeLessThan(2e-4);
	});

	it('ip-only gives the J_IP root; lumo-variant gives the J_IP root here (steeper than eps_LUMO + EA)', () => {
		expect(Math.abs(optimalGamma(points, { objective: 'ip-only' }).optimum!.gammaBohrInv - 0.213)).toBeLessThan(1e-4);
		const l = optimalGamma(points, { objective: 'lumo-variant' });
		expect(Math.abs(l.optimum!.gammaBohrInv - 0.213)).toBeLessThan(1e-4);
		expect(Math.abs(l.crossings.distanceBohrInv! - 0.023)).toBeLessThan(2e-4);
	});

	it('is exact for linear J models: abs-sum at the steeper root, square-sum at (a^2 g1 + b^2 g2)/(a^2 + b^2)', () => {
		// PCHIP reproduces linear data exactly, so only the minimiser tolerance (1e-10) remains.
		const lin = withModel({
			ip: { root: 0.2137, slope: 0.3, curvature: 0 },
			ea: { root: 0.2471, slope: 0.1, curvature: 0 }
		});
		const pts = syntheticScan(GRID, lin);
		expect(optimalGamma(pts).optimum!.gammaBohrInv).toBeCloseTo(0.2137, 9);
		const expected = (0.09 * 0.2137 + 0.01 * 0.2471) / (0.09 + 0.01);
		expect(optimalGamma(pts, { objective: 'square-sum' }).optimum!.gammaBohrInv).toBeCloseTo(expected, 8);
	});

	it('ignores excluded points and input order; never mutates the input', () => {
		const bad: ScanPoint = { ...points[4], eCationHartree: -990, excluded: true };
		const shuffled = [points[7], bad, ...points.slice(0, 7), ...points.slice(8)].reverse();
		const copy = structuredClone(shuffled);
		const r = optimalGamma(shuffled);
		expect(r.optimum!.gammaBohrInv).toBeCloseTo(optimalGamma(points).optimum!.gammaBohrInv, 12);
		expect(r.diagnostics).toEqual([]);
		expect(shuffled).toEqual(copy);
	});

	it('ip-only needs no anion runs', () => {
		const noAnion = points.map((p) => ({ ...p, eAnionHartree: null, homoAnionHartree: null }));
		const r = optimalGamma(noAnion, { objective: 'ip-only' });
		expect(Math.abs(r.optimum!.gammaBohrInv - 0.213)).toBeLessThan(1e-4);
		expect(r.optimum!.eaEv).toBeNull();
		expect(r.optimum!.gapEv).toBeNull();
		expect(r.diagnostics).toEqual([]);
	});
});

describe('optimalGamma diagnostics, each on data built to trigger it', () => {
	// Where J_EA is large at small gamma, eps_HOMO(N+1) = J_EA - EA turns positive unless EA is large too;
	// those models use EA = 0.1 Ha (2.7 eV) so that only the diagnostic under test fires.
	const bigEa = () => 0.1;

	it('optimum at the upper edge, with both J terms never crossing zero', () => {
		const r = optimalGamma(
			syntheticScan(
				GRID,
				withModel({ ip: { root: 0.6, slope: 0.25, curvature: 0 }, ea: { root: 0.65, slope: 0.15, curvature: 0 }, ea0: bigEa })
			)
		);
		expect(r.optimum!.gammaBohrInv).toBeCloseTo(0.5, 9);
		expect(codes(r.diagnostics)).toEqual(['optimum-at-edge', 'no-zero-crossing', 'no-zero-crossing']);
		expect(r.diagnostics[0].action).toBe('Extend the scan above 0.500 bohr^-1.');
		expect(r.diagnostics[1].action).toContain('above 0.500');
		expect(r.crossings.jIpBohrInv).toBeNull();
		expect(r.crossings.distanceBohrInv).toBeNull();
	});

	it('optimum at the lower edge', () => {
		const r = optimalGamma(
			syntheticScan(GRID, withModel({ ip: { root: 0.02, slope: 0.25, curvature: 0 }, ea: { root: 0.03, slope: 0.15, curvature: 0 } }))
		);
		expect(r.optimum!.gammaBohrInv).toBeCloseTo(0.05, 9);
		const edge = r.diagnostics.find((d) => d.code === 'optimum-at-edge')!;
		expect(edge.severity).toBe('warning');
		expect(edge.message).toContain('lower edge');
		expect(edge.action).toBe('Extend the scan below 0.050 bohr^-1 (keep gamma > 0).');
	});

	it('one J term without a zero crossing (optimum inside the scan)', () => {
		const r = optimalGamma(
			syntheticScan(
				GRID,
				withModel({ ip: { root: 0.62, slope: 0.1, curvature: 0 }, ea: { root: 0.3, slope: 0.4, curvature: 0 }, ea0: bigEa })
			)
		);
		expect(r.optimum!.gammaBohrInv).toBeCloseTo(0.3, 8);
		expect(codes(r.diagnostics)).toEqual(['no-zero-crossing']);
		expect(r.diagnostics[0].message).toContain('J_IP = eps_HOMO(N) + IP does not cross zero');
		expect(r.crossings.jIpBohrInv).toBeNull();
		expect(r.crossings.jEaBohrInv).toBeCloseTo(0.3, 9);
	});

	it('unbound anion at the optimum (EA < 0 model, so eps_HOMO(N+1) > 0)', () => {
		const r = optimalGamma(syntheticScan(GRID, withModel({ ea0: (g) => -0.01 + 0.02 * g })));
		const d = r.diagnostics.find((x) => x.code === 'unbound-anion-at-optimum')!;
		expect(d.severity).toBe('warning');
		expect(d.action).toContain('diffuse');
		expect(r.optimum!.homoAnionEv!).toBeGreaterThan(0);
		// The same data with the ip-only objective: reported as info only.
		const ipOnly = optimalGamma(syntheticScan(GRID, withModel({ ea0: (g) => -0.01 + 0.02 * g })), { objective: 'ip-only' });
		expect(ipOnly.diagnostics.find((x) => x.code === 'unbound-anion-at-optimum')!.severity).toBe('info');
	});

	it('unbound anion at some scan points only (small gamma)', () => {
		// EA = 0.015 Ha: eps_HOMO(N+1) = J_EA - EA > 0 at gamma = 0.05 and 0.10, < 0 at gamma*.
		const r = optimalGamma(syntheticScan(GRID, withModel({ ea0: () => 0.015 })));
		expect(codes(r.diagnostics)).toEqual(['unbound-anion']);
		expect(r.diagnostics[0].message).toContain('gamma = 0.050, 0.100 bohr^-1');
		expect(r.diagnostics[0].gammaBohrInv).toBe(0.05);
	});

	it('J_IP and J_EA crossings far apart (0.2 bohr^-1 > 0.05 default), and the threshold option', () => {
		const pts = syntheticScan(
			GRID,
			withModel({ ip: { root: 0.15, slope: 0.25, curvature: 0 }, ea: { root: 0.35, slope: 0.15, curvature: 0 }, ea0: bigEa })
		);
		const r = optimalGamma(pts);
		expect(codes(r.diagnostics)).toEqual(['crossings-far-apart']);
		expect(r.diagnostics[0].message).toContain('0.200 bohr^-1 apart');
		expect(r.crossings.distanceBohrInv).toBeCloseTo(0.2, 9);
		expect(optimalGamma(pts, { crossingDistanceWarnBohrInv: 0.25 }).diagnostics).toEqual([]);
	});

	it('fewer than two points on one side of the optimum', () => {
		const r = optimalGamma(
			syntheticScan([0.15, 0.2, 0.25, 0.3, 0.35, 0.4], withModel({ ip: { root: 0.19, slope: 0.25, curvature: 0.8 } }))
		);
		expect(Math.abs(r.optimum!.gammaBohrInv - 0.19)).toBeLessThan(1e-3);
		expect(codes(r.diagnostics)).toEqual(['few-points-near-optimum']);
		expect(r.diagnostics[0].message).toContain('Only 1 usable point(s) below and 5 above');
	});

	it('a point that breaks smoothness (cation energy 3 mHa off at gamma = 0.30) is named', () => {
		const pts = syntheticScan(GRID).map((p) =>
			p.gammaBohrInv === 0.3 ? { ...p, eCationHartree: p.eCationHartree! + 3e-3 } : p
		);
		const r = optimalGamma(pts);
		const d = r.diagnostics.filter((x) => x.code === 'non-smooth-point');
		expect(d).toHaveLength(1);
		expect(d[0].gammaBohrInv).toBe(0.3);
		expect(d[0].message).toContain('cation total energy E(N-1) at gamma = 0.300 bohr^-1 is');
		expect(d[0].action).toContain('mark the point excluded');
	});

	it('duplicated gamma values: info when identical, warning when they differ; the first is used', () => {
		const pts = syntheticScan(GRID);
		const same = optimalGamma([...pts, { ...pts[5] }]);
		expect(same.diagnostics).toEqual([expect.objectContaining({ code: 'duplicate-gamma', severity: 'info', gammaBohrInv: 0.3 })]);
		const differ = optimalGamma([...pts, { ...pts[5], eCationHartree: pts[5].eCationHartree! + 0.01 }]);
		expect(differ.diagnostics).toEqual([expect.objectContaining({ code: 'duplicate-gamma', severity: 'warning' })]);
		expect(differ.optimum!.gammaBohrInv).toBeCloseTo(optimalGamma(pts).optimum!.gammaBohrInv, 12);
	});

	it('total energies that do not change with gamma: error, no optimum', () => {
		const pts: ScanPoint[] = GRID.map((g) => ({
			gammaBohrInv: g,
			eNeutralHartree: -1000,
			eCationHartree: -999.73,
			eAnionHartree: -1000.04,
			homoNeutralHartree: -0.22,
			lumoNeutralHartree: -0.06,
			homoAnionHartree: -0.03
		}));
		const r = optimalGamma(pts);
		expect(r.optimum).toBeNull();
		expect(codes(r.diagnostics)).toEqual(['energy-independent-of-gamma']);
		expect(r.diagnostics[0].severity).toBe('error');
		expect(r.diagnostics[0].message).toContain('neutral total energy E(N), cation total energy E(N-1), anion total energy E(N+1)');
	});

	it('fewer than 3 usable points: error, no optimum; incomplete points are listed', () => {
		const r = optimalGamma(syntheticScan([0.2, 0.3]));
		expect(r.optimum).toBeNull();
		expect(r.bestGridPoint).toBeNull();
		expect(codes(r.diagnostics)).toEqual(['too-few-points']);
		expect(r.diagnostics[0].message).toBe("Only 2 usable scan point(s) for the 'abs-sum' objective; at least 3 are needed.");

		const partial = syntheticScan(GRID.slice(0, 5)).map((p, i) => (i < 3 ? { ...p, eAnionHartree: null } : p));
		const q = optimalGamma(partial);
		expect(codes(q.diagnostics)).toEqual(['incomplete-points', 'too-few-points']);
		expect(q.diagnostics[0].message).toContain('gamma = 0.050, 0.100, 0.150 bohr^-1');
	});

	it('a J term crossing zero twice is reported (info) and the crossing nearest gamma* is used', () => {
		// J_IP = -0.25 (g - 0.4)(1 + 5 (g - 0.4)) has roots 0.2 and 0.4.
		const r = optimalGamma(syntheticScan(GRID, withModel({ ip: { root: 0.4, slope: 0.25, curvature: 5 } })));
		const d = r.diagnostics.find((x) => x.code === 'multiple-zero-crossings')!;
		expect(d.severity).toBe('info');
		expect(r.crossings.all.jIp).toHaveLength(2);
	});

	it('rejects invalid options and points with TuningInputError', () => {
		const pts = syntheticScan(GRID);
		expect(() => optimalGamma(pts, { crossingDistanceWarnBohrInv: -1 })).toThrow(TuningInputError);
		expect(() => optimalGamma(pts, { objective: 'median' as never })).toThrow('objective must be one of');
		expect(() => optimalGamma([{ gammaBohrInv: Number.NaN }])).toThrow('points[0].gammaBohrInv must be a finite number');
	});
});

describe('suggestRefinedGrid', () => {
	const pts = syntheticScan(GRID);
	const r = optimalGamma(pts);

	it('gives +-0.05 around gamma* in steps of 0.01, leaving out gammas already scanned', () => {
		// gamma* ~ 0.213 rounds to 0.21; 0.20 and 0.25 are in the scan.
		expect(suggestRefinedGrid(r, pts)).toEqual([0.16, 0.17, 0.18, 0.19, 0.21, 0.22, 0.23, 0.24, 0.26]);
		expect(suggestRefinedGrid(r, pts, { skipExisting: false })).toHaveLength(11);
	});

	it('keeps gamma > 0 near zero and honours step and width options', () => {
		expect(suggestRefinedGrid({ optimum: { ...r.optimum!, gammaBohrInv: 0.02 } }, [])).toEqual([
			0.01, 0.02, 0.03, 0.04, 0.05, 0.06, 0.07
		]);
		expect(suggestRefinedGrid(r, [], { halfWidthBohrInv: 0.01, stepBohrInv: 0.005 })).toEqual([0.205, 0.21, 0.215, 0.22, 0.225]);
	});

	it('refuses a result without an optimum', () => {
		expect(() => suggestRefinedGrid({ optimum: null }, pts)).toThrow('no optimum to refine around');
		expect(() => suggestRefinedGrid(r, pts, { stepBohrInv: 0 })).toThrow(TuningInputError);
	});
});

describe('optimalGamma: anion term with a basis set without diffuse functions (common practice)', () => {
	const points = syntheticScan(GRID);
	it('warns for abs-sum, square-sum and lumo-variant with cc-pVDZ, with what to do', () => {
		for (const objective of ['abs-sum', 'square-sum', 'lumo-variant'] as const) {
			const d = optimalGamma(points, { objective, basisSet: 'cc-pVDZ' }).diagnostics.find((x) => x.code === 'anion-term-without-diffuse-basis');
			expect(d?.severity).toBe('warning');
			expect(d?.message).toContain("'cc-pVDZ' has no diffuse functions");
			expect(d?.action).toContain('ip-only');
		}
	});
	it('stays quiet for ip-only, for a diffuse basis and when no basis is given', () => {
		expect(codes(optimalGamma(points, { objective: 'ip-only', basisSet: 'cc-pVDZ' }).diagnostics)).not.toContain('anion-term-without-diffuse-basis');
		expect(codes(optimalGamma(points, { basisSet: 'aug-cc-pVDZ' }).diagnostics)).not.toContain('anion-term-without-diffuse-basis');
		expect(codes(optimalGamma(points, { basisSet: '6-31+G*' }).diagnostics)).not.toContain('anion-term-without-diffuse-basis');
		expect(codes(optimalGamma(points).diagnostics)).not.toContain('anion-term-without-diffuse-basis');
	});
});
