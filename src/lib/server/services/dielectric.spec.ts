import { describe, expect, it } from 'vitest';
import { dielectricEntryInput } from '$lib/schemas/dielectric';
import { ValidationError } from '../errors';
import { evaluateEntry } from './dielectric';

const cell = { volumeA3: 800, z: 2, volumePerMoleculeA3: 400 };
const ev = (raw: Record<string, unknown>) => evaluateEntry(dielectricEntryInput.parse(raw), cell);
function refusal(raw: Record<string, unknown>): ValidationError {
	try {
		ev(raw);
	} catch (e) {
		expect(e).toBeInstanceOf(ValidationError);
		return e as ValidationError;
	}
	throw new Error('expected a refusal');
}

describe('evaluateEntry: tensors', () => {
	it('default scalar is trace/3; harmonic and geometric on request', () => {
		const t = '2 0 0\n0 3 0\n0 0 6';
		expect(ev({ kind: 'tensor', tensor: t }).epsilon).toBeCloseTo(11 / 3, 14);
		expect(ev({ kind: 'tensor', tensor: t, scalar: 'harmonic' }).epsilon).toBeCloseTo(3, 14);
		expect(ev({ kind: 'tensor', tensor: t, scalar: 'geometric' }).epsilon).toBeCloseTo(Math.cbrt(36), 14);
	});
	it('8 numbers are refused naming the line', () => {
		const e = refusal({ kind: 'tensor', tensor: '# from a run\n3 0 0 3 0 0 3 0' });
		expect(e.message).toBe('line 2: found 8 values on a single line; expected 3 lines of 3 numbers, one line of 6 Voigt components (xx yy zz yz xz xy), one line of 9 row-major values, or JSON');
		expect(e.line).toBe(2);
		expect(e.field).toBe('tensor');
	});
	it('asymmetric beyond 5 % and indefinite tensors are refused; small asymmetry is symmetrised with a warning', () => {
		expect(refusal({ kind: 'tensor', tensor: '3 1 0\n0 3 0\n0 0 3' }).message).toMatch(/^tensor is not symmetric/);
		expect(refusal({ kind: 'tensor', tensor: [[1, 2, 0], [2, 1, 0], [0, 0, 3]] }).message).toMatch(/^tensor is not positive definite/);
		const r = ev({ kind: 'tensor', tensor: '3 0.1 0\n0.12 3 0\n0 0 3' });
		expect(r.input.symmetrised).toBe(true);
		expect(r.input.warnings[0]).toMatch(/^tensor was symmetrised/);
	});
	it('values below 1 and a static constant are stored with warnings', () => {
		const r = ev({ kind: 'tensor', tensor: 'xx,yy,zz,xy,xz,yz\n0.9,2,2,0,0,0', frequency: 'static' });
		expect(r.input.warnings.some((w) => w.includes('below 1'))).toBe(true);
		expect(r.input.warnings.at(-1)).toBe('static constant entered: the screened functional needs the electronic (high-frequency) one');
	});
});

describe('evaluateEntry: refractive index and Clausius–Mossotti', () => {
	it('n = 1.8 at 589 nm gives eps = 3.24 with u = 2 n u(n)', () => {
		const r = ev({ kind: 'refractive_index', refractiveIndex: '1.8', wavelengthNm: '589', refractiveIndexUncertainty: '0.01' });
		expect(r.epsilon).toBeCloseTo(3.24, 14);
		expect(r.epsilonUncertainty).toBeCloseTo(0.036, 14);
	});
	it('a refractive index below 1 is refused', () => {
		expect(refusal({ kind: 'refractive_index', refractiveIndex: '0.9' }).field).toBe('refractiveIndex');
	});
	it('CM uses the polymorph V/Z and stores the substituted formula (alpha 30 Å^3, V_m 400 Å^3)', () => {
		const r = ev({ kind: 'clausius_mossotti', polarizability: '30', unit: 'A3' });
		const x = (4 * Math.PI * 30) / 1200;
		expect(r.input.x).toBeCloseTo(x, 14);
		expect(r.epsilon).toBeCloseTo((1 + 2 * x) / (1 - x), 14);
		expect(r.input.formula).toBe('x = 4π·30 Å³ / (3·400 Å³) = 0.314159; ε = (1 + 2x)/(1 − x) = 2.37419');
	});
	it('a polarizability tensor is averaged (trace/3), in bohr^3', () => {
		const r = ev({ kind: 'clausius_mossotti', polarizability: '200 0 0\n0 200 0\n0 0 200', unit: 'bohr3' });
		expect(r.input.polarizabilityVolumeA3).toBeCloseTo(200 * 0.148184711, 6);
	});
	it('x >= 1 is reported as no finite solution', () => {
		expect(refusal({ kind: 'clausius_mossotti', polarizability: '100', unit: 'A3' }).message).toMatch(/^Clausius–Mossotti has no solution: x = 4 pi alpha' \/ \(3 V_m\) = 1.047 >= 1/);
	});
	it('a polarizability in the wrong unit (an SI value given as Å³) is refused with a hint', () => {
		const e = refusal({ kind: 'clausius_mossotti', polarizability: '3.3e-39', unit: 'A3' });
		expect(e.field).toBe('unit');
		expect(e.message).toMatch(/smaller than a helium atom’s .* It looks like a value in C·m²\/V \(SI\) or cm³: choose that unit\.$/);
	});
	it('an unknown unit is refused by the schema', () => {
		expect(() => dielectricEntryInput.parse({ kind: 'clausius_mossotti', polarizability: '30', unit: 'nm3' })).toThrow(/unit must be A3/);
	});
});
