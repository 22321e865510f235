/**
 * Safety checks for uploaded zip archives, before anything is extracted, and bounded extraction.
 *
 * {@link inspectZip} refuses an archive (throwing {@link ArchiveError} naming the entry) when it is
 * too large, has too many entries, declares more uncompressed bytes than allowed, has an entry whose
 * compression ratio suggests a zip bomb, a name that could escape the extraction folder ('..',
 * absolute paths, backslashes, drive letters), a symbolic link or other special file, a duplicated
 * name, an encrypted entry, or a nested archive. The checks read the raw central directory (see
 * zip-directory.ts), so names are judged as stored, before any reader normalises them; JSZip must
 * then list exactly the same files. {@link readZipEntries} extracts chosen entries through JSZip with
 * a byte counter that stops an entry as soon as it inflates beyond its declared size.
 */
import JSZip from 'jszip';
import { ArchiveError } from './errors';
import { type ZipDirectoryEntry, readZipDirectory } from './zip-directory';

/** Upload limits (bytes unless stated). */
export interface ZipLimits {
	/** Size of the uploaded archive itself. */
	maxArchiveBytes: number;
	/** Entries in the archive (folders included). */
	maxEntries: number;
	/** Uncompressed size of one entry. */
	maxEntryBytes: number;
	/** Uncompressed size of all entries together. */
	maxTotalBytes: number;
	/** Uncompressed / compressed size of one entry (checked for entries above 4 KiB). */
	maxCompressionRatio: number;
}

const MIB = 1024 * 1024;

/** Default limits: generous for NWChem outputs (a few MB each, compressing about 5:1). */
export const DEFAULT_ZIP_LIMITS: Readonly<ZipLimits> = Object.freeze({
	maxArchiveBytes: 100 * MIB,
	maxEntries: 2000,
	maxEntryBytes: 64 * MIB,
	maxTotalBytes: 512 * MIB,
	maxCompressionRatio: 100
});

/** Entries at or below this size are not judged by their compression ratio. */
const RATIO_FLOOR_BYTES = 4096;

/** Extensions of archive and compressed formats refused inside an upload. */
const NESTED_ARCHIVE = /\.(zip|tar|gz|tgz|bz2|tbz2?|xz|txz|7z|rar|zst|lz|lzma|z|jar|war|cpio|cab|iso)$/i;

/** One file or folder of an inspected archive. */
export interface InspectedEntry {
	name: string;
	directory: boolean;
	/** Declared uncompressed size. */
	bytes: number;
	compressedBytes: number;
}

/** The result of a successful inspection. */
export interface ZipInspection {
	entries: InspectedEntry[];
	/** Sum of the declared uncompressed sizes. */
	totalBytes: number;
	limits: ZipLimits;
}

/** Check and complete partial limits. */
export function checkZipLimits(partial: Partial<ZipLimits> | undefined): ZipLimits {
	const limits: ZipLimits = { ...DEFAULT_ZIP_LIMITS, ...(partial ?? {}) };
	for (const [key, value] of Object.entries(limits)) {
		if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
			throw new RangeError(`zip limit ${key} must be a positive number, got ${String(value)}`);
		}
	}
	return limits;
}

function formatBytes(n: number): string {
	if (n >= MIB) return `${(n / MIB).toFixed(1)} MiB`;
	if (n >= 1024) return `${(n / 1024).toFixed(1)} KiB`;
	return `${n} bytes`;
}

/** Why a stored name is unsafe to extract, or null when it is fine. */
export function unsafeNameReason(name: string): string | null {
	if (name.length === 0) return 'the name is empty';
	if (name.length > 512) return 'the name is longer than 512 characters';
	// eslint-disable-next-line no-control-regex
	if (/[\u0000-\u001f\u007f]/.test(name)) return 'the name contains control characters';
	if (name.includes('\\')) return 'the name contains a backslash (a Windows path); names must use "/"';
	if (name.startsWith('/')) return 'absolute path: names must be relative to the archive';
	if (/^[A-Za-z]:/.test(name)) return 'the name starts with a drive letter';
	const segments = (name.endsWith('/') ? name.slice(0, -1) : name).split('/');
	if (segments.includes('..')) return 'the name contains ".." and would land outside the extraction folder';
	if (segments.some((s) => s === '' || s === '.')) return 'the name has an empty or "." path segment';
	return null;
}

const S_IFMT = 0o170000;
const S_IFREG = 0o100000;
const S_IFDIR = 0o040000;
const S_IFLNK = 0o120000;

