import JSZip from 'jszip';
import { describe, expect, it } from 'vitest';
import { ArchiveError, type ArchiveProblem } from './errors';
import { DEFAULT_ZIP_LIMITS, type ZipLimits, inspectZip, readZipEntries, unsafeNameReason } from './inspect-zip';
import { readZipDirectory } from './zip-directory';

// Hostile archives are built with JSZip itself. Zip structure: PKWARE APPNOTE.TXT 6.3.x
// (central directory record 4.3.12: uncompressed size at offset 24, external attributes at 38;
// Unix mode in the high 16 bits when "version made by" names Unix).

async function zipOf(entries: Record<string, string | Uint8Array>, options: { unixPermissions?: Record<string, number> } = {}): Promise<Uint8Array> {
	const zip = new JSZip();
	for (const [name, data] of Object.entries(entries)) {
		zip.file(name, data, { createFolders: false, unixPermissions: options.unixPermissions?.[name] ?? 0o100644 });
	}
	return zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE', platform: 'UNIX' });
}

async function refusal(bytes: Uint8Array, limits?: Partial<ZipLimits>): Promise<ArchiveError> {
	try {
		await inspectZip(bytes, limits);
	} catch (e) {
		expect(e).toBeInstanceOf(ArchiveError);
		return e as ArchiveError;
	}
	throw new Error('the archive was accepted');
}

function expectRefusal(e: ArchiveError, problem: ArchiveProblem, entry: string | null, message: string) {
	expect(e.problem).toBe(problem);
	expect(e.entry).toBe(entry);
	expect(e.message).toContain(message);
}

const outputText = 'Northwest Computational Chemistry Package (NWChem) 7.0.2\n Total DFT energy = -1.0\n';

describe('inspectZip: accepted archives', () => {
	it('lists the entries with their declared sizes', async () => {
		const bytes = await zipOf({ 'kappaline_so2/manifest.json': '{}', 'kappaline_so2/tuning/g0p3000/neutral.out': outputText });
		const r = await inspectZip(bytes);
		expect(r.entries.map((e) => [e.name, e.bytes, e.directory])).toEqual([
			['kappaline_so2/manifest.json', 2, false],
			['kappaline_so2/tuning/g0p3000/neutral.out', outputText.length, false]
		]);
		expect(r.totalBytes).toBe(2 + outputText.length);
		expect(r.limits).toEqual(DEFAULT_ZIP_LIMITS);
	});

	it('extracts only the selected entries', async () => {
		const bytes = await zipOf({ 'a/neutral.out': outputText, 'a/neutral.movecs': new Uint8Array([1, 2, 3]) });
		const { files } = await readZipEntries(bytes, (n) => n.endsWith('.out'));
		expect(files.map((f) => f.name)).toEqual(['a/neutral.out']);
		expect(new TextDecoder().decode(files[0].bytes)).toBe(outputText);
	});

	it('an engine scratch file that compresses over the limit does not stop the extraction of the outputs', async () => {
		// NWChem's runtime database (.db) of a real water run compressed 122:1 (6.2 KiB -> 755 KiB)
		// in the engine test; users zip the whole run folder, scratch files included.
		const bytes = await zipOf({ 'a/neutral.out': outputText, 'a/water.db': new Uint8Array(800 * 1024) });
		const { files } = await readZipEntries(bytes, (n) => n.endsWith('.out'));
		expect(files.map((f) => f.name)).toEqual(['a/neutral.out']);
		// The same entry, when selected for reading, is refused by its ratio.
		await expect(readZipEntries(bytes, () => true)).rejects.toMatchObject({ problem: 'compression-ratio', entry: 'a/water.db' });
	});
});

