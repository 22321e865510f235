/**
 * `manifest.json` of a Kappaline run bundle: Kappaline's own versioned schema (schemaVersion 1).
 *
 * It records what the bundle was made from (molecule, geometry, charges and multiplicities of every
 * state, alpha, beta, gamma, epsilon, engine, basis, app version, creation time) and lists every
 * file with its purpose and SHA-256, and, for each deck, the states it computes and where its output
 * is expected. Ingestion maps outputs to jobs with it. Paths are relative to the manifest's folder,
 * with '/' separators. Energies are not stored here; gamma is in bohr^-1.
 */
import { ManifestError } from './errors';
import { SHA256_HEX } from './sha256';

export const BUNDLE_SCHEMA_VERSION = 1;
/** Marks the JSON as a Kappaline run-bundle manifest (and not some other `manifest.json`). */
export const BUNDLE_FORMAT = 'kappaline-run-bundle';

/** Engines a bundle can be made for (Psi4 inputs need Psi4 >= 1.4). */
export const BUNDLE_ENGINES = ['nwchem', 'psi4'] as const;
export type BundleEngine = (typeof BUNDLE_ENGINES)[number];
export type BundleFileRole = 'deck' | 'script' | 'readme';
export type BundleStateLabel = 'neutral' | 'cation' | 'anion';
export type BundleDeckKind = 'tuning' | 'screened';

/** One electronic state at the frozen geometry. */
export interface BundleState {
	label: BundleStateLabel;
	charge: number;
	multiplicity: number;
	electrons: number;
	/** Spin-unrestricted treatment (always for the ions). */
	unrestricted: boolean;
}

/** What a deck computes. */
export interface BundleDeckInfo {
	kind: BundleDeckKind;
	/** Engine start name (scratch files and the `prefix` printed in the output carry it). */
	jobName: string;
	/** Short-range exact-exchange fraction. */
	alpha: number;
	/** Long-range minus short-range exact-exchange fraction (alpha + beta = 1/epsilon). */
	beta: number;
	/** Range-separation parameter, bohr^-1. */
	gammaBohrInv: number;
	/** Dielectric constant (1 for the gas-phase tuning scan). */
	epsilon: number;
	/** States in the order the deck runs them (one DFT task each). */
	states: BundleStateLabel[];
	/** Where the output is expected: same folder and base name, `.out`. */
	output: string;
}

/** One file of the bundle (manifest.json itself is not listed). */
export interface BundleFileEntry {
	path: string;
	role: BundleFileRole;
	/** One line for humans. */
	purpose: string;
	/** SHA-256 of the file's bytes, 64 lower-case hex digits. */
	sha256: string;
	bytes: number;
	/** Present for decks. */
	deck?: BundleDeckInfo;
}

export interface BundleAtom {
	element: string;
	x: number;
	y: number;
	z: number;
}

export interface BundleManifest {
	schemaVersion: typeof BUNDLE_SCHEMA_VERSION;
	format: typeof BUNDLE_FORMAT;
	app: { name: 'Kappaline'; version: string };
	/** ISO 8601 time stamp. */
	createdAt: string;
	engine: BundleEngine;
	basis: string;
	/** The engine settings written into every deck (grid, convergence, memory ...). */
	settings: Record<string, string | number | boolean>;
	molecule: {
		name: string;
		/** Hill formula. */
		formula: string;
		charge: number;
		multiplicity: number;
		electrons: number;
		geometry: { unit: 'angstrom'; atoms: BundleAtom[] };
	};
	/** Neutral, cation and anion: charge, multiplicity, electron count. */
	states: BundleState[];
	functional: { name: 'SRSH-PBE'; gammaUnit: 'bohr^-1'; alpha: number };
	tuning: { alpha: number; beta: number; gammasBohrInv: number[]; layout: 'per-state' | 'combined' } | null;
	screened: { alpha: number; gammaBohrInv: number; epsilonSource: string | null; runs: { epsilon: number; beta: number; folder: string }[] } | null;
	provenance: { polymorph: string | null; study: string | null };
	files: BundleFileEntry[];
}

// ---- validation helpers ------------------------------------------------------------------------

type Json = Record<string, unknown>;

