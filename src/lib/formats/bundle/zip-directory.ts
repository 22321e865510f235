/**
 * A minimal reader of a zip archive's central directory (PKWARE APPNOTE.TXT, sections 4.3.12
 * "central directory structure" and 4.3.16 "end of central directory record"): entry names exactly
 * as stored, declared sizes, compression method, flags and external attributes. Nothing is
 * decompressed. Used to check an upload before any entry is extracted; ZIP64 archives are refused
 * (the upload limits are far below the 4 GiB and 65535-entry bounds that need it).
 */
import { ArchiveError } from './errors';

/** One central-directory record. */
export interface ZipDirectoryEntry {
	/** Name as stored (decoded as UTF-8; '\\' and '..' kept as they are). */
	name: string;
	/** Declared compressed and uncompressed sizes in bytes. */
	compressedBytes: number;
	uncompressedBytes: number;
	/** 0 stored, 8 deflate, others unsupported here. */
	method: number;
	/** General-purpose flags (bit 0: encrypted). */
	flags: number;
	/** Host system of "version made by" (3: Unix, 0: MS-DOS, 19: OS X). */
	madeBy: number;
	/** Unix mode (high 16 bits of the external attributes) when made on a Unix-like host, else null. */
	unixMode: number | null;
	/** MS-DOS attributes (low byte of the external attributes). */
	dosAttributes: number;
	/** Name ends with '/' (a folder). */
	directory: boolean;
}

const EOCD_SIGNATURE = 0x06054b50;
const CENTRAL_SIGNATURE = 0x02014b50;
const EOCD_MIN = 22;

/** Read the central directory. Throws {@link ArchiveError} (`not-a-zip`, `unsupported-zip`). */
export function readZipDirectory(bytes: Uint8Array): ZipDirectoryEntry[] {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	let eocd = -1;
	for (let i = bytes.length - EOCD_MIN; i >= Math.max(0, bytes.length - EOCD_MIN - 0xffff); i--) {
		if (view.getUint32(i, true) === EOCD_SIGNATURE) {
			eocd = i;
			break;
		}
	}
	if (eocd < 0) throw new ArchiveError('not-a-zip', null, 'not a zip archive: no end-of-central-directory record');
	const count = view.getUint16(eocd + 10, true);
	const size = view.getUint32(eocd + 12, true);
	const offset = view.getUint32(eocd + 16, true);
	if (count === 0xffff || size === 0xffffffff || offset === 0xffffffff) {
		throw new ArchiveError('unsupported-zip', null, 'ZIP64 archives are not accepted (uploads are far below the sizes that need it)');
	}
	if (view.getUint16(eocd + 4, true) !== 0 || view.getUint16(eocd + 6, true) !== 0) {
		throw new ArchiveError('unsupported-zip', null, 'multi-part (spanned) zip archives are not accepted');
	}
	if (offset + size > eocd) throw new ArchiveError('not-a-zip', null, 'corrupt zip archive: the central directory lies outside the file');
	const decoder = new TextDecoder('utf-8');
	const entries: ZipDirectoryEntry[] = [];
	let p = offset;
	for (let n = 0; n < count; n++) {
		if (p + 46 > eocd || view.getUint32(p, true) !== CENTRAL_SIGNATURE) {
			throw new ArchiveError('not-a-zip', null, `corrupt zip archive: central directory record ${n + 1} of ${count} is damaged`);
		}
		const madeBy = view.getUint8(p + 5);
		const flags = view.getUint16(p + 8, true);
		const method = view.getUint16(p + 10, true);
		const compressedBytes = view.getUint32(p + 20, true);
		const uncompressedBytes = view.getUint32(p + 24, true);
		const nameLength = view.getUint16(p + 28, true);
		const extraLength = view.getUint16(p + 30, true);
		const commentLength = view.getUint16(p + 32, true);
		const external = view.getUint32(p + 38, true);
		if (p + 46 + nameLength > eocd) throw new ArchiveError('not-a-zip', null, `corrupt zip archive: name of record ${n + 1} runs past the directory`);
		const name = decoder.decode(bytes.subarray(p + 46, p + 46 + nameLength));
		if (compressedBytes === 0xffffffff || uncompressedBytes === 0xffffffff) {
			throw new ArchiveError('unsupported-zip', name, 'ZIP64 entries are not accepted');
		}
		entries.push({
			name,
			compressedBytes,
			uncompressedBytes,
			method,
			flags,
			madeBy,
			unixMode: madeBy === 3 || madeBy === 19 ? external >>> 16 : null,
			dosAttributes: external & 0xff,
			directory: name.endsWith('/')
		});
		p += 46 + nameLength + extraLength + commentLength;
	}
	return entries;
}
