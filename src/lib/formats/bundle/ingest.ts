/**
 * Ingestion of engine outputs: a zip of a run bundle with the outputs beside their decks, the same
 * folder uploaded file by file (manifest.json included), several output files, or a single one. Each `*.out` is matched to its deck through the bundle manifest
 * (its path: same folder and base name as the deck; failing that, the start name NWChem prints as
 * `prefix`), read with {@link readEngineOutput} (NWChem or Psi4, told apart by their banners), and
 * turned into typed results:
 *
 * - tuning folders: scan points (gamma, E(N), E(N-1), E(N+1), eps_HOMO(N), eps_LUMO(N),
 *   eps_HOMO(N+1), all in hartree) in the shape of the tuning module's `ScanPoint`;
 * - screened folders: the rerun result (epsilon, eps_HOMO, eps_LUMO of the neutral, hartree);
 * - per-file problems: not converged, missing task, wrong state, parse error with its line,
 *   unmatched or duplicated output, deck edited after download, outputs still missing.
 *
 * Without a manifest, the folder names (`tuning/g0p2500`, `screened/eps3p000`), the file names
 * (`neutral.out`, ...) and what the output echoes (NWChem's exact `cam` line or Psi4's `x_hf` entry,
 * task titles or Psi4's molecule names) decide.
 * Nothing here stores anything: the caller shows the preview and stores on confirmation.
 */
import type { ScanPoint } from '$lib/science/tuning/types';
import { type EngineOutput, type EngineTaskResult, EngineOutputError, echoedParameters, readEngineOutput } from '../decks';
import { ArchiveError, ManifestError } from './errors';
import { type ZipLimits, checkZipLimits, readZipEntries } from './inspect-zip';
import { baseName, dirName, parseBundleFolder } from './layout';
import { type BundleDeckInfo, type BundleFileEntry, type BundleManifest, type BundleStateLabel, readManifest } from './manifest';
import { sha256Hex } from './sha256';

/** One uploaded file. */
export interface IngestFileInput {
	name: string;
	bytes: Uint8Array | string;
}

/** What an upload can be: a zip or single output as bytes, one named file, or several. */
export type IngestUpload = Uint8Array | IngestFileInput | readonly IngestFileInput[];

export interface IngestOptions {
	/** Manifest to match against when the upload carries none (e.g. the stored bundle's). */
	manifest?: BundleManifest | string | null;
	/** Name of a single unnamed upload (bytes only); default `output.out`. */
	fileName?: string;
	limits?: Partial<ZipLimits>;
}

export type IngestProblemCode =
	| 'parse-error'
	| 'not-text'
	| 'not-converged'
	| 'missing-task'
	| 'state-mismatch'
	| 'parameter-mismatch'
	| 'engine-mismatch'
	| 'unmatched-output'
	| 'duplicate-output'
	| 'missing-output'
	| 'deck-modified';

/** A problem with one file (or a missing one). Errors mean the file's values were not used. */
export interface IngestProblem {
	code: IngestProblemCode;
	severity: 'error' | 'warning';
	/** The uploaded file (path inside the archive) or, for `missing-output`, the expected path. */
	file: string;
	message: string;
	/** 1-based line of the output, when known. */
	line?: number;
	state?: BundleStateLabel;
}

/** One gamma of the scan with the files that filled it. */
export interface IngestedScanPoint {
	point: ScanPoint;
	/** Folder of the gamma (`tuning/g0p2500`), or the output's folder without a manifest. */
	folder: string;
	/** Uploaded file that gave each state. */
	sources: Partial<Record<BundleStateLabel, string>>;
	/** States without a usable result. */
	missing: BundleStateLabel[];
}

/** The screened rerun of the neutral at one epsilon. */
export interface IngestedRerun {
	epsilon: number;
	gammaBohrInv: number;
	alpha: number;
	beta: number;
	totalEnergyHartree: number;
	/** Highest occupied orbital energy of the screened neutral (IP_s ~ -homo), hartree. */
	homoHartree: number;
	/** Lowest unoccupied orbital energy (EA_s ~ -lumo), hartree; null when no virtual orbital was printed. */
	lumoHartree: number | null;
	folder: string;
	file: string;
}

