/**
 * The optimally tuned range-separation parameter gamma* of a gas-phase scan (science notes, section 3).
 *
 * Steps:
 * 1. Check the points; drop excluded ones; sort by gamma; keep the first of duplicated gammas.
 * 2. Compute IP, EA and the J terms per point (tuningTerms); keep the points that have every term the
 *    chosen objective needs ("usable" points). Fewer than 3: error, no optimum.
 * 3. Interpolate each J term over gamma with PCHIP (see pchip-interpolant.ts for the choice) and form the
 *    objective from the interpolated terms (the J terms are smooth; the absolute values are not, so we
 *    interpolate the terms, never the objective).
 * 4. Minimise on every interval between usable grid points, split at the J terms' zero crossings (where
 *    |J| has its kinks), with Brent's method on each smooth piece; the grid points and crossings are
 *    candidates too. Every interval is considered (not only those beside the best grid point), skipping
 *    only pieces whose exact lower bound cannot beat the best value found (cheap even for 1,000 points)
 *    so it finds the global minimum of the interpolated objective; the result is cross-checked against the
 *    best grid point and a warning is given when they are not neighbours.
 * 5. Report gamma*, the objective there, the zero crossings and their distance, the levels at gamma*
 *    (interpolated the same way) and diagnostics in plain words with what to do.
 * When a diagnostic of severity 'error' is present, `optimum` and `bestGridPoint` are null.
 */
import { hartreeToEv } from '../units';
import { basisHasDiffuseFunctions } from './basis-has-diffuse-functions';
import { brentMinimum } from './brent-minimum';
import type { CubicInterpolant } from './cubic-hermite-interpolant';
import { interpolantZeros } from './interpolant-zeros';
import { checkedObjective, objectiveNeeds, objectiveUnit } from './objective-value';
import { pchipInterpolant } from './pchip-interpolant';
import { smoothnessOutliers } from './smoothness-outliers';
import { TuningInputError } from './tuning-input-error';
import { tuningTerms, type TuningTerms } from './tuning-terms';
import {
	SCAN_ENERGY_FIELDS,
	SCAN_ENERGY_LABELS,
	type ScanPoint,
	type TuningDiagnostic,
	type TuningObjective
} from './types';

export interface OptimalGammaOptions {
	/** What gamma* minimises (default 'abs-sum': |J_IP| + |J_EA|). */
	objective?: TuningObjective;
	/**
	 * Warn when the zero crossings of J_IP and of the objective's EA term are farther apart than this,
	 * bohr^-1 (default 0.05; a project default, not a published criterion).
	 */
	crossingDistanceWarnBohrInv?: number;
	/** Warn when fewer usable points than this lie on either side of gamma* (default 2). */
	minPointsEachSide?: number;
	/** Gammas closer than this are duplicates, bohr^-1 (default 1e-6). */
	duplicateToleranceBohrInv?: number;
	/**
	 * A state's total energy whose spread over the scan is below this did not respond to gamma
	 * (the engine ignored the range-separation parameter), hartree (default 1e-6).
	 */
	constantEnergyToleranceHartree?: number;
	/** Smallest jump of an energy away from its smooth curve that is reported, hartree (default 1e-4). */
	outlierThresholdHartree?: number;
	/** Smallest jump relative to the local misfit that is reported (default 10). */
	outlierRelativeFactor?: number;
	/** Tolerance of the minimiser and root finder, bohr^-1 (default 1e-10). */
	toleranceBohrInv?: number;
	/**
	 * Name of the basis set the scan was run with (e.g. 'aug-cc-pVDZ'). When given and it has no diffuse
	 * functions by common naming (see basisHasDiffuseFunctions) while the objective uses an anion term,
	 * a warning is added.
	 */
	basisSet?: string | null;
}

