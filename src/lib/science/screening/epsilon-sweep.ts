/**
 * How the screened fractions and the quick polarization estimates move with epsilon: one row per epsilon
 * with beta, 1/epsilon, the Born polarization (plus an optional substrate image-charge term) and the
 * shifted IP, EA and gap (science notes, sections 2 and 5).
 *
 * With `imageCharge`, P = P_Born(epsilon) + P_image(z, eps_s) for both carriers: a quick additive estimate
 * (film bulk cavity term + substrate image term), not an electrostatic model of the interface.
 */
import { bornPolarizationEv } from './born-polarization-ev';
import { type ImageChargePolarizationInput, imageChargePolarizationEv } from './image-charge-polarization-ev';
import { screenedFractions } from './screened-fractions';
import { ScreeningError } from './screening-error';
import { solidStateLevels } from './solid-state-levels';
import { epsilonValue, finiteNumber, fractionValue, inputObject, positiveNumber } from './validate';

export interface EpsilonRange {
	from: number;
	to: number;
	step: number;
}

export interface EpsilonSweepInput {
	alpha: number;
	ipGasEv: number;
	eaGasEv: number;
	/** Born cavity radius in Å. */
	radiusA: number;
	/** Explicit values (kept in the given order) or an inclusive grid from..to by step. */
	epsilons: readonly number[] | EpsilonRange;
	/** Optional substrate image-charge term added to the Born term. */
	imageCharge?: ImageChargePolarizationInput | null;
}

export interface EpsilonSweepOptions {
	/** Largest number of rows allowed. Default 2000. */
	maxRows?: number;
}

export interface EpsilonSweepRow {
	epsilon: number;
	beta: number;
	longRange: number;
	betaNegative: boolean;
	bornEv: number;
	/** Image-charge term, or null when no substrate was given. */
	imageChargeEv: number | null;
	/** Polarization energy used for both carriers: bornEv + (imageChargeEv ?? 0). */
	pEv: number;
	ipSolidEv: number;
	eaSolidEv: number;
	gapSolidEv: number;
}

export interface EpsilonSweep {
	rows: EpsilonSweepRow[];
	gapGasEv: number;
	warnings: string[];
}

const DEFAULT_MAX_ROWS = 2000;

function grid(range: EpsilonRange, maxRows: number): number[] {
	const from = epsilonValue(range.from, 'epsilons.from');
	const to = epsilonValue(range.to, 'epsilons.to');
	const step = finiteNumber(range.step, 'epsilons.step');
	if (step <= 0) throw new ScreeningError('epsilons.step', `epsilons.step must be > 0, got ${step}`);
	if (to < from) throw new ScreeningError('epsilons.to', `epsilons.to (${to}) must not be below epsilons.from (${from})`);
	// Tolerate rounding so that e.g. 1..4 by 0.1 includes 4.
	const count = Math.floor((to - from) / step + 1e-9) + 1;
	if (count > maxRows) {
		throw new ScreeningError(
			'epsilons.step',
			`the grid ${from}..${to} by ${step} has ${count} rows; at most ${maxRows} are allowed (use a larger step)`
		);
	}
	return Array.from({ length: count }, (_, i) => Number((from + i * step).toPrecision(12)));
}

/** Rows of screened fractions and Born (+ image) shifted levels for a range of epsilon. */
export function epsilonSweep(input: EpsilonSweepInput, options: EpsilonSweepOptions = {}): EpsilonSweep {
	inputObject(input, 'epsilonSweep');
	const maxRows = options.maxRows ?? DEFAULT_MAX_ROWS;
	if (!Number.isInteger(maxRows) || maxRows < 1) {
		throw new RangeError(`maxRows must be a positive integer, got ${String(maxRows)}`);
	}
	const alpha = fractionValue(input.alpha, 'alpha');
	const ipGasEv = finiteNumber(input.ipGasEv, 'ipGasEv');
	const eaGasEv = finiteNumber(input.eaGasEv, 'eaGasEv');
	const radiusA = positiveNumber(input.radiusA, 'radiusA');

	let epsilons: number[];
	const e = input.epsilons;
	if (Array.isArray(e)) {
		if (e.length === 0) throw new ScreeningError('epsilons', 'epsilons must not be empty');
		if (e.length > maxRows) {
			throw new ScreeningError('epsilons', `${e.length} epsilon values given; at most ${maxRows} are allowed`);
		}
		epsilons = e.map((v, i) => epsilonValue(v, `epsilons[${i}]`));
	} else if (e !== null && typeof e === 'object') {
		epsilons = grid(e as EpsilonRange, maxRows);
	} else {
		throw new ScreeningError('epsilons', 'epsilons must be a list of values or { from, to, step }');
	}

	const imageChargeEv =
		input.imageCharge === undefined || input.imageCharge === null ? null : imageChargePolarizationEv(input.imageCharge);

	const warnings: string[] = [];
	const rows: EpsilonSweepRow[] = [];
	const closedAt: number[] = [];
	for (const epsilon of epsilons) {
		const f = screenedFractions({ alpha, epsilon });
		const bornEv = bornPolarizationEv({ radiusA, epsilon });
		const pEv = bornEv + (imageChargeEv ?? 0);
		const levels = solidStateLevels({ ipGasEv, eaGasEv, pPlusEv: pEv, pMinusEv: pEv });
		if (levels.gapSolidEv <= 0) closedAt.push(epsilon);
		rows.push({
			epsilon,
			beta: f.beta,
			longRange: f.longRange,
			betaNegative: f.betaNegative,
			bornEv,
			imageChargeEv,
			pEv,
			ipSolidEv: levels.ipSolidEv,
			eaSolidEv: levels.eaSolidEv,
			gapSolidEv: levels.gapSolidEv
		});
	}
	if (closedAt.length > 0) {
		warnings.push(
			`the estimated polarization closes the gap at ${closedAt.length} epsilon value(s) (first: ${closedAt[0]}): ` +
				'the model is outside its range there'
		);
	}
	if (rows.some((r) => r.betaNegative)) {
		warnings.push(`beta is negative where 1/epsilon < alpha (epsilon > ${Number((1 / alpha).toPrecision(4))}); this is legal`);
	}
	return { rows, gapGasEv: ipGasEv - eaGasEv, warnings };
}