function obj(v: unknown, field: string): Json {
	if (typeof v !== 'object' || v === null || Array.isArray(v)) throw new ManifestError(field, 'must be an object');
	return v as Json;
}
function str(o: Json, key: string, field: string): string {
	const v = o[key];
	if (typeof v !== 'string' || v.trim() === '') throw new ManifestError(`${field}.${key}`, v === undefined ? 'is missing' : 'must be non-empty text');
	return v;
}
function optStr(o: Json, key: string, field: string): string | null {
	const v = o[key];
	if (v === undefined || v === null) return null;
	if (typeof v !== 'string') throw new ManifestError(`${field}.${key}`, 'must be text or null');
	return v;
}
function num(o: Json, key: string, field: string): number {
	const v = o[key];
	if (typeof v !== 'number' || !Number.isFinite(v)) throw new ManifestError(`${field}.${key}`, v === undefined ? 'is missing' : `must be a finite number, got ${JSON.stringify(v)}`);
	return v;
}
function int(o: Json, key: string, field: string): number {
	const v = num(o, key, field);
	if (!Number.isInteger(v)) throw new ManifestError(`${field}.${key}`, `must be an integer, got ${v}`);
	return v;
}
function arr(o: Json, key: string, field: string): unknown[] {
	const v = o[key];
	if (!Array.isArray(v)) throw new ManifestError(`${field}.${key}`, v === undefined ? 'is missing' : 'must be a list');
	return v;
}
function oneOf<T extends string>(o: Json, key: string, field: string, allowed: readonly T[]): T {
	const v = o[key];
	if (typeof v !== 'string' || !(allowed as readonly string[]).includes(v)) {
		throw new ManifestError(`${field}.${key}`, `must be one of ${allowed.join(', ')}, got ${JSON.stringify(v)}`);
	}
	return v as T;
}

const STATE_LABELS = ['neutral', 'cation', 'anion'] as const;
/** Relative path with '/' separators and no '.', '..' or empty segments. */
const SAFE_PATH = /^(?!.*(?:^|\/)\.{1,2}(?:\/|$))[A-Za-z0-9_][A-Za-z0-9_.+-]*(?:\/[A-Za-z0-9_][A-Za-z0-9_.+-]*)*$/;

/** True for a relative '/'-separated path without '.', '..', empty segments or unusual signs. */
export function isSafeBundlePath(path: string): boolean {
	return typeof path === 'string' && path.length <= 512 && SAFE_PATH.test(path);
}

function readState(v: unknown, field: string): BundleState {
	const o = obj(v, field);
	const multiplicity = int(o, 'multiplicity', field);
	if (multiplicity < 1) throw new ManifestError(`${field}.multiplicity`, `must be >= 1, got ${multiplicity}`);
	if (typeof o.unrestricted !== 'boolean') throw new ManifestError(`${field}.unrestricted`, 'must be true or false');
	return {
		label: oneOf(o, 'label', field, STATE_LABELS),
		charge: int(o, 'charge', field),
		multiplicity,
		electrons: int(o, 'electrons', field),
		unrestricted: o.unrestricted
	};
}

function readDeck(v: unknown, field: string, states: readonly BundleState[]): BundleDeckInfo {
	const o = obj(v, field);
	const labels = arr(o, 'states', field).map((s, i) => {
		if (typeof s !== 'string' || !(STATE_LABELS as readonly string[]).includes(s)) {
			throw new ManifestError(`${field}.states[${i}]`, `must be one of ${STATE_LABELS.join(', ')}, got ${JSON.stringify(s)}`);
		}
		if (!states.some((st) => st.label === s)) throw new ManifestError(`${field}.states[${i}]`, `state ${s} is not described in states`);
		return s as BundleStateLabel;
	});
	if (labels.length === 0) throw new ManifestError(`${field}.states`, 'a deck computes at least one state');
	const gammaBohrInv = num(o, 'gammaBohrInv', field);
	if (gammaBohrInv <= 0) throw new ManifestError(`${field}.gammaBohrInv`, `must be > 0 bohr^-1, got ${gammaBohrInv}`);
	const epsilon = num(o, 'epsilon', field);
	if (epsilon < 1) throw new ManifestError(`${field}.epsilon`, `must be >= 1, got ${epsilon}`);
	const output = str(o, 'output', field);
	if (!isSafeBundlePath(output)) throw new ManifestError(`${field}.output`, `unsafe path ${JSON.stringify(output)}`);
	return {
		kind: oneOf(o, 'kind', field, ['tuning', 'screened'] as const),
		jobName: str(o, 'jobName', field),
		alpha: num(o, 'alpha', field),
		beta: num(o, 'beta', field),
		gammaBohrInv,
		epsilon,
		states: labels,
		output
	};
}

