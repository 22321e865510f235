import { describe, expect, it } from 'vitest';
import so2G03 from '../decks/fixtures/so2_g0p3000.out?raw';
import so2Screened from '../decks/fixtures/so2_g0p3000_e3p0000.out?raw';
import { readNwchemOutput } from '../decks';
import type { IngestedRerun, IngestedScanPoint } from './ingest';
import { ENERGY_TOLERANCE_HARTREE, planReruns, planScanPoints } from './ingest-plan';
import { scanPointFromOutput } from './so2.testdata';

// Values read from the real NWChem 7.0.2 SO2 outputs in decks/fixtures (see its README.md).
const uploaded: IngestedScanPoint = {
	point: scanPointFromOutput(so2G03, 0.3),
	folder: 'tuning/g0p3000',
	sources: { neutral: 'x.out', cation: 'x.out', anion: 'x.out' },
	missing: []
};
const stored = (over: Record<string, unknown> = {}) => ({ id: 'p1', excluded: false, ...uploaded.point, ...over });

describe('planScanPoints', () => {
	it('a gamma not stored yet is new', () => {
		expect(planScanPoints([uploaded], [stored({ gammaBohrInv: 0.2 })])[0]).toMatchObject({ status: 'new', storedPointId: null, conflicts: [] });
	});
	it('identical values (within the tolerance) are already stored, not duplicated', () => {
		const eN = (uploaded.point.eNeutralHartree as number) + ENERGY_TOLERANCE_HARTREE / 2;
		expect(planScanPoints([uploaded], [stored({ eNeutralHartree: eN })])[0]).toMatchObject({ status: 'already-stored', storedPointId: 'p1' });
	});
	it('an energy differing beyond the tolerance is a conflict naming the field and both values', () => {
		const eC = (uploaded.point.eCationHartree as number) + 2e-5;
		const p = planScanPoints([uploaded], [stored({ eCationHartree: eC })])[0];
		expect(p.status).toBe('conflict');
		expect(p.conflicts).toEqual([{ field: 'eCationHartree', storedHartree: eC, uploadedHartree: uploaded.point.eCationHartree }]);
		expect(p.fills).toEqual([]);
	});
	it('states the stored point lacks are filled when the others agree', () => {
		const p = planScanPoints([uploaded], [stored({ eAnionHartree: null, homoAnionHartree: null })])[0];
		expect(p).toMatchObject({ status: 'fills', fills: ['eAnionHartree', 'homoAnionHartree'] });
	});
	it('an excluded stored point is not matched', () => {
		expect(planScanPoints([uploaded], [stored({ excluded: true, eNeutralHartree: -1 })])[0].status).toBe('new');
	});
	it('refuses a negative tolerance', () => {
		expect(() => planScanPoints([uploaded], [], { toleranceHartree: -1 })).toThrow('toleranceHartree must be a finite number >= 0, got -1');
	});
});

describe('planReruns', () => {
	const t = readNwchemOutput(so2Screened).tasks[0];
	const rerun: IngestedRerun = { epsilon: 3, gammaBohrInv: 0.3, alpha: 0.2, beta: 1 / 3 - 0.2, totalEnergyHartree: t.totalEnergyHartree as number, homoHartree: t.homoHartree as number, lumoHartree: t.lumoHartree, folder: 'screened/eps3p000', file: 'neutral.out' };
	const same = { id: 'r1', epsilon: 3, alpha: 0.2, gammaBohrInv: 0.3, homoHartree: rerun.homoHartree, lumoHartree: rerun.lumoHartree };
	it('matches on epsilon, alpha and gamma', () => {
		expect(planReruns([rerun], [same])[0]).toMatchObject({ status: 'already-stored', storedId: 'r1' });
		expect(planReruns([rerun], [{ ...same, gammaBohrInv: 0.25 }])[0]).toMatchObject({ status: 'new', storedId: null });
	});
	it('a different HOMO is a conflict', () => {
		const p = planReruns([rerun], [{ ...same, homoHartree: rerun.homoHartree - 0.01 }])[0];
		expect(p.status).toBe('conflict');
		expect(p.conflicts[0]).toMatchObject({ field: 'homoHartree', uploadedHartree: rerun.homoHartree });
	});
});
