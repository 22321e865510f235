export { DielectricError, PolarizationCatastropheError } from './dielectric-error';
export type { Vec3, Matrix3, Matrix3Input } from './matrix3';
export { analyseTensor, type AnalyseTensorOptions, type TensorAnalysis } from './analyse-tensor';
export { epsilonAlong } from './epsilon-along';
export { directionFromUvw } from './direction-from-uvw';
export { normalFromHkl } from './normal-from-hkl';
export {
	epsilonFromRefractiveIndex,
	REFRACTIVE_INDEX_NOTE,
	type RefractiveIndexInput,
	type EpsilonFromRefractiveIndex
} from './epsilon-from-refractive-index';
export {
	epsilonUncertaintyFromRefractiveIndex,
	type RefractiveIndexUncertaintyInput
} from './epsilon-uncertainty-from-refractive-index';
export {
	polarizabilityVolumeA3,
	polarizabilityToA3Factor,
	type PolarizabilityUnit,
	type PolarizabilityInput
} from './polarizability-volume-a3';
export {
	clausiusMossottiEpsilon,
	type ClausiusMossottiInput,
	type ClausiusMossottiOptions,
	type ClausiusMossottiResult
} from './clausius-mossotti-epsilon';
export {
	clausiusMossottiPolarizabilityA3,
	type ClausiusMossottiPolarizabilityInput
} from './clausius-mossotti-polarizability-a3';