function readFile(v: unknown, field: string, states: readonly BundleState[]): BundleFileEntry {
	const o = obj(v, field);
	const path = str(o, 'path', field);
	if (!isSafeBundlePath(path)) throw new ManifestError(`${field}.path`, `unsafe path ${JSON.stringify(path)}: relative, '/'-separated, no '.' or '..'`);
	const sha256 = str(o, 'sha256', field);
	if (!SHA256_HEX.test(sha256)) {
		throw new ManifestError(`${field}.sha256`, `must be 64 lower-case hex digits (SHA-256), got ${JSON.stringify(sha256)}`);
	}
	const bytes = int(o, 'bytes', field);
	if (bytes < 0) throw new ManifestError(`${field}.bytes`, `must be >= 0, got ${bytes}`);
	const role = oneOf(o, 'role', field, ['deck', 'script', 'readme'] as const);
	const entry: BundleFileEntry = { path, role, purpose: str(o, 'purpose', field), sha256, bytes };
	if (role === 'deck') entry.deck = readDeck(o.deck, `${field}.deck`, states);
	else if (o.deck !== undefined) throw new ManifestError(`${field}.deck`, `only decks carry deck information (role is ${role})`);
	return entry;
}

/**
 * Read and validate a bundle manifest (JSON text or an already parsed value). Throws
 * {@link ManifestError} naming the field: unknown schema version, missing or malformed fields,
 * no deck entries, duplicated paths, a malformed SHA-256.
 */