/** The levels and J terms at gamma*, in eV (interpolated; null when not available there). */
export interface GammaOptimum {
	gammaBohrInv: number;
	/** Objective at gamma*, in `objectiveUnit`. */
	objectiveValue: number;
	jIpEv: number;
	jEaEv: number | null;
	jEaLumoEv: number | null;
	/** IP = E(N-1) - E(N). */
	ipEv: number | null;
	/** EA = E(N) - E(N+1). */
	eaEv: number | null;
	/** -eps_HOMO(N). */
	minusHomoEv: number | null;
	/** -eps_LUMO(N). */
	minusLumoEv: number | null;
	/** Fundamental gap IP - EA. */
	gapEv: number | null;
	/** eps_HOMO(N+1) (positive means an unbound anion). */
	homoAnionEv: number | null;
}

export interface ZeroCrossings {
	/** Zero of J_IP nearest gamma* (null if none in the scan), bohr^-1. */
	jIpBohrInv: number | null;
	/** Zero of J_EA = eps_HOMO(N+1) + EA nearest gamma*, bohr^-1. */
	jEaBohrInv: number | null;
	/** Zero of eps_LUMO(N) + EA nearest gamma*, bohr^-1. */
	jEaLumoBohrInv: number | null;
	/** |zero of J_IP - zero of the EA term| (the LUMO variant for 'lumo-variant', else J_EA), bohr^-1. */
	distanceBohrInv: number | null;
	/** Every zero found, per term, ascending. */
	all: { jIp: number[]; jEa: number[]; jEaLumo: number[] };
}

export interface OptimalGammaResult {
	objective: TuningObjective;
	objectiveUnit: 'eV' | 'eV^2';
	optimum: GammaOptimum | null;
	/** The scan point with the smallest objective (row: index in the input array). */
	bestGridPoint: { gammaBohrInv: number; objectiveValue: number; row: number } | null;
	crossings: ZeroCrossings;
	/** Gammas of the points used for the objective, ascending. */
	usedGammasBohrInv: number[];
	diagnostics: TuningDiagnostic[];
}

const fmtG = (g: number): string => g.toFixed(3);
const fmtEv = (e: number): string => `${e >= 0 ? '+' : ''}${e.toFixed(2)}`;
const listG = (gs: number[]): string => gs.map(fmtG).join(', ');

function positiveOption(name: string, value: number | undefined, fallback: number): number {
	if (value === undefined) return fallback;
	if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0)
		throw new TuningInputError(`${name} must be a positive number, got ${String(value)}`, name);
	return value;
}

type TermKey = 'jIpHartree' | 'jEaHartree' | 'jEaLumoHartree';
const TERM_NAMES: Record<TermKey, string> = {
	jIpHartree: 'J_IP = eps_HOMO(N) + IP',
	jEaHartree: 'J_EA = eps_HOMO(N+1) + EA',
	jEaLumoHartree: 'eps_LUMO(N) + EA'
};

interface Row {
	terms: TuningTerms;
	point: ScanPoint;
}

/** PCHIP of a quantity over the rows where it is present (null with fewer than 2 such rows). */
function seriesInterpolant(rows: Row[], get: (r: Row) => number | null | undefined): CubicInterpolant | null {
	const xs: number[] = [];
	const ys: number[] = [];
	for (const r of rows) {
		const v = get(r);
		if (v === null || v === undefined) continue;
		xs.push(r.terms.gammaBohrInv);
		ys.push(v);
	}
	return xs.length >= 2 ? pchipInterpolant(xs, ys, { xName: 'gamma' }) : null;
}

const at = (f: CubicInterpolant | null, g: number): number | null =>
	f !== null && g >= f.minX && g <= f.maxX ? f.value(g) : null;

const nearest = (zs: number[], g: number): number | null =>
	zs.length === 0 ? null : zs.reduce((b, z) => (Math.abs(z - g) < Math.abs(b - g) ? z : b));

