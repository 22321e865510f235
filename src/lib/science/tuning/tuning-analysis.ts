/**
 * The whole gas-phase tuning analysis of one scan, as stored with a study and shown on its page: gamma*
 * and its diagnostics (optimalGamma), the J terms per point for the chart, the suggested refined grid,
 * and what is needed to reproduce it later: the analysis version and a hash of the exact input.
 * Pure: the browser recomputes it on every change; the server recomputes it before storing.
 */
import { objectiveNeeds, objectiveValue } from './objective-value';
import { optimalGamma, type OptimalGammaResult } from './optimal-gamma';
import { pchipInterpolant } from './pchip-interpolant';
import { suggestRefinedGrid } from './suggest-refined-grid';
import { tuningTerms } from './tuning-terms';
import { SCAN_ENERGY_FIELDS, type ScanPoint, type TuningObjective } from './types';

/**
 * Version of the analysis (interpolant, minimiser, diagnostics and their defaults). Bump it whenever a
 * change can move gamma* or change a diagnostic, so stored results say which rules made them.
 */
export const TUNING_ANALYSIS_VERSION = 'tuning-analysis/1';

export interface TuningAnalysisOptions {
	objective?: TuningObjective;
	/** Basis set of the scan (for the diffuse-function check). */
	basisSet?: string | null;
}

/** One point's terms in eV (null where an energy is missing), in input order. */
export interface TuningChartPoint {
	gammaBohrInv: number;
	excluded: boolean;
	jIpEv: number | null;
	jEaEv: number | null;
	jEaLumoEv: number | null;
}

export interface TuningAnalysis {
	analysisVersion: string;
	/** 64-bit fingerprint (hex) of the canonical input: points (with exclusions), objective, basis. */
	inputHash: string;
	input: { points: ScanPoint[]; objective: TuningObjective; basisSet: string | null };
	result: OptimalGammaResult;
	chart: TuningChartPoint[];
	/**
	 * The interpolated J terms and objective on an even grid over the used points (for the chart); the
	 * same PCHIP through the same points as the minimiser used. Empty without an optimum.
	 */
	curves: { gammaBohrInv: number[]; jIpEv: number[]; eaTermEv: (number | null)[]; objective: number[] };
	/** A finer gamma grid around gamma* (empty when there is no optimum). */
	refinedGridBohrInv: number[];
}

const CURVE_SAMPLES = 161;

function sampleCurves(chart: TuningChartPoint[], result: OptimalGammaResult): TuningAnalysis['curves'] {
	const empty = { gammaBohrInv: [], jIpEv: [], eaTermEv: [], objective: [] };
	if (!result.optimum) return empty;
	const ea = objectiveNeeds(result.objective).ea;
	const eaOf = (c: TuningChartPoint) => (ea === 'jEaLumo' ? c.jEaLumoEv : c.jEaEv);
	const used = new Set(result.usedGammasBohrInv);
	const rows: TuningChartPoint[] = [];
	for (const c of [...chart].sort((a, b) => a.gammaBohrInv - b.gammaBohrInv))
		if (!c.excluded && used.has(c.gammaBohrInv) && (rows.length === 0 || rows[rows.length - 1].gammaBohrInv !== c.gammaBohrInv)) rows.push(c);
	if (rows.length < 2) return empty;
	const xs = rows.map((r) => r.gammaBohrInv);
	const ip = pchipInterpolant(xs, rows.map((r) => r.jIpEv as number));
	const eaRows = ea === null ? [] : rows.filter((r) => eaOf(r) !== null);
	const eaF = eaRows.length >= 2 ? pchipInterpolant(eaRows.map((r) => r.gammaBohrInv), eaRows.map((r) => eaOf(r) as number)) : null;
	const out: TuningAnalysis['curves'] = { gammaBohrInv: [], jIpEv: [], eaTermEv: [], objective: [] };
	const lo = xs[0];
	const hi = xs[xs.length - 1];
	for (let i = 0; i < CURVE_SAMPLES; i++) {
		const g = i === CURVE_SAMPLES - 1 ? hi : lo + ((hi - lo) * i) / (CURVE_SAMPLES - 1);
		const j = ip.value(g);
		const e = eaF && g >= eaF.minX && g <= eaF.maxX ? eaF.value(g) : null;
		const terms = ea === 'jEaLumo' ? { jIpEv: j, jEaLumoEv: e } : { jIpEv: j, jEaEv: e };
		out.gammaBohrInv.push(g);
		out.jIpEv.push(j);
		out.eaTermEv.push(e);
		out.objective.push(objectiveValue(terms, { objective: result.objective }) ?? NaN);
	}
	return out;
}