/** What an uploaded output was recognised as. */
export interface IngestedFile {
	file: string;
	/** Deck path from the manifest; without one, the inferred states (`neutral-cation-anion`); null when unmatched. */
	deck: string | null;
	kind: 'tuning' | 'screened' | null;
	/** States read successfully from this file. */
	states: BundleStateLabel[];
}

export interface IngestResult {
	manifest: BundleManifest | null;
	/** Scan points sorted by gamma, in the tuning module's shape (missing values null). */
	scanPoints: ScanPoint[];
	tuning: IngestedScanPoint[];
	screened: IngestedRerun[];
	files: IngestedFile[];
	problems: IngestProblem[];
}

// ---- gathering the uploaded texts ---------------------------------------------------------------

interface TextFile {
	/** Path relative to the bundle folder when known, else as uploaded. */
	path: string;
	/** Name as uploaded (path inside the archive). */
	name: string;
	text: string | null;
}

interface Gathered {
	outputs: TextFile[];
	manifest: BundleManifest | null;
	/** Deck texts (NWChem .nw, Psi4 .in) found in an archive, by path relative to the bundle folder. */
	decks: Map<string, Uint8Array>;
}

function isZip(b: Uint8Array): boolean {
	return b.length >= 4 && b[0] === 0x50 && b[1] === 0x4b && ((b[2] === 0x03 && b[3] === 0x04) || (b[2] === 0x05 && b[3] === 0x06));
}

function decodeText(bytes: Uint8Array): string | null {
	try {
		return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		return null;
	}
}

function isOutputName(name: string): boolean {
	return /\.out$/i.test(name);
}

/** NWChem decks (.nw) and Psi4 inputs (.in). */
function isDeckName(name: string): boolean {
	return /\.(nw|in)$/i.test(name);
}

async function gatherZip(bytes: Uint8Array, limits: ZipLimits, known: BundleManifest | null, into: Gathered): Promise<void> {
	// The bundle folder is where the shallowest manifest.json sits.
	const { files } = await readZipEntries(bytes, (n) => isOutputName(n) || baseName(n) === 'manifest.json' || isDeckName(n), limits);
	const manifests = files.filter((f) => baseName(f.name) === 'manifest.json');
	const depth = (n: string) => n.split('/').length;
	const shallowest = Math.min(...manifests.map((m) => depth(m.name)));
	const top = manifests.filter((m) => depth(m.name) === shallowest);
	if (top.length > 1) {
		throw new ArchiveError('ambiguous-manifest', top[1].name, `two bundle manifests at the same level (${top[0].name}); upload one bundle per zip`);
	}
	let root = '';
	let manifest = known;
	if (top.length === 1) {
		root = dirName(top[0].name);
		const text = decodeText(top[0].bytes);
		if (text === null) throw new ManifestError('(document)', `${top[0].name} is not UTF-8 text`);
		manifest = readManifest(text);
	}
	const prefix = root ? `${root}/` : '';
	const rel = (n: string) => (prefix && n.startsWith(prefix) ? n.slice(prefix.length) : n);
	for (const f of files) {
		if (isOutputName(f.name)) into.outputs.push({ path: rel(f.name), name: f.name, text: decodeText(f.bytes) });
		else if (isDeckName(f.name)) into.decks.set(rel(f.name), f.bytes);
	}
	if (manifest && !into.manifest) into.manifest = manifest;
}

