/**
 * Errors raised by the run-bundle writer, the manifest reader and the archive checks.
 *
 * Each carries the offending input field, manifest field or archive entry, so a route can turn it
 * into a `fail(400, ...)` with that message and the upload page can point at the entry.
 */

/** A bundle request that cannot be written. `field` names the offending input. */
export class BundleInputError extends Error {
	readonly field: string;

	constructor(field: string, message: string) {
		super(`${field}: ${message}`);
		this.name = 'BundleInputError';
		this.field = field;
	}
}

/** A `manifest.json` that is not a valid Kappaline bundle manifest. `field` is a JSON path. */
export class ManifestError extends Error {
	readonly field: string;

	constructor(field: string, message: string) {
		super(`manifest.json ${field}: ${message}`);
		this.name = 'ManifestError';
		this.field = field;
	}
}

/** Why an uploaded archive was refused. */
export type ArchiveProblem =
	| 'archive-too-large'
	| 'not-a-zip'
	| 'unsupported-zip'
	| 'too-many-entries'
	| 'entry-too-large'
	| 'total-too-large'
	| 'compression-ratio'
	| 'unsafe-path'
	| 'duplicate-entry'
	| 'symlink'
	| 'nested-archive'
	| 'encrypted'
	| 'ambiguous-manifest';

/**
 * An uploaded archive refused as a whole (nothing of it is read further). `entry` is the archive
 * entry name as stored in the archive, or null when the problem is the archive itself.
 */
export class ArchiveError extends Error {
	readonly problem: ArchiveProblem;
	readonly entry: string | null;

	constructor(problem: ArchiveProblem, entry: string | null, message: string) {
		super(entry === null ? message : `entry ${JSON.stringify(entry)}: ${message}`);
		this.name = 'ArchiveError';
		this.problem = problem;
		this.entry = entry;
	}
}
