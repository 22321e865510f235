/**
 * Solid-state levels predicted by the screened rerun itself (science notes, section 5): the neutral
 * recomputed with beta = 1/epsilon - alpha gives IP_s ~ -eps_HOMO and EA_s ~ -eps_LUMO.
 * With the gas-phase IP and EA, the implied polarization energies P+ = IP_g - IP_s and P- = EA_s - EA_g
 * can be compared with the Born and image-charge estimates.
 */
import { HARTREE_EV } from '../units';
import { ScreeningError } from './screening-error';
import { finiteNumber, inputObject } from './validate';

export interface RerunLevelsInput {
	/** HOMO eigenvalue of the screened run, in hartree. */
	homoSolidHartree: number;
	/** LUMO eigenvalue of the screened run, in hartree. */
	lumoSolidHartree: number;
	/** Optional gas-phase IP (eV) to derive the implied P+. */
	ipGasEv?: number | null;
	/** Optional gas-phase EA (eV) to derive the implied P-. */
	eaGasEv?: number | null;
}

export interface RerunLevels {
	ipSolidEv: number;
	eaSolidEv: number;
	gapSolidEv: number;
	/** IP_g - IP_s, or null without ipGasEv. */
	impliedPPlusEv: number | null;
	/** EA_s - EA_g, or null without eaGasEv. */
	impliedPMinusEv: number | null;
	warnings: string[];
}

/** IP, EA and gap in eV from the HOMO and LUMO eigenvalues of the screened run. */
export function rerunLevels(input: RerunLevelsInput): RerunLevels {
	inputObject(input, 'rerunLevels');
	const homo = finiteNumber(input.homoSolidHartree, 'homoSolidHartree');
	const lumo = finiteNumber(input.lumoSolidHartree, 'lumoSolidHartree');
	if (lumo <= homo) {
		throw new ScreeningError('lumoSolidHartree', `LUMO (${lumo} Eh) must lie above HOMO (${homo} Eh)`);
	}
	const ipGas = input.ipGasEv === undefined || input.ipGasEv === null ? null : finiteNumber(input.ipGasEv, 'ipGasEv');
	const eaGas = input.eaGasEv === undefined || input.eaGasEv === null ? null : finiteNumber(input.eaGasEv, 'eaGasEv');

	const ipSolidEv = -homo * HARTREE_EV;
	const eaSolidEv = -lumo * HARTREE_EV;
	const warnings: string[] = [];
	if (homo >= 0) warnings.push('HOMO is not negative: the screened run does not bind its highest electron; check the SCF');
	if (lumo > 0) warnings.push('LUMO is above zero: the predicted solid-state EA is negative');
	const impliedPPlusEv = ipGas === null ? null : ipGas - ipSolidEv;
	const impliedPMinusEv = eaGas === null ? null : eaSolidEv - eaGas;
	if ((impliedPPlusEv !== null && impliedPPlusEv < 0) || (impliedPMinusEv !== null && impliedPMinusEv < 0)) {
		warnings.push(
			'an implied polarization energy is negative (the screened levels move away from the gas-phase ones ' +
				'in the wrong direction): check that the gas-phase values and the rerun match'
		);
	}
	return { ipSolidEv, eaSolidEv, gapSolidEv: ipSolidEv - eaSolidEv, impliedPPlusEv, impliedPMinusEv, warnings };
}