async function gather(upload: IngestUpload, options: IngestOptions, limits: ZipLimits): Promise<Gathered> {
	const known = options.manifest == null ? null : readManifest(options.manifest);
	const g: Gathered = { outputs: [], manifest: null, decks: new Map() };
	const list: IngestFileInput[] =
		upload instanceof Uint8Array
			? [{ name: options.fileName ?? 'output.out', bytes: upload }]
			: Array.isArray(upload)
				? [...(upload as readonly IngestFileInput[])]
				: [upload as IngestFileInput];
	if (list.length > limits.maxEntries) {
		throw new ArchiveError('too-many-entries', null, `${list.length} files uploaded, over the limit of ${limits.maxEntries}`);
	}
	let total = 0;
	let plainManifest: { path: string; manifest: BundleManifest } | null = null;
	const plainDecks: { path: string; bytes: Uint8Array }[] = [];
	const plainNames = new Set<string>();
	for (const f of list) {
		if (!f || typeof f.name !== 'string') throw new ArchiveError('not-a-zip', null, 'every uploaded file needs a name');
		const bytes = typeof f.bytes === 'string' ? new TextEncoder().encode(f.bytes) : f.bytes;
		if (isZip(bytes)) {
			await gatherZip(bytes, limits, known, g);
			continue;
		}
		if (bytes.length > limits.maxEntryBytes) {
			throw new ArchiveError('entry-too-large', f.name, `is ${bytes.length} bytes, over the limit of ${limits.maxEntryBytes} per file`);
		}
		total += bytes.length;
		if (total > limits.maxTotalBytes) throw new ArchiveError('total-too-large', f.name, `the files together exceed ${limits.maxTotalBytes} bytes`);
		const path = f.name.replace(/\\/g, '/');
		if (baseName(path) === 'manifest.json') {
			// A folder uploaded file by file: its manifest maps the outputs, unless one was given.
			const text = decodeText(bytes);
			if (text === null) throw new ManifestError('(document)', `${f.name} is not UTF-8 text`);
			plainManifest ??= { path, manifest: readManifest(text) };
		} else if (isDeckName(path)) {
			plainDecks.push({ path, bytes });
		} else {
			plainNames.add(f.name);
			g.outputs.push({ path, name: f.name, text: decodeText(bytes) });
		}
	}
	if (!g.manifest && plainManifest) {
		// Paths relative to the manifest's folder.
		const root = dirName(plainManifest.path);
		const prefix = root ? `${root}/` : '';
		const rel = (p: string) => (prefix && p.startsWith(prefix) ? p.slice(prefix.length) : p);
		// In a folder upload only the *.out files are outputs (README, scripts and logs are not).
		g.outputs = g.outputs.filter((o) => !plainNames.has(o.name) || isOutputName(o.path));
		for (const o of g.outputs) o.path = rel(o.path);
		for (const d of plainDecks) g.decks.set(rel(d.path), d.bytes);
		g.manifest = plainManifest.manifest;
	}
	if (!g.manifest) g.manifest = known;
	return g;
}

// ---- matching and reading -----------------------------------------------------------------------

/** A deck's expectations, from the manifest or inferred from the output. */
interface Expected {
	deckPath: string | null;
	folder: string;
	info: Omit<BundleDeckInfo, 'output' | 'jobName'> & { jobName: string | null };
	/** Charge and multiplicity per state when known (manifest). */
	states: Map<BundleStateLabel, { charge: number; multiplicity: number }> | null;
}

const LABELS: readonly BundleStateLabel[] = ['neutral', 'cation', 'anion'];

