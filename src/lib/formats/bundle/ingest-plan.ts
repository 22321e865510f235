/**
 * What an upload of engine outputs would change, compared with what is already stored: the preview
 * the user confirms. Pure: the caller reads the stored values and stores the planned ones.
 *
 * Scan points are matched by gamma (within {@link GAMMA_TOLERANCE_BOHR_INV}); rerun results by epsilon,
 * alpha and gamma. For a match, each energy the upload gives is compared with the stored one:
 * - all equal within {@link ENERGY_TOLERANCE_HARTREE}, nothing new: `already-stored` (not duplicated);
 * - all equal, and the upload gives states the stored point lacks: `fills` (the empty values are set);
 * - any differs by more than the tolerance: `conflict` (nothing of that gamma is stored).
 * Without a match: `new`. Excluded scan points are not matched (they stay as they are).
 */
import { SCAN_ENERGY_FIELDS, type ScanEnergyField, type ScanPoint } from '$lib/science/tuning/types';
import type { IngestedRerun, IngestedScanPoint } from './ingest';
import type { BundleStateLabel } from './manifest';

/** Two energies closer than this (hartree) are the same value: NWChem prints totals to 1e-10 and orbital energies to ~1e-6. */
export const ENERGY_TOLERANCE_HARTREE = 1e-6;
/** Two gammas (or epsilons, alphas) closer than this are the same point; the study's duplicate check uses the same. */
export const GAMMA_TOLERANCE_BOHR_INV = 1e-6;

export type PlanStatus = 'new' | 'fills' | 'already-stored' | 'conflict';

export interface EnergyConflict {
	field: string;
	storedHartree: number;
	uploadedHartree: number;
}

export interface PlannedScanPoint {
	point: ScanPoint;
	folder: string;
	sources: Partial<Record<BundleStateLabel, string>>;
	/** States the upload has no usable result for. */
	missing: BundleStateLabel[];
	status: PlanStatus;
	/** The stored point this one matches (for `fills`, `already-stored`, `conflict`). */
	storedPointId: string | null;
	/** Energy fields the upload sets on the stored point (`fills`). */
	fills: ScanEnergyField[];
	conflicts: EnergyConflict[];
}

export interface PlannedRerun extends IngestedRerun {
	status: Exclude<PlanStatus, 'fills'>;
	storedId: string | null;
	conflicts: EnergyConflict[];
}

export interface StoredPointForPlan extends ScanPoint {
	id: string;
	excluded: boolean;
}

/** A screened rerun result: where it was computed and the orbital energies of the screened neutral (hartree). */
export interface RerunValues {
	epsilon: number;
	alpha: number;
	gammaBohrInv: number;
	homoHartree: number;
	lumoHartree: number | null;
}

export interface StoredRerunForPlan extends RerunValues {
	id: string;
}

export interface PlanOptions {
	/** Energies closer than this (hartree) are equal; default {@link ENERGY_TOLERANCE_HARTREE}. */
	toleranceHartree?: number;
}

function tolerance(options: PlanOptions): number {
	const t = options.toleranceHartree ?? ENERGY_TOLERANCE_HARTREE;
	if (!(t >= 0) || !Number.isFinite(t)) throw new RangeError(`toleranceHartree must be a finite number >= 0, got ${t}`);
	return t;
}

const close = (a: number, b: number, tol: number) => Math.abs(a - b) <= tol;

/** Compares uploaded scan points with the study's stored ones. */
export function planScanPoints(uploaded: readonly IngestedScanPoint[], stored: readonly StoredPointForPlan[], options: PlanOptions = {}): PlannedScanPoint[] {
	const tol = tolerance(options);
	return uploaded.map((u) => {
		const base = { point: { ...u.point }, folder: u.folder, sources: { ...u.sources }, missing: [...u.missing], storedPointId: null, fills: [] as ScanEnergyField[], conflicts: [] as EnergyConflict[] };
		const match = stored.find((s) => !s.excluded && close(s.gammaBohrInv, u.point.gammaBohrInv, GAMMA_TOLERANCE_BOHR_INV));
		if (!match) return { ...base, status: 'new' as const };
		const conflicts: EnergyConflict[] = [];
		const fills: ScanEnergyField[] = [];
		for (const f of SCAN_ENERGY_FIELDS) {
			const up = u.point[f];
			if (up === null || up === undefined) continue;
			const old = match[f];
			if (old === null || old === undefined) fills.push(f);
			else if (!close(old, up, tol)) conflicts.push({ field: f, storedHartree: old, uploadedHartree: up });
		}
		const status: PlanStatus = conflicts.length ? 'conflict' : fills.length ? 'fills' : 'already-stored';
		return { ...base, storedPointId: match.id, status, fills: conflicts.length ? [] : fills, conflicts };
	});
}

/** Compares uploaded rerun results with the polymorph's stored ones (same epsilon, alpha and gamma). */
export function planReruns(uploaded: readonly IngestedRerun[], stored: readonly StoredRerunForPlan[], options: PlanOptions = {}): PlannedRerun[] {
	const tol = tolerance(options);
	return uploaded.map((u) => {
		const match = stored.find(
			(s) => close(s.epsilon, u.epsilon, GAMMA_TOLERANCE_BOHR_INV) && close(s.alpha, u.alpha, GAMMA_TOLERANCE_BOHR_INV) && close(s.gammaBohrInv, u.gammaBohrInv, GAMMA_TOLERANCE_BOHR_INV)
		);
		if (!match) return { ...u, status: 'new' as const, storedId: null, conflicts: [] };
		const conflicts: EnergyConflict[] = [];
		if (!close(match.homoHartree, u.homoHartree, tol)) conflicts.push({ field: 'homoHartree', storedHartree: match.homoHartree, uploadedHartree: u.homoHartree });
		if (match.lumoHartree !== null && u.lumoHartree !== null && !close(match.lumoHartree, u.lumoHartree, tol)) {
			conflicts.push({ field: 'lumoHartree', storedHartree: match.lumoHartree, uploadedHartree: u.lumoHartree });
		}
		return { ...u, status: conflicts.length ? ('conflict' as const) : ('already-stored' as const), storedId: match.id, conflicts };
	});
}
