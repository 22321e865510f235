/** Engine decks (NWChem, Psi4) for SRSH tuning and screened reruns, and the NWChem output reader. */
export { DeckInputError, EngineOutputError } from './errors';
export {
	type CheckedMolecule,
	type DeckAtom,
	type DeckMolecule,
	type DeckState,
	type DeckStateLabel,
	type IonMultiplicities,
	checkMolecule,
	lowestMultiplicity,
	neutralState,
	tuningStates
} from './molecule';
export {
	GAMMA_MAX_BOHR_INV,
	GAMMA_MIN_BOHR_INV,
	type SrshParameters,
	checkAlpha,
	checkEpsilon,
	checkGamma,
	fullRangeSemilocalWeight,
	gasPhaseSrsh,
	longRangeFraction,
	screenedSrsh
} from './srsh';
export {
	MAX_BASE_JOB_NAME,
	MAX_JOB_NAME,
	type StateTag,
	checkJobName,
	deckFileName,
	epsilonTag,
	gammaTag,
	jobNameFrom
} from './names';
export { type DeckHeaderOptions, type DeckProvenance, checkProvenance, deckHeader } from './provenance';
export { formatReal, formatThreshold } from './text';
export {
	DEFAULT_NWCHEM_SETTINGS,
	MAX_SCAN_POINTS,
	NWCHEM_GRIDS,
	type NwchemDeck,
	type NwchemDeckOptions,
	type NwchemDeckState,
	type NwchemGrid,
	type NwchemScanOptions,
	type NwchemScreenedJob,
	type NwchemSettings,
	type NwchemTuningJob,
	type NwchemTuningScan,
	nwchemBasisType,
	nwchemFunctionalLines,
	writeNwchemScreenedJob,
	writeNwchemTuningJob,
	writeNwchemTuningScan,
	writeNwchemTuningStateDecks
} from './nwchem';
export {
	type NwchemEchoedCam,
	type NwchemError,
	type NwchemFrontier,
	type NwchemOrbital,
	type NwchemOutput,
	type NwchemPrintedRangeSeparation,
	type NwchemTaskResult,
	type NwchemXcTerm,
	frontierOrbitals,
	readNwchemOutput
} from './nwchem-output';
export {
	DEFAULT_PSI4_SETTINGS,
	PSI4_MIN_VERSION,
	PSI4_VERSION_NOTE,
	type Psi4Deck,
	type Psi4DeckOptions,
	type Psi4ScreenedJob,
	type Psi4Settings,
	type Psi4TuningJob,
	type Psi4TuningScan,
	psi4FunctionalDict,
	writePsi4ScreenedJob,
	writePsi4TuningJob,
	writePsi4TuningScan,
	writePsi4TuningStateDecks
} from './psi4';
export { type DeckFileNames, type ScanLayout, checkScanGammas } from './scan';
export {
	type Psi4EchoedRangeSeparation,
	type Psi4Error,
	type Psi4Frontier,
	type Psi4Orbital,
	type Psi4Output,
	type Psi4PrintedExchange,
	type Psi4SummaryLine,
	type Psi4TaskResult,
	readPsi4Output
} from './psi4-output';
export { type EchoedParameters, type EngineOutput, type EngineTaskResult, detectEngine, echoedParameters, readEngineOutput } from './engine-output';
export { DECK_MANIFEST_SCHEMA, type DeckManifest, type DeckManifestEntry, deckManifest } from './manifest';
