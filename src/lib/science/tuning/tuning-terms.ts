/**
 * Per scan point, the quantities of optimal tuning (science notes, section 3):
 *   IP = E(N-1) - E(N),  EA = E(N) - E(N+1),
 *   J_IP = eps_HOMO(N) + IP,  J_EA = eps_HOMO(N+1) + EA,  J_EA(LUMO) = eps_LUMO(N) + EA.
 * A quantity is null when an energy it needs is missing. Values are given in hartree and in eV.
 */
import { hartreeToEv } from '../units';
import type { ScanPoint } from './types';
import { validatedScanPoints } from './validated-scan-points';

export interface TuningTermsOptions {
	/** Leave excluded points out of the result (default false: they are returned with excluded = true). */
	dropExcluded?: boolean;
}

export interface TuningTerms {
	gammaBohrInv: number;
	excluded: boolean;
	/** Index of the point in the input array. */
	row: number;
	ipHartree: number | null;
	eaHartree: number | null;
	jIpHartree: number | null;
	jEaHartree: number | null;
	/** eps_LUMO(N) + EA: the J_EA variant that uses the neutral's LUMO. */
	jEaLumoHartree: number | null;
	ipEv: number | null;
	eaEv: number | null;
	jIpEv: number | null;
	jEaEv: number | null;
	jEaLumoEv: number | null;
}

const num = (v: number | null | undefined): number | null => (v === null || v === undefined ? null : v);
const diff = (a: number | null, b: number | null): number | null => (a === null || b === null ? null : a - b);
const sum = (a: number | null, b: number | null): number | null => (a === null || b === null ? null : a + b);
const ev = (v: number | null): number | null => (v === null ? null : hartreeToEv(v));

export function tuningTerms(points: readonly ScanPoint[], options: TuningTermsOptions = {}): TuningTerms[] {
	const valid = validatedScanPoints(points);
	const out: TuningTerms[] = [];
	valid.forEach((p, row) => {
		const excluded = p.excluded === true;
		if (excluded && options.dropExcluded) return;
		const eN = num(p.eNeutralHartree);
		const ip = diff(num(p.eCationHartree), eN);
		const ea = diff(eN, num(p.eAnionHartree));
		const jIp = sum(num(p.homoNeutralHartree), ip);
		const jEa = sum(num(p.homoAnionHartree), ea);
		const jEaLumo = sum(num(p.lumoNeutralHartree), ea);
		out.push({
			gammaBohrInv: p.gammaBohrInv,
			excluded,
			row,
			ipHartree: ip,
			eaHartree: ea,
			jIpHartree: jIp,
			jEaHartree: jEa,
			jEaLumoHartree: jEaLumo,
			ipEv: ev(ip),
			eaEv: ev(ea),
			jIpEv: ev(jIp),
			jEaEv: ev(jEa),
			jEaLumoEv: ev(jEaLumo)
		});
	});
	return out;
}