/** The input in a fixed key order with exact numbers, so equal inputs give equal text (for people and tests). */
export function canonicalTuningInput(points: readonly ScanPoint[], objective: TuningObjective, basisSet: string | null): string {
	const rows = points.map((p) => [p.gammaBohrInv, ...SCAN_ENERGY_FIELDS.map((f) => p[f] ?? null), p.excluded === true]);
	return JSON.stringify({ v: TUNING_ANALYSIS_VERSION, objective, basisSet, points: rows });
}

/**
 * A 64-bit fingerprint (hex) of the 32-bit words given: two multiply-xor lanes with a final avalanche
 * (the public-domain "cyrb53" construction, kept to 2 x 32 bits). Not cryptographic: it identifies an input.
 */
function fingerprintWords(words: ArrayLike<number>): string {
	let h1 = 0xdeadbeef;
	let h2 = 0x41c6ce57;
	for (let i = 0; i < words.length; i++) {
		const w = words[i];
		h1 = Math.imul(h1 ^ w, 2654435761);
		h2 = Math.imul(h2 ^ w, 1597334677);
	}
	h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
	h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
	return (h2 >>> 0).toString(16).padStart(8, '0') + (h1 >>> 0).toString(16).padStart(8, '0');
}

/** Fingerprint of a text (its UTF-16 code units). */
export function inputFingerprintHex(text: string): string {
	const words = new Uint32Array(text.length);
	for (let i = 0; i < text.length; i++) words[i] = text.charCodeAt(i);
	return fingerprintWords(words);
}

/**
 * Fingerprint of the exact analysis input: the analysis version, objective and basis (as text), then per
 * point the IEEE-754 bits of gamma and the six energies (missing = NaN, a bit pattern no energy has)
 * and the exclusion flag. Equal inputs, bit for bit, give equal fingerprints; hashing the bits instead
 * of a JSON text keeps a 1,000-point scan cheap.
 */
export function tuningInputFingerprint(points: readonly ScanPoint[], objective: TuningObjective, basisSet: string | null): string {
	const head = JSON.stringify([TUNING_ANALYSIS_VERSION, objective, basisSet]);
	const per = 1 + SCAN_ENERGY_FIELDS.length + 1;
	const values = new Float64Array(points.length * per);
	points.forEach((p, i) => {
		values[i * per] = p.gammaBohrInv;
		SCAN_ENERGY_FIELDS.forEach((f, k) => (values[i * per + 1 + k] = p[f] ?? Number.NaN));
		values[i * per + per - 1] = p.excluded === true ? 1 : 0;
	});
	const bits = new Uint32Array(values.buffer);
	const words = new Uint32Array(head.length + 1 + bits.length);
	for (let i = 0; i < head.length; i++) words[i] = head.charCodeAt(i);
	words[head.length] = points.length;
	words.set(bits, head.length + 1);
	return fingerprintWords(words);
}

const HARTREE_TO_EV = 27.211386245988; // CODATA 2018

export function tuningAnalysis(points: readonly ScanPoint[], options: TuningAnalysisOptions = {}): TuningAnalysis {
	const basisSet = options.basisSet ?? null;
	const result = optimalGamma(points, { objective: options.objective, basisSet });
	const ev = (v: number | null) => (v === null ? null : v * HARTREE_TO_EV);
	const chart = tuningTerms(points).map((t) => ({
		gammaBohrInv: t.gammaBohrInv,
		excluded: t.excluded,
		jIpEv: ev(t.jIpHartree),
		jEaEv: ev(t.jEaHartree),
		jEaLumoEv: ev(t.jEaLumoHartree)
	}));
	const refinedGridBohrInv = result.optimum ? suggestRefinedGrid(result, points) : [];
	const input = {
		points: points.map((p) => ({ ...p })),
		objective: result.objective,
		basisSet
	};
	return {
		analysisVersion: TUNING_ANALYSIS_VERSION,
		inputHash: tuningInputFingerprint(points, result.objective, basisSet),
		input,
		result,
		chart,
		curves: sampleCurves(chart, result),
		refinedGridBohrInv
	};
}
