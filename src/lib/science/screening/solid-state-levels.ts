/**
 * Polarization-shifted levels (science notes, section 5). IP and EA are positive energies in eV (on the
 * vacuum scale the levels are -IP and -EA):
 *   IP_s = IP_g - P+,  EA_s = EA_g + P-,  gap_s = gap_g - (P+ + P-).
 */
import { ScreeningError } from './screening-error';
import { finiteNumber, inputObject, nonNegativeNumber } from './validate';

export interface SolidStateLevelsInput {
	ipGasEv: number;
	/** May be negative (unbound anion). */
	eaGasEv: number;
	/** Polarization energy of the hole (cation), >= 0. */
	pPlusEv: number;
	/** Polarization energy of the electron (anion), >= 0. */
	pMinusEv: number;
}

export interface SolidStateLevels {
	ipSolidEv: number;
	eaSolidEv: number;
	gapGasEv: number;
	gapSolidEv: number;
	/** Gap renormalization P+ + P- (>= 0). */
	renormalizationEv: number;
	warnings: string[];
}

/** Solid-state IP, EA and gap from gas-phase values and polarization energies. */
export function solidStateLevels(input: SolidStateLevelsInput): SolidStateLevels {
	inputObject(input, 'solidStateLevels');
	const ip = finiteNumber(input.ipGasEv, 'ipGasEv');
	const ea = finiteNumber(input.eaGasEv, 'eaGasEv');
	const pPlus = nonNegativeNumber(input.pPlusEv, 'pPlusEv');
	const pMinus = nonNegativeNumber(input.pMinusEv, 'pMinusEv');
	if (ip <= 0) throw new ScreeningError('ipGasEv', `ipGasEv must be > 0 (IP is a positive energy), got ${ip}`);
	if (ea >= ip) {
		throw new ScreeningError('eaGasEv', `eaGasEv (${ea}) must be below ipGasEv (${ip}): the gas-phase gap IP - EA must be > 0`);
	}
	const gapGasEv = ip - ea;
	const renormalizationEv = pPlus + pMinus;
	const gapSolidEv = gapGasEv - renormalizationEv;
	const warnings: string[] = [];
	if (gapSolidEv <= 0) {
		warnings.push(
			`the polarization energies (${renormalizationEv.toFixed(2)} eV) close the gas-phase gap ` +
				`(${gapGasEv.toFixed(2)} eV): the model is outside its range (check the radius and epsilon)`
		);
	}
	return { ipSolidEv: ip - pPlus, eaSolidEv: ea + pMinus, gapGasEv, gapSolidEv, renormalizationEv, warnings };
}
