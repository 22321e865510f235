import { describe, expect, it } from 'vitest';
import { basisHasDiffuseFunctions } from './basis-has-diffuse-functions';

// Names follow the common naming of basis-set families (common practice): Dunning's aug- prefix,
// Pople's '+' for diffuse s,p shells, Karlsruhe's trailing D (def2-SVPD, def2-TZVPD).
describe('basisHasDiffuseFunctions', () => {
	it.each(['aug-cc-pVDZ', 'AUG-CC-PVTZ', 'd-aug-cc-pVDZ', 'jun-cc-pVTZ', '6-31+G*', '6-311++G(d,p)', 'def2-SVPD', 'def2-TZVPPD', 'ma-def2-TZVP', 'aug-pcseg-1', 'my diffuse set'])(
		'%s has diffuse functions',
		(name) => expect(basisHasDiffuseFunctions(name)).toBe(true)
	);
	it.each(['cc-pVDZ', '6-31G*', '6-311G(d,p)', 'def2-SVP', 'def2-TZVP', 'def2-QZVPP', 'STO-3G', 'pcseg-1'])(
		'%s has none',
		(name) => expect(basisHasDiffuseFunctions(name)).toBe(false)
	);
	it('gives null for an empty or missing name', () => {
		expect(basisHasDiffuseFunctions('')).toBeNull();
		expect(basisHasDiffuseFunctions(null)).toBeNull();
		expect(basisHasDiffuseFunctions(undefined)).toBeNull();
	});
});
