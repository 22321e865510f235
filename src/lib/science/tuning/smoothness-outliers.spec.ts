import { describe, expect, it } from 'vitest';
import { smoothnessOutliers } from './smoothness-outliers';

// Synthetic data from a smooth model energy curve E(gamma) (not engine output):
// E = -1000 + 0.35 (1 - exp(-gamma / 0.25)) hartree, gammas 0.05 .. 0.50 bohr^-1.
const gammas = [0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5];
const model = (g: number) => -1000 + 0.35 * (1 - Math.exp(-g / 0.25));

describe('smoothnessOutliers', () => {
	it('flags nothing on smooth data', () => {
		expect(smoothnessOutliers(gammas, gammas.map(model))).toEqual([]);
	});

	it('flags an interior jump of 2 mHa and names its gamma', () => {
		const ys = gammas.map((g, i) => model(g) + (i === 5 ? 2e-3 : 0));
		const found = smoothnessOutliers(gammas, ys);
		expect(found).toHaveLength(1);
		expect(found[0].x).toBe(0.3);
		// The local cubic fit recovers the jump to within 10 % here (limited by this model's strong curvature).
		expect(Math.abs(found[0].residual - 2e-3)).toBeLessThan(2e-4);
	});

	it('flags a jump at the first point of a mildly curved series (extrapolated fit)', () => {
		const mild = (g: number) => -500 + 0.12 * g - 0.1 * g * g; // synthetic, quadratic
		const ys = gammas.map((g, i) => mild(g) - (i === 0 ? 2e-3 : 0));
		expect(smoothnessOutliers(gammas, ys).map((o) => o.x)).toEqual([0.05]);
	});

	it('is cautious at the end of a strongly curved series: 20 mHa not flagged, 50 mHa flagged', () => {
		// For this model a cubic extrapolated one step to gamma = 0.05 is ~1 mHa off and the cubic and
		// quadratic extrapolations differ by several mHa, so only large end-point jumps are reported.
		const at = (jump: number) => smoothnessOutliers(gammas, gammas.map((g, i) => model(g) - (i === 0 ? jump : 0)));
		expect(at(2e-2)).toEqual([]);
		expect(at(5e-2).map((o) => o.x)).toEqual([0.05]);
	});

	it('flags two separate bad points', () => {
		const ys = gammas.map((g, i) => model(g) + (i === 2 ? 3e-3 : i === 7 ? -4e-3 : 0));
		expect(smoothnessOutliers(gammas, ys).map((o) => o.x)).toEqual([0.15, 0.4]);
	});

	it('ignores jumps below the absolute threshold (1e-4 Ha by default)', () => {
		const ys = gammas.map((g, i) => model(g) + (i === 5 ? 5e-5 : 0));
		expect(smoothnessOutliers(gammas, ys)).toEqual([]);
	});

	it('needs at least 5 points', () => {
		expect(smoothnessOutliers([0.1, 0.2, 0.3, 0.4], [0, 1, 0, 1])).toEqual([]);
	});
});
