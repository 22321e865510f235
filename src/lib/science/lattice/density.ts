import { AVOGADRO } from '../units';

/** 1 Å³ in cm³. */
const A3_TO_CM3 = 1e-24;

/**
 * Crystal density in g/cm³ from the formula-unit molar mass (g/mol), Z and the cell volume (Å³):
 * rho = Z·M / (N_A · V · 1e-24), N_A = 6.02214076e23 /mol (exact, SI 2019).
 * Throws RangeError for non-finite or non-positive inputs.
 */
export function densityGPerCm3(molarMassGPerMol: number, z: number, volumeA3: number): number {
	if (typeof molarMassGPerMol !== 'number' || !Number.isFinite(molarMassGPerMol) || molarMassGPerMol <= 0) {
		throw new RangeError(`molar mass must be a finite number > 0 g/mol, got ${molarMassGPerMol}`);
	}
	if (typeof z !== 'number' || !Number.isFinite(z) || z <= 0) {
		throw new RangeError(`Z (formula units per cell) must be a finite number > 0, got ${z}`);
	}
	if (typeof volumeA3 !== 'number' || !Number.isFinite(volumeA3) || volumeA3 <= 0) {
		throw new RangeError(`cell volume must be a finite number > 0 Å³, got ${volumeA3}`);
	}
	return (z * molarMassGPerMol) / (AVOGADRO * volumeA3 * A3_TO_CM3);
}
