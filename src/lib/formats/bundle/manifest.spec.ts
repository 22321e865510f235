import { describe, expect, it } from 'vitest';
import { planBundle } from './build';
import { ManifestError } from './errors';
import { BUNDLE_SCHEMA_VERSION, isSafeBundlePath, readManifest } from './manifest';
import { so2BundleInput } from './so2.testdata';

async function manifestJson(): Promise<Record<string, unknown>> {
	const plan = await planBundle(so2BundleInput());
	return JSON.parse(plan.files[1].text);
}

function refusal(value: unknown): ManifestError {
	try {
		readManifest(value);
	} catch (e) {
		expect(e).toBeInstanceOf(ManifestError);
		return e as ManifestError;
	}
	throw new Error('the manifest was accepted');
}

describe('readManifest', () => {
	it('reads what planBundle writes, from text or a parsed value', async () => {
		const json = await manifestJson();
		const m = readManifest(JSON.stringify(json));
		expect(m.schemaVersion).toBe(BUNDLE_SCHEMA_VERSION);
		expect(readManifest(json)).toEqual(m);
		expect(m.files.filter((f) => f.role === 'deck')).toHaveLength(11);
	});

	it('unknown schema version', async () => {
		const e = refusal({ ...(await manifestJson()), schemaVersion: 2 });
		expect(e.field).toBe('schemaVersion');
		expect(e.message).toBe('manifest.json schemaVersion: unknown version 2; this Kappaline reads version 1');
	});

	it('not a Kappaline manifest at all', () => {
		expect(refusal({ name: 'some-package', version: '1.0.0' }).message).toBe(
			'manifest.json schemaVersion: is missing: this is not a Kappaline bundle manifest'
		);
		expect(refusal('{ not json').message).toMatch(/^manifest\.json \(document\): is not valid JSON/);
	});

	it('missing file entries', async () => {
		expect(refusal({ ...(await manifestJson()), files: [] }).message).toBe(
			'manifest.json files: lists no file: the manifest must list every file of the bundle'
		);
		const json = await manifestJson();
		const noDecks = (json.files as { role: string }[]).filter((f) => f.role !== 'deck');
		expect(refusal({ ...json, files: noDecks }).message).toBe('manifest.json files: lists no deck (role "deck"): nothing to match outputs to');
		const { files: _files, ...withoutFiles } = json;
		expect(refusal(withoutFiles).message).toBe('manifest.json (document).files: is missing');
	});

	it('bad hash format', async () => {
		const json = await manifestJson();
		const files = structuredClone(json.files) as { sha256: string }[];
		files[3].sha256 = files[3].sha256.toUpperCase();
		const e = refusal({ ...json, files });
		expect(e.field).toBe('files[3].sha256');
		expect(e.message).toContain('must be 64 lower-case hex digits (SHA-256), got "');
		files[3].sha256 = 'abc123';
		expect(refusal({ ...json, files }).message).toBe('manifest.json files[3].sha256: must be 64 lower-case hex digits (SHA-256), got "abc123"');
	});

	it('unsafe or duplicated paths, broken deck entries', async () => {
		const json = await manifestJson();
		const files = structuredClone(json.files) as Record<string, unknown>[];
		expect(refusal({ ...json, files: [...files, { ...files[5] }] }).message).toBe(
			'manifest.json files[15].path: tuning/g0p2000/cation.nw is listed twice (files[5])'
		);
		files[5].path = '../tuning/g0p2000/cation.nw';
		expect(refusal({ ...json, files }).field).toBe('files[5].path');
		const again = structuredClone(json.files) as { deck: Record<string, unknown> }[];
		again[5].deck.states = ['dication'];
		expect(refusal({ ...json, files: again }).message).toBe('manifest.json files[5].deck.states[0]: must be one of neutral, cation, anion, got "dication"');
		const noGamma = structuredClone(json.files) as { deck: Record<string, unknown> }[];
		delete noGamma[5].deck.gammaBohrInv;
		expect(refusal({ ...json, files: noGamma }).message).toBe('manifest.json files[5].deck.gammaBohrInv: is missing');
	});

	it('missing molecule fields name the field', async () => {
		const json = await manifestJson();
		const molecule = { ...(json.molecule as Record<string, unknown>), charge: 0.5 };
		expect(refusal({ ...json, molecule }).message).toBe('manifest.json molecule.charge: must be an integer, got 0.5');
	});
});

describe('isSafeBundlePath', () => {
	it('accepts bundle paths and refuses escapes', () => {
		expect(isSafeBundlePath('tuning/g0p2500/neutral.nw')).toBe(true);
		for (const p of ['../x', '/x', 'a//b', 'a/./b', 'a\\b', 'C:/x', '.hidden', '']) expect(isSafeBundlePath(p), p).toBe(false);
	});
});
