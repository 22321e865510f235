/** Optimal tuning of the range-separation parameter gamma (science notes, section 3). */
export * from './types';
export { TuningInputError } from './tuning-input-error';
export { validatedScanPoints, type ValidatedScanPointsOptions } from './validated-scan-points';
export { tuningTerms, type TuningTerms, type TuningTermsOptions } from './tuning-terms';
export {
	objectiveValue,
	objectiveNeeds,
	objectiveUnit,
	type ObjectiveTermsEv,
	type ObjectiveValueOptions
} from './objective-value';
export {
	cubicHermiteInterpolant,
	type CubicInterpolant,
	type CubicHermiteInterpolantOptions
} from './cubic-hermite-interpolant';
export { pchipInterpolant, type PchipInterpolantOptions } from './pchip-interpolant';
export { interpolantZeros, type InterpolantZerosOptions } from './interpolant-zeros';
export { bracketedRoot, type BracketedRootOptions } from './bracketed-root';
export { brentMinimum, type BrentMinimum, type BrentMinimumOptions } from './brent-minimum';
export { smoothnessOutliers, type SmoothnessOutlier, type SmoothnessOutliersOptions } from './smoothness-outliers';
export {
	optimalGamma,
	type GammaOptimum,
	type OptimalGammaOptions,
	type OptimalGammaResult,
	type ZeroCrossings
} from './optimal-gamma';
export { suggestRefinedGrid, type SuggestRefinedGridOptions } from './suggest-refined-grid';
export { basisHasDiffuseFunctions } from './basis-has-diffuse-functions';
export {
	TUNING_ANALYSIS_VERSION,
	canonicalTuningInput,
	inputFingerprintHex,
	tuningInputFingerprint,
	tuningAnalysis,
	type TuningAnalysis,
	type TuningAnalysisOptions,
	type TuningChartPoint
} from './tuning-analysis';