function checkEntry(e: ZipDirectoryEntry, limits: ZipLimits, judgeRatio: boolean): void {
	const reason = unsafeNameReason(e.name);
	if (reason) throw new ArchiveError('unsafe-path', e.name, reason);
	if (e.unixMode !== null) {
		const type = e.unixMode & S_IFMT;
		if (type === S_IFLNK) throw new ArchiveError('symlink', e.name, 'symbolic links are not accepted');
		if (type !== 0 && type !== S_IFREG && type !== S_IFDIR) {
			throw new ArchiveError('symlink', e.name, `special files (Unix mode ${type.toString(8)}) are not accepted`);
		}
	}
	if (e.flags & 0x1) throw new ArchiveError('encrypted', e.name, 'encrypted entries are not accepted');
	if (e.directory) return;
	if (e.method !== 0 && e.method !== 8) {
		throw new ArchiveError('unsupported-zip', e.name, `compression method ${e.method} is not supported (only stored and deflate)`);
	}
	if (NESTED_ARCHIVE.test(e.name)) {
		throw new ArchiveError('nested-archive', e.name, 'archives inside the archive are not accepted; put the files themselves in one zip');
	}
	if (e.uncompressedBytes > limits.maxEntryBytes) {
		throw new ArchiveError('entry-too-large', e.name, `${formatBytes(e.uncompressedBytes)} uncompressed exceeds the limit of ${formatBytes(limits.maxEntryBytes)} per file`);
	}
	// Only entries that will be inflated are judged by their ratio: the engine's own scratch files
	// (NWChem's runtime database `.db` compresses well over 100:1) may sit in a zipped run folder.
	if (judgeRatio && e.uncompressedBytes > RATIO_FLOOR_BYTES) {
		const ratio = e.uncompressedBytes / Math.max(e.compressedBytes, 1);
		if (ratio > limits.maxCompressionRatio) {
			throw new ArchiveError(
				'compression-ratio',
				e.name,
				`compresses ${Math.round(ratio)}:1 (${formatBytes(e.compressedBytes)} -> ${formatBytes(e.uncompressedBytes)}), over the limit of ${limits.maxCompressionRatio}:1 (a zip bomb?)`
			);
		}
	}
}

/** Inspect and open: the checks of {@link inspectZip}, plus the JSZip instance that read the archive. */
async function openZip(
	bytes: Uint8Array,
	partial?: Partial<ZipLimits>,
	willRead: (name: string) => boolean = () => true
): Promise<{ inspection: ZipInspection; zip: JSZip }> {
	const limits = checkZipLimits(partial);
	if (!(bytes instanceof Uint8Array)) throw new ArchiveError('not-a-zip', null, 'the upload is not binary data');
	if (bytes.length > limits.maxArchiveBytes) {
		throw new ArchiveError('archive-too-large', null, `the archive is ${formatBytes(bytes.length)}, over the limit of ${formatBytes(limits.maxArchiveBytes)}`);
	}
	const directory = readZipDirectory(bytes);
	if (directory.length > limits.maxEntries) {
		throw new ArchiveError('too-many-entries', null, `the archive has ${directory.length} entries, over the limit of ${limits.maxEntries}`);
	}
	const seen = new Map<string, string>();
	let total = 0;
	for (const e of directory) {
		checkEntry(e, limits, willRead(e.name));
		const key = e.name.replace(/\/$/, '').toLowerCase();
		const prev = seen.get(key);
		if (prev !== undefined) {
			throw new ArchiveError('duplicate-entry', e.name, prev === e.name ? 'the name occurs twice' : `the name differs from ${JSON.stringify(prev)} only in letter case`);
		}
		seen.set(key, e.name);
		total += e.uncompressedBytes;
		if (total > limits.maxTotalBytes) {
			throw new ArchiveError(
				'total-too-large',
				e.name,
				`with this entry the archive unpacks to more than ${formatBytes(limits.maxTotalBytes)}, the limit for all files together`
			);
		}
	}
	let zip: JSZip;
	try {
		zip = await JSZip.loadAsync(bytes, { createFolders: false });
	} catch (e) {
		throw new ArchiveError('not-a-zip', null, `the zip archive cannot be read: ${(e as Error).message}`);
	}
	const rawFiles = directory.filter((e) => !e.directory).map((e) => e.name);
	const jsFiles = Object.values(zip.files).filter((f) => !f.dir);
	const stray = jsFiles.find((f) => !rawFiles.includes(f.unsafeOriginalName ?? f.name) || f.name !== (f.unsafeOriginalName ?? f.name));
	if (stray || jsFiles.length !== rawFiles.length) {
		throw new ArchiveError('not-a-zip', stray?.name ?? null, 'the archive\'s entries cannot be listed consistently (a crafted archive?)');
	}
	return {
		zip,
		inspection: {
			entries: directory.map((e) => ({ name: e.name, directory: e.directory, bytes: e.uncompressedBytes, compressedBytes: e.compressedBytes })),
			totalBytes: total,
			limits
		}
	};
}

