import { DEFAULT_ZIP_LIMITS } from '$lib/formats/bundle/inspect-zip';

/** Largest raw upload (engine outputs, bundle zips) the app takes, bytes; the server's body limit sits just above it. */
export const MAX_UPLOAD_BYTES = 50_000_000;

/** The upload limits in words, shown beside every output-upload field. */
export function uploadLimitsText(): string {
	const mib = (b: number) => `${Math.round(b / (1024 * 1024))} MiB`;
	const z = DEFAULT_ZIP_LIMITS;
	return `Up to ${MAX_UPLOAD_BYTES / 1e6} MB per upload and ${z.maxEntries} files; a zip may hold up to ${z.maxEntries} entries, ${mib(z.maxEntryBytes)} per file and ${mib(z.maxTotalBytes)} unpacked.`;
}