describe('inspectZip: refused archives name the entry', () => {
	it('a highly compressible entry (zip bomb-like): compression ratio over the limit', async () => {
		const bomb = 'a'.repeat(4 * 1024 * 1024);
		const e = await refusal(await zipOf({ 'ok.out': outputText, 'bomb.out': bomb }));
		expectRefusal(e, 'compression-ratio', 'bomb.out', ':1 (');
		expect(e.message).toMatch(/compresses \d+:1 .* over the limit of 100:1 \(a zip bomb\?\)/);
	});

	it('total uncompressed size over the limit', async () => {
		const e = await refusal(await zipOf({ 'a.out': outputText, 'b.out': outputText }), { maxTotalBytes: outputText.length + 10 });
		expectRefusal(e, 'total-too-large', 'b.out', 'the limit for all files together');
	});

	it('one entry over the per-file limit', async () => {
		const e = await refusal(await zipOf({ 'a.out': outputText }), { maxEntryBytes: 10 });
		expectRefusal(e, 'entry-too-large', 'a.out', `${outputText.length} bytes uncompressed exceeds the limit of 10 bytes per file`);
	});

	it('too many entries', async () => {
		const e = await refusal(await zipOf({ 'a.out': 'x', 'b.out': 'x', 'c.out': 'x' }), { maxEntries: 2 });
		expectRefusal(e, 'too-many-entries', null, 'the archive has 3 entries, over the limit of 2');
	});

	it('the archive itself over the size limit', async () => {
		const bytes = await zipOf({ 'a.out': outputText });
		const e = await refusal(bytes, { maxArchiveBytes: 50 });
		expectRefusal(e, 'archive-too-large', null, 'over the limit of 50 bytes');
	});

	it.each([
		['../evil.out', 'would land outside the extraction folder'],
		['kappaline/../../evil.out', 'would land outside the extraction folder'],
		['/etc/cron.d/evil.out', 'absolute path'],
		['tuning\\g0p3000\\neutral.out', 'backslash'],
		['C:/Windows/evil.out', 'drive letter'],
		['a//b.out', 'empty or "." path segment']
	])('path traversal or unsafe name %s', async (name, why) => {
		const e = await refusal(await zipOf({ [name]: outputText }));
		expectRefusal(e, 'unsafe-path', name, why);
	});

	it('a symbolic link (Unix mode 120777 in the external attributes)', async () => {
		const bytes = await zipOf({ 'ok.out': outputText, 'link.out': '/etc/passwd' }, { unixPermissions: { 'link.out': 0o120777 } });
		expect(readZipDirectory(bytes).find((d) => d.name === 'link.out')?.unixMode).toBe(0o120777);
		expectRefusal(await refusal(bytes), 'symlink', 'link.out', 'symbolic links are not accepted');
	});

	it('a nested archive, by name', async () => {
		const inner = await zipOf({ 'x.out': outputText });
		expectRefusal(await refusal(await zipOf({ 'outputs.zip': inner })), 'nested-archive', 'outputs.zip', 'archives inside the archive are not accepted');
		expectRefusal(await refusal(await zipOf({ 'outputs.tar.gz': 'x' })), 'nested-archive', 'outputs.tar.gz', 'archives inside');
	});

	it('a nested archive disguised as an output, on extraction', async () => {
		const inner = await zipOf({ 'x.out': outputText });
		const bytes = await zipOf({ 'neutral.out': inner });
		await expect(readZipEntries(bytes, () => true)).rejects.toThrow('entry "neutral.out": is itself an archive or compressed file');
	});

	it('names that differ only in letter case', async () => {
		expectRefusal(await refusal(await zipOf({ 'A.out': 'x', 'a.out': 'y' })), 'duplicate-entry', 'a.out', 'differs from "A.out" only in letter case');
	});

	it('not a zip', async () => {
		expectRefusal(await refusal(new TextEncoder().encode('just text, no archive')), 'not-a-zip', null, 'no end-of-central-directory record');
	});

	it('an entry that inflates beyond its declared size is stopped at that size', async () => {
		let text = '';
		for (let i = 0; text.length < 100_000; i++) text += `line ${i} ${(i * 7919) % 104729}\n`;
		const bytes = await zipOf({ 'big.out': text });
		// Lower the declared uncompressed size in the central directory and the local header.
		const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
		for (let i = 0; i + 4 <= bytes.length; i++) {
			const sig = view.getUint32(i, true);
			if (sig === 0x02014b50) view.setUint32(i + 24, 5000, true);
			if (sig === 0x04034b50) view.setUint32(i + 22, 5000, true);
		}
		await expect(readZipEntries(bytes, () => true)).rejects.toThrow('entry "big.out": inflates beyond its declared size of 4.9 KiB (a zip bomb?)');
	});
});

describe('unsafeNameReason', () => {
	it('accepts ordinary bundle paths', () => {
		expect(unsafeNameReason('kappaline_so2/tuning/g0p3000/neutral.out')).toBeNull();
		expect(unsafeNameReason('kappaline_so2/tuning/')).toBeNull();
	});
});