/** Infer what an output computed when there is no manifest. */
function infer(file: TextFile, out: EngineOutput): Expected | string {
	const folder = dirName(file.path);
	const byFolder = parseBundleFolder(folder);
	const cam = echoedParameters(out);
	const stem = baseName(file.path).replace(/\.out$/i, '');
	const titles = out.tasks.map((t) => t.title ?? '');
	const screened = byFolder?.kind === 'screened' || titles.some((t) => /\bscreened\b/.test(t)) || (cam !== undefined && Math.abs(cam.alpha + cam.beta - 1) > 1e-9);
	let labels: BundleStateLabel[] | null = null;
	if (/^(neutral|cation|anion)(-(neutral|cation|anion))*$/.test(stem)) labels = stem.split('-') as BundleStateLabel[];
	else if (screened) labels = ['neutral'];
	else {
		const fromTitles = titles.map((t) => LABELS.find((l) => new RegExp(`\\b${l}\\b`).test(t)) ?? null);
		if (fromTitles.length && fromTitles.every((l) => l !== null)) labels = fromTitles as BundleStateLabel[];
	}
	if (!labels) return 'cannot tell which states this output holds: no manifest, and neither its file name nor its task titles name them';
	const gamma = cam?.gammaBohrInv ?? (byFolder?.kind === 'tuning' ? byFolder.gammaBohrInv : null);
	if (gamma === null || gamma === undefined) return 'cannot tell gamma: no manifest, no echoed cam line (NWChem) or x_hf entry (Psi4) and no tuning/g... folder';
	const alpha = cam?.alpha ?? Number.NaN;
	const beta = cam?.beta ?? Number.NaN;
	let epsilon = 1;
	if (screened) {
		if (byFolder?.kind === 'screened') epsilon = byFolder.epsilon;
		else if (cam) epsilon = 1 / (cam.alpha + cam.beta);
		else return 'cannot tell epsilon: no manifest, no echoed cam line (NWChem) or x_hf entry (Psi4) and no screened/eps... folder';
	}
	return {
		deckPath: null,
		folder,
		info: { kind: screened ? 'screened' : 'tuning', jobName: out.prefix, alpha, beta, gammaBohrInv: gamma, epsilon, states: labels },
		states: null
	};
}

