/**
 * Synthetic gamma scans for tests: data built from smooth model functions with known answers, NOT engine
 * output. Each J term is a model with a known root:
 *   J(gamma) = -k (gamma - root) (1 + c (gamma - root))   [hartree]
 * (decreasing: too little long-range exact exchange at small gamma makes -eps_HOMO smaller than the IP).
 * IP(gamma), EA(gamma) and E(N)(gamma) are smooth non-polynomial models of plausible size for an organic
 * molecule (IP ~ 7 eV, EA ~ 1 eV); orbital energies follow from eps = J - IP (or J - EA).
 */
import type { ScanPoint } from './types';

export interface JModel {
	root: number;
	slope: number;
	curvature: number;
}

export interface ScanModel {
	ip: JModel;
	ea: JModel;
	eaLumo: JModel;
	/** EA(gamma) in hartree (default 0.04 + 0.02 gamma). */
	ea0?: (g: number) => number;
}

export const jModel = (m: JModel, g: number): number => -m.slope * (g - m.root) * (1 + m.curvature * (g - m.root));

export const DEFAULT_MODEL: ScanModel = {
	ip: { root: 0.213, slope: 0.25, curvature: 0.8 },
	ea: { root: 0.236, slope: 0.15, curvature: 0.6 },
	eaLumo: { root: 0.19, slope: 0.2, curvature: 0.5 }
};

export const eNeutralModel = (g: number): number => -1000 + 0.35 * (1 - Math.exp(-g / 0.25));
export const ipModel = (g: number): number => 0.27 + 0.04 * Math.tanh((g - 0.25) / 0.2);
export const eaDefault = (g: number): number => 0.04 + 0.02 * g;

export function syntheticScan(gammas: readonly number[], model: ScanModel = DEFAULT_MODEL): ScanPoint[] {
	const eaModel = model.ea0 ?? eaDefault;
	return gammas.map((g) => {
		const eN = eNeutralModel(g);
		const ip = ipModel(g);
		const ea = eaModel(g);
		return {
			gammaBohrInv: g,
			eNeutralHartree: eN,
			eCationHartree: eN + ip,
			eAnionHartree: eN - ea,
			homoNeutralHartree: jModel(model.ip, g) - ip,
			lumoNeutralHartree: jModel(model.eaLumo, g) - ea,
			homoAnionHartree: jModel(model.ea, g) - ea
		};
	});
}

/** 0.05, 0.10, ..., 0.50 bohr^-1 (10 points), written out to avoid round-off in the grid. */
export const GRID = [0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5];
