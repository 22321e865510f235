/**
 * Analysis of a dielectric tensor (science notes, section 4): symmetry check and symmetrisation,
 * eigen-decomposition (principal values and axes), positive definiteness, and the scalar summaries
 * offered to the user. The default scalar is the orientational average trace/3 (common practice).
 */
import { eigs } from 'mathjs';
import { DielectricError } from './dielectric-error';
import { type Matrix3, type Matrix3Input, type Vec3, checkedMatrix3, cross, dot, norm } from './matrix3';

export interface AnalyseTensorOptions {
	/**
	 * Relative asymmetry max|m_ij - m_ji| / max|m_kl| above which a warning is given when symmetrising.
	 * Below it the tensor is symmetrised silently (numerical noise). Default 1e-3.
	 */
	asymmetryWarnRel?: number;
	/** Relative asymmetry above which the tensor is refused. Default 0.05. */
	asymmetryMaxRel?: number;
	/**
	 * Anisotropy ratio (largest / smallest principal value) above which a warning says that a single
	 * scalar hides a large directional spread. A display choice, not a physical threshold. Default 1.5.
	 */
	anisotropyWarnRatio?: number;
}

export interface TensorAnalysis {
	/** The symmetric tensor used for everything below: (m + m^T)/2 (a fresh array). */
	symmetric: Matrix3;
	/** max|m_ij - m_ji| / max|m_kl| of the input. */
	asymmetryRel: number;
	/** True when the input was not exactly symmetric and was replaced by (m + m^T)/2. */
	symmetrised: boolean;
	/** Principal values, ascending. */
	principalValues: Vec3;
	/** Unit principal axes (Cartesian), in the order of principalValues; a right-handed orthonormal set. */
	principalAxes: [Vec3, Vec3, Vec3];
	/** trace/3: the orientational average and the default scalar (common practice). */
	traceMean: number;
	/** 3 / tr(eps^-1). */
	harmonicMean: number;
	/** det(eps)^(1/3). */
	geometricMean: number;
	/** Largest / smallest principal value (>= 1). */
	anisotropyRatio: number;
	/** The scalar used by default (= traceMean) and how it was obtained. */
	defaultEpsilon: number;
	defaultMethod: 'trace/3';
	warnings: string[];
}

function checkedTolerance(value: number | undefined, fallback: number, name: string): number {
	if (value === undefined) return fallback;
	if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
		throw new RangeError(`${name} must be a finite number >= 0, got ${String(value)}`);
	}
	return value;
}

function fmt(v: number, digits = 4): string {
	return Number(v.toPrecision(digits)).toString();
}

function toArray(v: unknown): number[] {
	const arr = Array.isArray(v) ? v : (v as { toArray(): unknown[] }).toArray();
	return arr.map((x) => Number(x));
}

/** Sign convention: the component of largest magnitude is positive (first one on ties). */
function canonicalSign(v: Vec3): Vec3 {
	let k = 0;
	for (let i = 1; i < 3; i++) if (Math.abs(v[i]) > Math.abs(v[k]) + 1e-12) k = i;
	return v[k] < 0 ? [-v[0], -v[1], -v[2]] : v;
}

function unit(v: readonly number[]): Vec3 {
	const n = norm(v);
	return [v[0] / n, v[1] / n, v[2] / n];
}

