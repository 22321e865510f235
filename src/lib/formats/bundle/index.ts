/** Run bundles: zip of decks, scripts, README and manifest; manifest reader; safe ingestion of outputs. */
export { ArchiveError, type ArchiveProblem, BundleInputError, ManifestError } from './errors';
export { SHA256_HEX, sha256Hex } from './sha256';
export {
	type BundleFolder,
	SCREENED_DIR,
	TUNING_DIR,
	epsilonFolderTag,
	outputPathOf,
	parseBundleFolder,
	screenedFolder,
	tuningFolder
} from './layout';
export {
	BUNDLE_FORMAT,
	BUNDLE_SCHEMA_VERSION,
	type BundleAtom,
	type BundleDeckInfo,
	type BundleDeckKind,
	type BundleEngine,
	type BundleFileEntry,
	type BundleFileRole,
	type BundleManifest,
	type BundleState,
	type BundleStateLabel,
	isSafeBundlePath,
	readManifest
} from './manifest';
export {
	DEFAULT_SCRIPT_SETTINGS,
	type ScriptContext,
	type ScriptSettings,
	checkScriptSettings,
	pbsScript,
	runLocalScript,
	slurmScript
} from './scripts';
export { type ReadmeContext, bundleReadme } from './readme';
export { type BundleFile, type BundleInput, type BundlePlan, buildBundle, planBundle, zipBundle } from './build';
export {
	DEFAULT_ZIP_LIMITS,
	type InspectedEntry,
	type ZipEntryBytes,
	type ZipInspection,
	type ZipLimits,
	checkZipLimits,
	inspectZip,
	readZipEntries,
	unsafeNameReason
} from './inspect-zip';
export { type ZipDirectoryEntry, readZipDirectory } from './zip-directory';
export {
	type IngestFileInput,
	type IngestOptions,
	type IngestProblem,
	type IngestProblemCode,
	type IngestResult,
	type IngestUpload,
	type IngestedFile,
	type IngestedRerun,
	type IngestedScanPoint,
	ingestOutputs
} from './ingest';