export function optimalGamma(points: readonly ScanPoint[], options: OptimalGammaOptions = {}): OptimalGammaResult {
	const objective = checkedObjective(options.objective);
	const farApart = positiveOption('crossingDistanceWarnBohrInv', options.crossingDistanceWarnBohrInv, 0.05);
	const dupTol = positiveOption('duplicateToleranceBohrInv', options.duplicateToleranceBohrInv, 1e-6);
	const constTol = positiveOption('constantEnergyToleranceHartree', options.constantEnergyToleranceHartree, 1e-6);
	const outlierThreshold = positiveOption('outlierThresholdHartree', options.outlierThresholdHartree, 1e-4);
	const outlierFactor = positiveOption('outlierRelativeFactor', options.outlierRelativeFactor, 10);
	const tol = positiveOption('toleranceBohrInv', options.toleranceBohrInv, 1e-10);
	const minEachSide = options.minPointsEachSide ?? 2;
	if (!Number.isInteger(minEachSide) || minEachSide < 0)
		throw new TuningInputError(`minPointsEachSide must be an integer >= 0, got ${minEachSide}`, 'minPointsEachSide');

	const terms = tuningTerms(points); // validates the points
	const needs = objectiveNeeds(objective);
	const eaKey: TermKey | null =
		needs.ea === 'jEa' ? 'jEaHartree' : needs.ea === 'jEaLumo' ? 'jEaLumoHartree' : null;
	const neededKeys: TermKey[] = eaKey ? ['jIpHartree', eaKey] : ['jIpHartree'];
	const diagnostics: TuningDiagnostic[] = [];
	const emptyCrossings: ZeroCrossings = {
		jIpBohrInv: null,
		jEaBohrInv: null,
		jEaLumoBohrInv: null,
		distanceBohrInv: null,
		all: { jIp: [], jEa: [], jEaLumo: [] }
	};

	// 1. Active points, sorted; duplicates reduced to their first occurrence.
	const sorted: Row[] = terms
		.filter((t) => !t.excluded)
		.map((t) => ({ terms: t, point: points[t.row] }))
		.sort((a, b) => a.terms.gammaBohrInv - b.terms.gammaBohrInv);
	const rows: Row[] = [];
	for (let i = 0; i < sorted.length; ) {
		let j = i + 1;
		while (j < sorted.length && sorted[j].terms.gammaBohrInv - sorted[i].terms.gammaBohrInv <= dupTol) j++;
		rows.push(sorted[i]);
		if (j - i > 1) {
			const group = sorted.slice(i, j);
			const differ = SCAN_ENERGY_FIELDS.some((f) =>
				group.some((r) => (r.point[f] ?? null) !== (group[0].point[f] ?? null))
			);
			const g = sorted[i].terms.gammaBohrInv;
			diagnostics.push({
				code: 'duplicate-gamma',
				severity: differ ? 'warning' : 'info',
				message: differ
					? `gamma = ${fmtG(g)} bohr^-1 appears ${j - i} times with different energies; only the first is used.`
					: `gamma = ${fmtG(g)} bohr^-1 appears ${j - i} times with the same energies; one copy is used.`,
				action: differ
					? 'Check which run is right and mark the other rows excluded.'
					: 'Remove the repeated rows from the scan table.',
				gammaBohrInv: g
			});
		}
		i = j;
	}

	// 2. Points lacking what the objective needs.
	const usable = rows.filter((r) => neededKeys.every((k) => r.terms[k] !== null));
	const usableSet = new Set(usable);
	const incomplete = rows.filter((r) => !usableSet.has(r)).map((r) => r.terms.gammaBohrInv);
	if (incomplete.length > 0)
		diagnostics.push({
			code: 'incomplete-points',
			severity: 'info',
			message: `${incomplete.length} point(s) lack an energy the '${objective}' objective needs and are left out: gamma = ${listG(incomplete)} bohr^-1.`,
			action: 'Complete the missing runs (neutral, cation, anion and their orbital energies) or exclude these rows.',
			gammaBohrInv: incomplete[0]
		});

	// 3. Energies that do not respond to gamma.
	const frozen: string[] = [];
	for (const f of ['eNeutralHartree', 'eCationHartree', 'eAnionHartree'] as const) {
		const vs = rows.map((r) => r.point[f]).filter((v): v is number => typeof v === 'number');
		if (vs.length >= 2 && Math.max(...vs) - Math.min(...vs) <= constTol) frozen.push(SCAN_ENERGY_LABELS[f]);
	}
	if (frozen.length > 0)
		diagnostics.push({
			code: 'energy-independent-of-gamma',
			severity: 'error',
			message: `The ${frozen.join(', ')} do(es) not change with gamma (spread below ${constTol} hartree): the engine ignored the range-separation parameter.`,
			action: "Check the engine input: the range-separation keyword must reach the functional (see the engine's conventions), then rerun the scan."
		});

	if (usable.length < 3)
		diagnostics.push({
			code: 'too-few-points',
			severity: 'error',
			message: `Only ${usable.length} usable scan point(s) for the '${objective}' objective; at least 3 are needed.`,
			action: 'Run more gamma values (typically 6-10 between 0.05 and 0.5 bohr^-1), each with neutral, cation and anion.'
		});
	if (diagnostics.some((d) => d.severity === 'error'))
		return {
			objective,
			objectiveUnit: objectiveUnit(objective),
			optimum: null,
			bestGridPoint: null,
			crossings: emptyCrossings,
			usedGammasBohrInv: usable.map((r) => r.terms.gammaBohrInv),
			diagnostics
		};

	// 3b. An anion term in the objective computed without diffuse functions (common practice: anions need them).
	if (eaKey !== null && basisHasDiffuseFunctions(options.basisSet) === false)
		diagnostics.push({
			code: 'anion-term-without-diffuse-basis',
			severity: 'warning',
			message: `The '${objective}' objective uses an anion term (${TERM_NAMES[eaKey]}), but the basis set '${String(options.basisSet).trim()}' has no diffuse functions by its name: the extra electron is squeezed into too compact functions, so EA and the anion's orbital energy are unreliable (common practice).`,
			action: 'Rerun the anion (and, for consistency, the whole scan) with a diffuse basis (aug-cc-pVDZ, 6-31+G*, def2-SVPD), or use the ip-only objective.'
		});

	// 4. Points that break smoothness (likely failed SCF).
	for (const f of SCAN_ENERGY_FIELDS) {
		const ok = rows.filter((r) => typeof r.point[f] === 'number');
		const found = smoothnessOutliers(
			ok.map((r) => r.terms.gammaBohrInv),
			ok.map((r) => r.point[f] as number),
			{ threshold: outlierThreshold, relativeFactor: outlierFactor }
		);
		for (const o of found)
			diagnostics.push({
				code: 'non-smooth-point',
				severity: 'warning',
				message: `The ${SCAN_ENERGY_LABELS[f]} at gamma = ${fmtG(o.x)} bohr^-1 is ${(hartreeToEv(o.residual) * 1000).toFixed(0)} meV off the smooth curve through its neighbours (likely a failed or wrong-state SCF).`,
				action: `Inspect the run at gamma = ${fmtG(o.x)} bohr^-1 (SCF convergence, spin state); rerun it or mark the point excluded.`,
				gammaBohrInv: o.x
			});
	}

	// 5. Interpolants: terms the objective needs over the usable points, the rest over their own points.
	const xs = usable.map((r) => r.terms.gammaBohrInv);
	const interp: Record<TermKey, CubicInterpolant | null> = {
		jIpHartree: seriesInterpolant(usable, (r) => r.terms.jIpHartree),
		jEaHartree: seriesInterpolant(eaKey === 'jEaHartree' ? usable : rows, (r) => r.terms.jEaHartree),
		jEaLumoHartree: seriesInterpolant(eaKey === 'jEaLumoHartree' ? usable : rows, (r) => r.terms.jEaLumoHartree)
	};
	const zeros: Record<TermKey, number[]> = {
		jIpHartree: interp.jIpHartree ? interpolantZeros(interp.jIpHartree, { tolerance: tol }) : [],
		jEaHartree: interp.jEaHartree ? interpolantZeros(interp.jEaHartree, { tolerance: tol }) : [],
		jEaLumoHartree: interp.jEaLumoHartree ? interpolantZeros(interp.jEaLumoHartree, { tolerance: tol }) : []
	};
	const evAt = (k: TermKey, g: number): number | null => {
		const v = at(interp[k], g);
		return v === null ? null : hartreeToEv(v);
	};
	// The objective of the interpolated terms (objectiveValue's formulas, inlined: it is evaluated
	// thousands of times). Both needed interpolants run over the usable points, so g is always inside.
	const fIp = interp.jIpHartree as CubicInterpolant;
	const fEa = eaKey === null ? null : (interp[eaKey] as CubicInterpolant);
	const F = (g: number): number => {
		const ip = hartreeToEv(fIp.value(g));
		if (fEa === null) return Math.abs(ip);
		const ea = hartreeToEv(fEa.value(g));
		return objective === 'square-sum' ? ip * ip + ea * ea : Math.abs(ip) + Math.abs(ea);
	};

	// 6. Best grid point, then the minimum of the interpolated objective.
	const gridValues = xs.map(F);
	let best = 0;
	gridValues.forEach((v, i) => {
		if (v < gridValues[best]) best = i;
	});
	let gStar = xs[best];
	let fStar = gridValues[best];
	const kinks = neededKeys.flatMap((k) => zeros[k]).sort((a, b) => a - b);
	// A lower bound of the objective on a piece between kinks: on each interval between nodes, PCHIP is
	// monotone (Fritsch & Carlson 1980: node slopes within [0, 3] x the secant, which the Fritsch-Butland
	// and end rules guarantee), so each |J| on a piece is at least its smaller end value. Pieces whose
	// bound cannot beat the best value so far are skipped: this does not change the result, and keeps
	// a 1,000-point scan well inside one frame. Intervals are visited nearest the best grid point first.
	const termEv = (k: TermKey, g: number) => Math.abs(evAt(k, g) as number);
	const lowerBound = (a: number, b: number): number => {
		const ip = Math.min(termEv('jIpHartree', a), termEv('jIpHartree', b));
		if (eaKey === null) return ip;
		const ea = Math.min(termEv(eaKey, a), termEv(eaKey, b));
		return objective === 'square-sum' ? ip * ip + ea * ea : ip + ea;
	};
	const order = xs.slice(0, -1).map((_, i) => i).sort((a, b) => Math.abs(a + 0.5 - best) - Math.abs(b + 0.5 - best));
	// Per interval, the same bound from the node values (the interpolant equals them at the nodes), so
	// most intervals of a long scan are passed over without evaluating anything.
	const nodeIp = fIp.ys.map((y) => Math.abs(hartreeToEv(y)));
	const nodeEa = fEa === null ? null : fEa.ys.map((y) => Math.abs(hartreeToEv(y)));
	const minAbs = (ys: readonly number[], nodes: number[], i: number) => (ys[i] * ys[i + 1] <= 0 ? 0 : Math.min(nodes[i], nodes[i + 1]));
	const intervalBound = (i: number): number => {
		const ip = minAbs(fIp.ys, nodeIp, i);
		if (fEa === null || nodeEa === null) return ip;
		const ea = minAbs(fEa.ys, nodeEa, i);
		return objective === 'square-sum' ? ip * ip + ea * ea : ip + ea;
	};
	let kinkFrom = 0;
	for (const i of order) {
		if (intervalBound(i) >= fStar) continue;
		while (kinkFrom > 0 && kinks[kinkFrom - 1] > xs[i]) kinkFrom--;
		while (kinkFrom < kinks.length && kinks[kinkFrom] <= xs[i]) kinkFrom++;
		const inside: number[] = [];
		for (let q = kinkFrom; q < kinks.length && kinks[q] < xs[i + 1]; q++) inside.push(kinks[q]);
		const cuts = [xs[i], ...inside, xs[i + 1]];
		for (let j = 0; j < cuts.length - 1; j++) {
			const candidates: number[] = [cuts[j + 1]];
			const bound = lowerBound(cuts[j], cuts[j + 1]);
			if (cuts[j + 1] - cuts[j] > 4 * tol && bound < fStar) candidates.push(brentMinimum(F, cuts[j], cuts[j + 1], { tolerance: tol }).x);
			for (const c of candidates) {
				const v = F(c);
				if (v < fStar) {
					fStar = v;
					gStar = c;
				}
			}
		}
	}
	const lo = xs[0];
	const hi = xs[xs.length - 1];
	const edgeTol = Math.max(1e-8, 100 * tol);

	if (gStar < xs[Math.max(0, best - 1)] - edgeTol || gStar > xs[Math.min(xs.length - 1, best + 1)] + edgeTol)
		diagnostics.push({
			code: 'optimum-away-from-best-grid-point',
			severity: 'warning',
			message: `The interpolated optimum (gamma = ${fmtG(gStar)} bohr^-1) is not next to the best scan point (gamma = ${fmtG(xs[best])} bohr^-1): the objective may have two separate minima.`,
			action: 'Add scan points around both values and check the J curves.',
			gammaBohrInv: gStar
		});

	// 7. Position of the optimum within the scan.
	const atLow = gStar - lo <= edgeTol;
	const atHigh = hi - gStar <= edgeTol;
	if (atLow || atHigh)
		diagnostics.push({
			code: 'optimum-at-edge',
			severity: 'warning',
			message: `The optimum lies on the ${atLow ? 'lower' : 'upper'} edge of the scan (gamma = ${fmtG(gStar)} bohr^-1): the true optimum is probably ${atLow ? 'below' : 'above'} the scanned range.`,
			action: atLow
				? `Extend the scan below ${fmtG(lo)} bohr^-1 (keep gamma > 0).`
				: `Extend the scan above ${fmtG(hi)} bohr^-1.`,
			gammaBohrInv: gStar
		});
	else {
		const below = xs.filter((x) => x < gStar - edgeTol).length;
		const above = xs.filter((x) => x > gStar + edgeTol).length;
		if (below < minEachSide || above < minEachSide)
			diagnostics.push({
				code: 'few-points-near-optimum',
				severity: 'warning',
				message: `Only ${below} usable point(s) below and ${above} above the optimum (gamma = ${fmtG(gStar)} bohr^-1); at least ${minEachSide} on each side make the interpolation reliable.`,
				action: 'Rerun with a finer grid around the optimum (see the suggested refined grid).',
				gammaBohrInv: gStar
			});
	}

	// 8. Zero crossings.
	for (const k of neededKeys) {
		const f = interp[k];
		if (f === null) continue;
		if (zeros[k].length === 0) {
			const yLo = hartreeToEv(f.ys[0]);
			const yHi = hartreeToEv(f.ys[f.ys.length - 1]);
			const towardHigh = Math.abs(yHi) < Math.abs(yLo);
			diagnostics.push({
				code: 'no-zero-crossing',
				severity: 'warning',
				message: `${TERM_NAMES[k]} does not cross zero between gamma = ${fmtG(f.minX)} and ${fmtG(f.maxX)} bohr^-1 (it goes from ${fmtEv(yLo)} to ${fmtEv(yHi)} eV).`,
				action: towardHigh
					? `Extend the scan above ${fmtG(f.maxX)} bohr^-1, where |J| gets smaller.`
					: `Extend the scan below ${fmtG(f.minX)} bohr^-1, where |J| gets smaller.`
			});
		} else if (zeros[k].length > 1)
			diagnostics.push({
				code: 'multiple-zero-crossings',
				severity: 'info',
				message: `${TERM_NAMES[k]} crosses zero ${zeros[k].length} times (gamma = ${listG(zeros[k])} bohr^-1); the crossing nearest the optimum is reported.`,
				action: 'Check the scan for non-smooth points; the J terms normally cross zero once.',
				gammaBohrInv: zeros[k][0]
			});
	}
	const zIp = nearest(zeros.jIpHartree, gStar);
	const zEa = nearest(zeros.jEaHartree, gStar);
	const zEaLumo = nearest(zeros.jEaLumoHartree, gStar);
	const zPartner = objective === 'lumo-variant' ? zEaLumo : zEa;
	const distance = zIp !== null && zPartner !== null ? Math.abs(zIp - zPartner) : null;
	if (distance !== null && objective !== 'ip-only' && distance > farApart)
		diagnostics.push({
			code: 'crossings-far-apart',
			severity: 'warning',
			message: `J_IP crosses zero at gamma = ${fmtG(zIp as number)} and the EA term at gamma = ${fmtG(zPartner as number)} bohr^-1: ${distance.toFixed(3)} bohr^-1 apart (more than ${farApart} bohr^-1), so no single gamma satisfies both conditions well.`,
			action: 'Check the anion (basis with diffuse functions, spin state, bound or not); if it is unbound use the ip-only objective.',
			gammaBohrInv: gStar
		});

	// 9. Levels at gamma*.
	const levelAt = (get: (r: Row) => number | null | undefined): number | null => {
		const v = at(seriesInterpolant(rows, get), gStar);
		return v === null ? null : hartreeToEv(v);
	};
	const ipEv = levelAt((r) => r.terms.ipHartree);
	const eaEv = levelAt((r) => r.terms.eaHartree);
	const homoEv = levelAt((r) => r.point.homoNeutralHartree);
	const lumoEv = levelAt((r) => r.point.lumoNeutralHartree);
	const homoAnionEv = levelAt((r) => r.point.homoAnionHartree);
	const optimum: GammaOptimum = {
		gammaBohrInv: gStar,
		objectiveValue: fStar,
		jIpEv: evAt('jIpHartree', gStar) as number,
		jEaEv: evAt('jEaHartree', gStar),
		jEaLumoEv: evAt('jEaLumoHartree', gStar),
		ipEv,
		eaEv,
		minusHomoEv: homoEv === null ? null : -homoEv,
		minusLumoEv: lumoEv === null ? null : -lumoEv,
		gapEv: ipEv !== null && eaEv !== null ? ipEv - eaEv : null,
		homoAnionEv
	};

	// 10. Unbound anion.
	const unboundSeverity = objective === 'ip-only' ? 'info' : 'warning';
	const unboundAction =
		'Add diffuse basis functions and rerun the anion; if eps_HOMO(N+1) stays positive the anion is physically unbound: use the ip-only objective.';
	if (homoAnionEv !== null && homoAnionEv > 0)
		diagnostics.push({
			code: 'unbound-anion-at-optimum',
			severity: unboundSeverity,
			message: `The anion's HOMO is positive at the optimum (eps_HOMO(N+1) = ${fmtEv(homoAnionEv)} eV at gamma = ${fmtG(gStar)} bohr^-1): the extra electron is not bound.`,
			action: unboundAction,
			gammaBohrInv: gStar
		});
	else {
		const unbound = rows
			.filter((r) => typeof r.point.homoAnionHartree === 'number' && r.point.homoAnionHartree > 0)
			.map((r) => r.terms.gammaBohrInv);
		if (unbound.length > 0)
			diagnostics.push({
				code: 'unbound-anion',
				severity: unboundSeverity,
				message: `The anion's HOMO is positive (unbound extra electron) at gamma = ${listG(unbound)} bohr^-1.`,
				action: unboundAction,
				gammaBohrInv: unbound[0]
			});
	}

	return {
		objective,
		objectiveUnit: objectiveUnit(objective),
		optimum,
		bestGridPoint: { gammaBohrInv: xs[best], objectiveValue: gridValues[best], row: usable[best].terms.row },
		crossings: {
			jIpBohrInv: zIp,
			jEaBohrInv: zEa,
			jEaLumoBohrInv: zEaLumo,
			distanceBohrInv: distance,
			all: { jIp: zeros.jIpHartree, jEa: zeros.jEaHartree, jEaLumo: zeros.jEaLumoHartree }
		},
		usedGammasBohrInv: xs,
		diagnostics
	};
}