/** Any unit vector orthogonal to a unit vector a. */
function orthogonalTo(a: Vec3): Vec3 {
	const trial: Vec3 = Math.abs(a[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
	return unit(cross(a, trial));
}

/** Analyse a (nearly) symmetric 3x3 dielectric tensor. The input is not modified. */
export function analyseTensor(m: Matrix3Input, options: AnalyseTensorOptions = {}): TensorAnalysis {
	const input = checkedMatrix3(m, 'tensor');
	const warnRel = checkedTolerance(options.asymmetryWarnRel, 1e-3, 'asymmetryWarnRel');
	const maxRel = checkedTolerance(options.asymmetryMaxRel, 0.05, 'asymmetryMaxRel');
	if (warnRel > maxRel) {
		throw new RangeError(`asymmetryWarnRel (${warnRel}) must not exceed asymmetryMaxRel (${maxRel})`);
	}
	const anisotropyWarn = options.anisotropyWarnRatio ?? 1.5;
	if (typeof anisotropyWarn !== 'number' || !Number.isFinite(anisotropyWarn) || anisotropyWarn < 1) {
		throw new RangeError(`anisotropyWarnRatio must be a finite number >= 1, got ${String(anisotropyWarn)}`);
	}
	const warnings: string[] = [];

	// 1. Symmetry.
	const scale = Math.max(...input.flat().map(Math.abs));
	if (scale === 0) throw new DielectricError('tensor', 'tensor is all zeros: not positive definite');
	let maxDiff = 0;
	for (let i = 0; i < 3; i++) for (let j = i + 1; j < 3; j++) maxDiff = Math.max(maxDiff, Math.abs(input[i][j] - input[j][i]));
	const asymmetryRel = maxDiff / scale;
	if (asymmetryRel > maxRel) {
		throw new DielectricError(
			'tensor',
			`tensor is not symmetric: max|m_ij - m_ji| is ${fmt(asymmetryRel * 100, 3)}% of the largest entry ` +
				`(limit ${fmt(maxRel * 100, 3)}%); check the row/column layout and the source`
		);
	}
	const symmetric = input.map((row, i) => row.map((v, j) => (i === j ? v : (v + input[j][i]) / 2)));
	const symmetrised = maxDiff > 0;
	if (asymmetryRel > warnRel) {
		warnings.push(
			`tensor was symmetrised: max|m_ij - m_ji| is ${fmt(asymmetryRel * 100, 3)}% of the largest entry ` +
				`(warning above ${fmt(warnRel * 100, 3)}%)`
		);
	}

	// 2. Eigen-decomposition of the symmetric tensor.
	const result = eigs(symmetric);
	const pairs = result.eigenvectors
		.map((e) => ({ value: Number(e.value), vector: toArray(e.vector) }))
		.sort((a, b) => a.value - b.value);
	if (pairs.length !== 3 || pairs.some((p) => !Number.isFinite(p.value) || p.vector.length !== 3)) {
		throw new DielectricError('tensor', 'eigen-decomposition failed for this tensor');
	}
	const principalValues = pairs.map((p) => p.value) as Vec3;

	// 3. Positive definiteness.
	if (principalValues[0] <= 0) {
		throw new DielectricError(
			'tensor',
			`tensor is not positive definite: smallest principal value is ${fmt(principalValues[0])}; ` +
				'a dielectric tensor must have all principal values > 0 (physically >= 1)'
		);
	}

	// 4. Orthonormal, right-handed axes with a fixed sign convention.
	const a1 = canonicalSign(unit(pairs[0].vector));
	const p2 = pairs[1].vector;
	const proj = dot(p2, a1);
	const r2 = [p2[0] - proj * a1[0], p2[1] - proj * a1[1], p2[2] - proj * a1[2]];
	const a2 = canonicalSign(norm(r2) > 1e-8 ? unit(r2) : orthogonalTo(a1));
	const a3 = cross(a1, a2);
	const principalAxes: [Vec3, Vec3, Vec3] = [a1, a2, a3];

	// 5. Values below 1.
	const diagBelow = [0, 1, 2].filter((i) => symmetric[i][i] < 1);
	const pvBelow = principalValues.filter((v) => v < 1);
	if (diagBelow.length > 0 || pvBelow.length > 0) {
		const parts: string[] = [];
		if (diagBelow.length > 0) parts.push(`diagonal ${diagBelow.map((i) => `${'xyz'[i]}${'xyz'[i]} = ${fmt(symmetric[i][i])}`).join(', ')}`);
		if (pvBelow.length > 0) parts.push(`principal value(s) ${pvBelow.map((v) => fmt(v)).join(', ')}`);
		warnings.push(
			`${parts.join('; ')} below 1: an electronic dielectric constant of an insulator is >= 1; ` +
				'check that the tensor is eps (not chi = eps - 1) and its units'
		);
	}

	// 6. Scalar summaries.
	const [l1, l2, l3] = principalValues;
	const traceMean = (symmetric[0][0] + symmetric[1][1] + symmetric[2][2]) / 3;
	const harmonicMean = 3 / (1 / l1 + 1 / l2 + 1 / l3);
	const geometricMean = Math.cbrt(l1 * l2 * l3);
	const anisotropyRatio = l3 / l1;
	if (anisotropyRatio > anisotropyWarn) {
		warnings.push(
			`strongly anisotropic: principal values range from ${fmt(l1)} to ${fmt(l3)} (ratio ${fmt(anisotropyRatio, 3)}); ` +
				'a single scalar hides this, consider the value along the relevant direction'
		);
	}

	return {
		symmetric,
		asymmetryRel,
		symmetrised,
		principalValues,
		principalAxes,
		traceMean,
		harmonicMean,
		geometricMean,
		anisotropyRatio,
		defaultEpsilon: traceMean,
		defaultMethod: 'trace/3',
		warnings
	};
}