function sameNumber(a: number, b: number): boolean {
	return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

interface StateValue {
	label: BundleStateLabel;
	task: EngineTaskResult;
	file: string;
}

/**
 * Ingest uploaded outputs: match, parse and sort them into scan points and rerun results, with
 * per-file problems. Rejects with {@link ArchiveError} when an archive fails the safety checks and
 * with {@link ManifestError} when its manifest is invalid; problems with single outputs are reported,
 * not thrown.
 */
export async function ingestOutputs(upload: IngestUpload, options: IngestOptions = {}): Promise<IngestResult> {
	const limits = checkZipLimits(options.limits);
	const g = await gather(upload, options, limits);
	const manifest = g.manifest;
	const problems: IngestProblem[] = [];
	const files: IngestedFile[] = [];

	const deckFiles = manifest ? manifest.files.filter((f): f is BundleFileEntry & { deck: BundleDeckInfo } => f.role === 'deck' && !!f.deck) : [];
	const byOutput = new Map(deckFiles.map((f) => [f.deck.output, f]));
	const byJob = new Map(deckFiles.map((f) => [f.deck.jobName, f]));
	const stateInfo = new Map(manifest?.states.map((s) => [s.label, { charge: s.charge, multiplicity: s.multiplicity }]) ?? []);

	// Decks edited after download: the manifest may no longer describe what ran.
	if (manifest) {
		for (const f of deckFiles) {
			const bytes = g.decks.get(f.path);
			if (bytes && (await sha256Hex(bytes)) !== f.sha256) {
				problems.push({
					code: 'deck-modified',
					severity: 'warning',
					file: f.path,
					message: `${f.path} differs from the deck Kappaline wrote (SHA-256 mismatch); its results are read with the manifest's parameters, check they still hold`
				});
			}
		}
	}

	const usedDecks = new Map<string, string>();
	const tuningPoints = new Map<string, { gamma: number; folder: string; values: StateValue[] }>();
	const reruns: IngestedRerun[] = [];

	// Outputs beside their decks first, so that a stray copy elsewhere is the one reported as a duplicate.
	const rank = (f: TextFile) => (byOutput.has(f.path) ? 0 : 1);
	const ordered = [...g.outputs].sort((a, b) => rank(a) - rank(b) || (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
	for (const file of ordered) {
		const record: IngestedFile = { file: file.name, deck: null, kind: null, states: [] };
		files.push(record);
		const byPath = manifest ? byOutput.get(file.path) : undefined;
		if (byPath) record.deck = byPath.path;
		if (file.text === null) {
			problems.push({ code: 'not-text', severity: 'error', file: file.name, message: 'is not UTF-8 text; NWChem and Psi4 outputs are plain text' });
			continue;
		}
		let out: EngineOutput;
		try {
			out = readEngineOutput(file.text);
		} catch (e) {
			if (e instanceof EngineOutputError) {
				const p: IngestProblem = { code: 'parse-error', severity: 'error', file: file.name, message: e.message };
				if (e.line !== null) p.line = e.line;
				problems.push(p);
				continue;
			}
			throw e;
		}

		let expected: Expected;
		if (manifest) {
			const deck = byPath ?? (out.prefix ? byJob.get(out.prefix) : undefined);
			if (!deck) {
				problems.push({
					code: 'unmatched-output',
					severity: 'error',
					file: file.name,
					message: `matches no deck of the bundle: expected an output beside a deck (e.g. ${deckFiles[0]?.deck.output ?? 'tuning/g0p2500/neutral.out'}) or the start name of one (this output's is ${out.prefix ?? 'not printed'})`
				});
				continue;
			}
			expected = { deckPath: deck.path, folder: dirName(deck.path), info: deck.deck, states: stateInfo };
		} else {
			const inferred = infer(file, out);
			if (typeof inferred === 'string') {
				problems.push({ code: 'unmatched-output', severity: 'error', file: file.name, message: inferred });
				continue;
			}
			expected = inferred;
		}
		const key = expected.deckPath ?? `${expected.info.kind}|${expected.info.gammaBohrInv}|${expected.info.epsilon}|${expected.info.states.join('-')}`;
		const earlier = usedDecks.get(key);
		if (earlier !== undefined) {
			problems.push({
				code: 'duplicate-output',
				severity: 'error',
				file: file.name,
				message: `is a second output for ${expected.deckPath ?? 'the same calculation'} (first: ${earlier}); remove one and upload again`
			});
			continue;
		}
		usedDecks.set(key, file.name);
		record.deck = expected.deckPath ?? expected.info.states.join('-');
		record.kind = expected.info.kind;

		// An output of the other engine than the bundle's decks (a stray file, or the wrong bundle).
		if (manifest && out.engine !== manifest.engine) {
			problems.push({
				code: 'engine-mismatch',
				severity: 'error',
				file: file.name,
				message: `is ${out.engine === 'psi4' ? 'a Psi4' : 'an NWChem'} output, but the bundle's decks are for ${manifest.engine === 'psi4' ? 'Psi4' : 'NWChem'}`
			});
			continue;
		}

		// The exact parameters the engine echoed (NWChem's cam line, Psi4's x_hf) must be the deck's
		// (catches outputs of edited or other decks).
		const cam = echoedParameters(out);
		if (cam && Number.isFinite(expected.info.alpha)) {
			const want = expected.info;
			if (!sameNumber(cam.gammaBohrInv, want.gammaBohrInv) || !sameNumber(cam.alpha, want.alpha) || !sameNumber(cam.beta, want.beta)) {
				problems.push({
					code: 'parameter-mismatch',
					severity: 'error',
					file: file.name,
					line: cam.line,
					message: `the run used ${cam.text}, but ${expected.deckPath ?? 'its folder'} stands for gamma ${want.gammaBohrInv}, alpha ${want.alpha}, beta ${want.beta}`
				});
				continue;
			}
		}
		for (const w of out.warnings) problems.push({ code: 'parameter-mismatch', severity: 'error', file: file.name, message: w });
		if (out.warnings.length) continue;

		const good: StateValue[] = [];
		expected.info.states.forEach((label, i) => {
			const task = out.tasks[i];
			if (!task) {
				const err = out.errors[0];
				problems.push({
					code: 'missing-task',
					severity: 'error',
					file: file.name,
					state: label,
					...(err ? { line: err.line } : {}),
					message: `has no ${label} task (task ${i + 1} of ${expected.info.states.length})${err ? `: the run stopped with "${err.message}"` : out.completed ? '' : ': the output ends early (still running, or killed?)'}`
				});
				return;
			}
			if (!task.converged || task.totalEnergyHartree === null || task.homoHartree === null) {
				const err = task.errors[0];
				problems.push({
					code: 'not-converged',
					severity: 'error',
					file: file.name,
					state: label,
					line: err?.line ?? task.line,
					message: `the ${label} task (line ${task.line}) did not converge${err ? `: ${err.message}` : task.totalEnergyHartree === null ? ': no total energy printed' : ''}`
				});
				return;
			}
			const want = expected.states?.get(label);
			if (want && (task.charge !== want.charge || task.multiplicity !== want.multiplicity)) {
				problems.push({
					code: 'state-mismatch',
					severity: 'error',
					file: file.name,
					state: label,
					line: task.line,
					message: `task ${i + 1} has charge ${task.charge} and multiplicity ${task.multiplicity}, but the ${label} has charge ${want.charge} and multiplicity ${want.multiplicity}`
				});
				return;
			}
			good.push({ label, task, file: file.name });
		});
		record.states = good.map((s) => s.label);

		if (expected.info.kind === 'tuning' && good.length > 0) {
			const pkey = expected.deckPath ? expected.folder : `${expected.info.gammaBohrInv}`;
			let point = tuningPoints.get(pkey);
			if (!point) {
				point = { gamma: expected.info.gammaBohrInv, folder: expected.folder, values: [] };
				tuningPoints.set(pkey, point);
			}
			point.values.push(...good);
		} else {
			const neutral = good.find((s) => s.label === 'neutral');
			if (neutral) {
				reruns.push({
					epsilon: expected.info.epsilon,
					gammaBohrInv: expected.info.gammaBohrInv,
					alpha: expected.info.alpha,
					beta: expected.info.beta,
					totalEnergyHartree: neutral.task.totalEnergyHartree as number,
					homoHartree: neutral.task.homoHartree as number,
					lumoHartree: neutral.task.lumoHartree,
					folder: expected.folder,
					file: file.name
				});
			}
		}
	}

	// Decks of the manifest still without an output.
	if (manifest) {
		const seenOutputs = new Set(files.map((f) => f.deck).filter((d) => d !== null));
		for (const f of deckFiles) {
			if (!seenOutputs.has(f.path)) {
				problems.push({ code: 'missing-output', severity: 'warning', file: f.deck.output, message: `no output for ${f.path} (${f.deck.states.join(', ')}) yet` });
			}
		}
	}

	const tuning: IngestedScanPoint[] = [...tuningPoints.values()]
		.map((p) => {
			const get = (l: BundleStateLabel) => p.values.find((v) => v.label === l);
			const n = get('neutral');
			const c = get('cation');
			const a = get('anion');
			const sources: Partial<Record<BundleStateLabel, string>> = {};
			for (const v of p.values) sources[v.label] = v.file;
			const point: ScanPoint = {
				gammaBohrInv: p.gamma,
				eNeutralHartree: n?.task.totalEnergyHartree ?? null,
				eCationHartree: c?.task.totalEnergyHartree ?? null,
				eAnionHartree: a?.task.totalEnergyHartree ?? null,
				homoNeutralHartree: n?.task.homoHartree ?? null,
				lumoNeutralHartree: n?.task.lumoHartree ?? null,
				homoAnionHartree: a?.task.homoHartree ?? null
			};
			return { point, folder: p.folder, sources, missing: LABELS.filter((l) => !get(l)) };
		})
		.sort((x, y) => x.point.gammaBohrInv - y.point.gammaBohrInv);
	reruns.sort((x, y) => x.epsilon - y.epsilon);

	return { manifest, scanPoints: tuning.map((t) => t.point), tuning, screened: reruns, files, problems };
}