/**
 * Check an uploaded zip before extracting anything. Resolves with the list of entries, or rejects
 * with an {@link ArchiveError} whose `entry` names the offending entry and `problem` says why.
 */
export async function inspectZip(bytes: Uint8Array, limits?: Partial<ZipLimits>): Promise<ZipInspection> {
	return (await openZip(bytes, limits)).inspection;
}

interface StreamHelper {
	on(event: 'data', cb: (chunk: Uint8Array) => void): StreamHelper;
	on(event: 'error', cb: (e: Error) => void): StreamHelper;
	on(event: 'end', cb: () => void): StreamHelper;
	resume(): StreamHelper;
	pause(): StreamHelper;
}

/** First bytes of archive and compressed formats (zip, gzip, bzip2, xz, 7z, zstd) and tar's marker. */
function looksLikeArchive(b: Uint8Array): boolean {
	const starts = (sig: number[]) => sig.every((v, i) => b[i] === v);
	if (starts([0x50, 0x4b, 0x03, 0x04]) || starts([0x50, 0x4b, 0x05, 0x06]) || starts([0x1f, 0x8b]) || starts([0x42, 0x5a, 0x68])) return true;
	if (starts([0xfd, 0x37, 0x7a, 0x58, 0x5a, 0x00]) || starts([0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c]) || starts([0x28, 0xb5, 0x2f, 0xfd])) return true;
	return b.length > 262 && String.fromCharCode(...b.subarray(257, 262)) === 'ustar';
}

/** Inflate one entry through JSZip, stopping as soon as it grows past `maxBytes`. */
function readBounded(file: JSZip.JSZipObject, maxBytes: number): Promise<Uint8Array> {
	return new Promise((resolve, reject) => {
		const chunks: Uint8Array[] = [];
		let total = 0;
		let done = false;
		const stream = (file as unknown as { internalStream(type: 'uint8array'): StreamHelper }).internalStream('uint8array');
		stream
			.on('data', (chunk) => {
				if (done) return;
				total += chunk.length;
				if (total > maxBytes) {
					done = true;
					stream.pause();
					reject(new ArchiveError('compression-ratio', file.name, `inflates beyond its declared size of ${formatBytes(maxBytes)} (a zip bomb?)`));
					return;
				}
				chunks.push(chunk);
			})
			.on('error', (e) => {
				if (done) return;
				done = true;
				reject(new ArchiveError('not-a-zip', file.name, `cannot be decompressed: ${e.message}`));
			})
			.on('end', () => {
				if (done) return;
				done = true;
				const out = new Uint8Array(total);
				let at = 0;
				for (const c of chunks) {
					out.set(c, at);
					at += c.length;
				}
				resolve(out);
			})
			.resume();
	});
}

/** An extracted entry. */
export interface ZipEntryBytes {
	name: string;
	bytes: Uint8Array;
}

/**
 * Inspect the archive (as {@link inspectZip}), then extract the files whose names pass `select`,
 * each bounded by its declared size. Extracted content that is itself an archive is refused.
 */
export async function readZipEntries(
	bytes: Uint8Array,
	select: (name: string) => boolean,
	limits?: Partial<ZipLimits>
): Promise<{ inspection: ZipInspection; files: ZipEntryBytes[] }> {
	const { inspection, zip } = await openZip(bytes, limits, select);
	const files: ZipEntryBytes[] = [];
	for (const entry of inspection.entries) {
		if (entry.directory || !select(entry.name)) continue;
		const file = zip.file(entry.name);
		if (!file) throw new ArchiveError('not-a-zip', entry.name, 'listed in the archive but cannot be opened');
		const content = await readBounded(file, entry.bytes);
		if (content.length !== entry.bytes) {
			throw new ArchiveError('not-a-zip', entry.name, `holds ${content.length} bytes but declares ${entry.bytes}`);
		}
		if (looksLikeArchive(content)) {
			throw new ArchiveError('nested-archive', entry.name, 'is itself an archive or compressed file; put the files themselves in one zip');
		}
		files.push({ name: entry.name, bytes: content });
	}
	return { inspection, files };
}
