import { describe, expect, it } from 'vitest';
import { HARTREE_EV } from '../units';
import { objectiveValue } from './objective-value';
import { TuningInputError } from './tuning-input-error';
import { tuningTerms } from './tuning-terms';

// A hand-made point (illustrative numbers, not engine output) to check the definitions of
// the science notes, section 3: IP = E(N-1) - E(N), EA = E(N) - E(N+1),
// J_IP = eps_HOMO(N) + IP, J_EA = eps_HOMO(N+1) + EA, J_EA(LUMO) = eps_LUMO(N) + EA.
const point = {
	gammaBohrInv: 0.2,
	eNeutralHartree: -500.0,
	eCationHartree: -499.75, // IP = 0.25
	eAnionHartree: -500.05, // EA = 0.05
	homoNeutralHartree: -0.26, // J_IP = -0.01
	lumoNeutralHartree: -0.07, // J_EA(LUMO) = -0.02
	homoAnionHartree: -0.02 // J_EA = +0.03
};

describe('tuningTerms (science notes, section 3)', () => {
	it('IP = E(N-1) - E(N), EA = E(N) - E(N+1) and the J terms, in hartree and eV (CODATA 2018)', () => {
		const [t] = tuningTerms([point]);
		expect(t.ipHartree).toBeCloseTo(0.25, 12);
		expect(t.eaHartree).toBeCloseTo(0.05, 12);
		expect(t.jIpHartree).toBeCloseTo(-0.01, 12);
		expect(t.jEaHartree).toBeCloseTo(0.03, 12);
		expect(t.jEaLumoHartree).toBeCloseTo(-0.02, 12);
		expect(t.ipEv).toBeCloseTo(0.25 * 27.211386245988, 9);
		expect(t.jEaEv).toBeCloseTo(0.03 * HARTREE_EV, 9);
		expect(t.excluded).toBe(false);
		expect(t.row).toBe(0);
	});

	it('a missing energy makes only the terms that need it null', () => {
		const [t] = tuningTerms([{ ...point, eAnionHartree: null, lumoNeutralHartree: undefined }]);
		expect(t.ipHartree).not.toBeNull();
		expect(t.jIpHartree).not.toBeNull();
		expect(t.eaHartree).toBeNull();
		expect(t.jEaHartree).toBeNull();
		expect(t.jEaLumoHartree).toBeNull();
		expect(t.eaEv).toBeNull();
	});

	it('keeps excluded points flagged, or drops them on request; never mutates the input', () => {
		const pts = [point, { ...point, gammaBohrInv: 0.3, excluded: true }];
		const copy = structuredClone(pts);
		expect(tuningTerms(pts).map((t) => t.excluded)).toEqual([false, true]);
		expect(tuningTerms(pts, { dropExcluded: true }).map((t) => t.row)).toEqual([0]);
		expect(pts).toEqual(copy);
	});

	it('rejects bad input with the row and field named', () => {
		try {
			tuningTerms([point, { ...point, eCationHartree: Number.NaN }]);
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(TuningInputError);
			expect((e as TuningInputError).row).toBe(1);
			expect((e as TuningInputError).field).toBe('eCationHartree');
			expect((e as Error).message).toBe('points[1].eCationHartree must be a finite number or null, got NaN');
		}
		expect(() => tuningTerms([{ ...point, gammaBohrInv: -0.1 }])).toThrow('points[0].gammaBohrInv must be >= 0, got -0.1');
		expect(() => tuningTerms('x' as never)).toThrow('points must be an array of scan points');
	});
});

describe('objectiveValue (science notes, section 3)', () => {
	const t = { jIpEv: -0.3, jEaEv: 0.4, jEaLumoEv: -0.1 };
	it('abs-sum = |J_IP| + |J_EA| (default)', () => expect(objectiveValue(t)).toBeCloseTo(0.7, 14));
	it('square-sum = J_IP^2 + J_EA^2', () => expect(objectiveValue(t, { objective: 'square-sum' })).toBeCloseTo(0.25, 14));
	it('ip-only = |J_IP|', () => expect(objectiveValue(t, { objective: 'ip-only' })).toBeCloseTo(0.3, 14));
	it('lumo-variant = |J_IP| + |eps_LUMO(N) + EA|', () =>
		expect(objectiveValue(t, { objective: 'lumo-variant' })).toBeCloseTo(0.4, 14));
	it('null when a needed term is missing; ip-only does not need the EA term', () => {
		expect(objectiveValue({ jIpEv: 0.1, jEaEv: null })).toBeNull();
		expect(objectiveValue({ jIpEv: 0.1, jEaEv: null }, { objective: 'ip-only' })).toBeCloseTo(0.1, 14);
	});
	it('rejects an unknown objective', () =>
		expect(() => objectiveValue(t, { objective: 'max' as never })).toThrow(
			'objective must be one of abs-sum, square-sum, ip-only, lumo-variant, got max'
		));
});