export function readManifest(json: unknown): BundleManifest {
	let value = json;
	if (typeof json === 'string') {
		try {
			value = JSON.parse(json);
		} catch (e) {
			throw new ManifestError('(document)', `is not valid JSON (${(e as Error).message})`);
		}
	}
	const root = obj(value, '(document)');
	if (root.schemaVersion === undefined) {
		throw new ManifestError('schemaVersion', 'is missing: this is not a Kappaline bundle manifest');
	}
	if (root.schemaVersion !== BUNDLE_SCHEMA_VERSION) {
		throw new ManifestError(
			'schemaVersion',
			`unknown version ${JSON.stringify(root.schemaVersion)}; this Kappaline reads version ${BUNDLE_SCHEMA_VERSION}`
		);
	}
	if (root.format !== BUNDLE_FORMAT) {
		throw new ManifestError('format', `must be ${JSON.stringify(BUNDLE_FORMAT)}, got ${JSON.stringify(root.format)}`);
	}
	const app = obj(root.app, 'app');
	if (app.name !== 'Kappaline') throw new ManifestError('app.name', `must be "Kappaline", got ${JSON.stringify(app.name)}`);
	const createdAt = str(root, 'createdAt', '(document)');
	if (Number.isNaN(Date.parse(createdAt))) throw new ManifestError('createdAt', `is not an ISO 8601 time, got ${JSON.stringify(createdAt)}`);

	const m = obj(root.molecule, 'molecule');
	const geometry = obj(m.geometry, 'molecule.geometry');
	if (geometry.unit !== 'angstrom') throw new ManifestError('molecule.geometry.unit', `must be "angstrom", got ${JSON.stringify(geometry.unit)}`);
	const atoms = arr(geometry, 'atoms', 'molecule.geometry').map((a, i) => {
		const f = `molecule.geometry.atoms[${i}]`;
		const ao = obj(a, f);
		return { element: str(ao, 'element', f), x: num(ao, 'x', f), y: num(ao, 'y', f), z: num(ao, 'z', f) };
	});
	if (atoms.length === 0) throw new ManifestError('molecule.geometry.atoms', 'lists no atom');

	const states = arr(root, 'states', '(document)').map((s, i) => readState(s, `states[${i}]`));
	for (const label of STATE_LABELS) {
		if (states.filter((s) => s.label === label).length > 1) throw new ManifestError('states', `state ${label} is described twice`);
	}

	const fn = obj(root.functional, 'functional');
	const settingsObj = obj(root.settings, 'settings');
	const settings: Record<string, string | number | boolean> = {};
	for (const [k, v] of Object.entries(settingsObj)) {
		if (!['string', 'number', 'boolean'].includes(typeof v)) throw new ManifestError(`settings.${k}`, 'must be text, a number or true/false');
		settings[k] = v as string | number | boolean;
	}

	let tuning: BundleManifest['tuning'] = null;
	if (root.tuning !== null && root.tuning !== undefined) {
		const t = obj(root.tuning, 'tuning');
		tuning = {
			alpha: num(t, 'alpha', 'tuning'),
			beta: num(t, 'beta', 'tuning'),
			gammasBohrInv: arr(t, 'gammasBohrInv', 'tuning').map((g, i) => {
				if (typeof g !== 'number' || !Number.isFinite(g) || g <= 0) {
					throw new ManifestError(`tuning.gammasBohrInv[${i}]`, `must be a number > 0 (bohr^-1), got ${JSON.stringify(g)}`);
				}
				return g;
			}),
			layout: oneOf(t, 'layout', 'tuning', ['per-state', 'combined'] as const)
		};
	}
	let screened: BundleManifest['screened'] = null;
	if (root.screened !== null && root.screened !== undefined) {
		const s = obj(root.screened, 'screened');
		screened = {
			alpha: num(s, 'alpha', 'screened'),
			gammaBohrInv: num(s, 'gammaBohrInv', 'screened'),
			epsilonSource: optStr(s, 'epsilonSource', 'screened'),
			runs: arr(s, 'runs', 'screened').map((r, i) => {
				const f = `screened.runs[${i}]`;
				const ro = obj(r, f);
				return { epsilon: num(ro, 'epsilon', f), beta: num(ro, 'beta', f), folder: str(ro, 'folder', f) };
			})
		};
	}

	const rawFiles = arr(root, 'files', '(document)');
	if (rawFiles.length === 0) throw new ManifestError('files', 'lists no file: the manifest must list every file of the bundle');
	const files = rawFiles.map((f, i) => readFile(f, `files[${i}]`, states));
	const seen = new Map<string, number>();
	files.forEach((f, i) => {
		const prev = seen.get(f.path) ?? seen.get(f.path.toLowerCase());
		if (prev !== undefined) throw new ManifestError(`files[${i}].path`, `${f.path} is listed twice (files[${prev}])`);
		seen.set(f.path, i);
		seen.set(f.path.toLowerCase(), i);
	});
	const decks = files.filter((f) => f.role === 'deck');
	if (decks.length === 0) throw new ManifestError('files', 'lists no deck (role "deck"): nothing to match outputs to');
	const outputs = new Map<string, string>();
	for (const d of decks) {
		const out = (d.deck as BundleDeckInfo).output;
		if (seen.has(out)) throw new ManifestError(`files`, `the output ${out} of ${d.path} is itself listed as a bundle file`);
		const other = outputs.get(out);
		if (other) throw new ManifestError('files', `decks ${other} and ${d.path} expect the same output ${out}`);
		outputs.set(out, d.path);
	}
	const provenance = obj(root.provenance ?? {}, 'provenance');

	return {
		schemaVersion: BUNDLE_SCHEMA_VERSION,
		format: BUNDLE_FORMAT,
		app: { name: 'Kappaline', version: str(app, 'version', 'app') },
		createdAt,
		engine: oneOf(root, 'engine', '(document)', BUNDLE_ENGINES),
		basis: str(root, 'basis', '(document)'),
		settings,
		molecule: {
			name: str(m, 'name', 'molecule'),
			formula: str(m, 'formula', 'molecule'),
			charge: int(m, 'charge', 'molecule'),
			multiplicity: int(m, 'multiplicity', 'molecule'),
			electrons: int(m, 'electrons', 'molecule'),
			geometry: { unit: 'angstrom', atoms }
		},
		states,
		functional: {
			name: oneOf(fn, 'name', 'functional', ['SRSH-PBE'] as const),
			gammaUnit: oneOf(fn, 'gammaUnit', 'functional', ['bohr^-1'] as const),
			alpha: num(fn, 'alpha', 'functional')
		},
		tuning,
		screened,
		provenance: { polymorph: optStr(provenance, 'polymorph', 'provenance'), study: optStr(provenance, 'study', 'provenance') },
		files
	};
}
