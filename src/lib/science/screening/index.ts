export { ScreeningError } from './screening-error';
export {
	screenedFractions,
	type ScreenedFractionsInput,
	type ScreenedFractions
} from './screened-fractions';
export {
	semilocalExchangeWeights,
	type SemilocalExchangeWeightsInput,
	type SemilocalExchangeWeights
} from './semilocal-exchange-weights';
export { bornPolarizationEv, type BornPolarizationInput } from './born-polarization-ev';
export { bornRadiusA, type BornRadiusInput } from './born-radius-a';
export { imageChargePolarizationEv, type ImageChargePolarizationInput } from './image-charge-polarization-ev';
export { solidStateLevels, type SolidStateLevelsInput, type SolidStateLevels } from './solid-state-levels';
export {
	epsilonSweep,
	type EpsilonSweepInput,
	type EpsilonSweepOptions,
	type EpsilonSweepRow,
	type EpsilonSweep,
	type EpsilonRange
} from './epsilon-sweep';
export { rerunLevels, type RerunLevelsInput, type RerunLevels } from './rerun-levels';
export { CAUTIONS } from './cautions';
export { solidStateEstimate, type SolidStateEstimateInput, type SolidStateEstimate } from './solid-state-estimate';
