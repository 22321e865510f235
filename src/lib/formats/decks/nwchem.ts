/**
 * NWChem 7.x decks for screened range-separated hybrids (SRSH-PBE).
 *
 * Translation (the project's science notes, section 7; NWChem documentation "Density Functional
 * Theory for Molecules", section Range-Separated Functionals; NWChem source
 * src/nwdft/input_dft/dft_input.F for the `cam` line; checked with real NWChem 7.0.2 runs):
 *
 *   xc  xwpbe {beta} xpbe96 {1-alpha-beta} cpbe96 1.0 hfexch 1.0
 *   cam {gamma} cam_alpha {alpha} cam_beta {beta}
 *
 * NWChem's exact exchange is cam_alpha/r + cam_beta*erf(cam*r)/r scaled by hfexch (kept at 1.0);
 * `xwpbe` is the short-range HJS PBE exchange and `xpbe96` the full-range PBE exchange, so the
 * semilocal part is (1-alpha-beta) x full + beta x short-range, matching Kappaline's split.
 * The cam keywords are read positionally: any other order silently sets both fractions to 0.
 */
import { DeckInputError } from './errors';
import {
	type DeckMolecule,
	type DeckState,
	type IonMultiplicities,
	checkMolecule,
	neutralState,
	tuningStates
} from './molecule';
import { MAX_JOB_NAME, checkJobName, deckFileName, epsilonTag, gammaTag, jobNameFrom } from './names';
import { type DeckProvenance, checkProvenance, deckHeader } from './provenance';
import { type SrshParameters, fullRangeSemilocalWeight, gasPhaseSrsh, screenedSrsh } from './srsh';
import { type DeckFileNames, type ScanLayout, MAX_SCAN_POINTS, checkFileNames, scanDecks, stateFileName } from './scan';
import { formatReal, formatThreshold, titleText } from './text';

/** NWChem DFT integration grids (documentation, section GRID). */
export const NWCHEM_GRIDS = ['xcoarse', 'coarse', 'medium', 'fine', 'xfine', 'huge'] as const;
export type NwchemGrid = (typeof NWCHEM_GRIDS)[number];

/** The editable settings written at the top of every deck. */
export interface NwchemSettings {
	/** Basis-set library name, e.g. `aug-cc-pvdz`, `6-31+G*`, `def2-svpd`. Anions need diffuse functions. */
	basis: string;
	/** Spherical or Cartesian functions; `auto`: spherical for cc-*, def2-*, pc-* sets, Cartesian otherwise. */
	basisType: 'spherical' | 'cartesian' | 'auto';
	grid: NwchemGrid;
	/** SCF energy convergence threshold, hartree. */
	energyConvergence: number;
	maxIterations: number;
	/** `memory total ... mb` per process. */
	memoryMb: number;
	/** Let NWChem detect and use point-group symmetry (it may symmetrise the coordinates slightly). */
	symmetry: boolean;
}

export const DEFAULT_NWCHEM_SETTINGS: Readonly<NwchemSettings> = Object.freeze({
	basis: 'aug-cc-pvdz',
	basisType: 'auto',
	grid: 'fine',
	energyConvergence: 1e-8,
	maxIterations: 100,
	memoryMb: 2000,
	symmetry: false
});

/** Common fields of NWChem jobs. */
interface NwchemJobBase {
	/** Base job name (letters, digits, '_' or '-'); default derived from provenance.molecule. */
	jobName?: string;
	molecule: DeckMolecule;
	/** Short-range exact-exchange fraction, [0, 1]. */
	alpha: number;
	/** Range-separation parameter, bohr^-1. */
	gammaBohrInv: number;
	provenance: DeckProvenance;
	settings?: Partial<NwchemSettings>;
}

/** Gas-phase tuning job at one gamma: neutral, cation and anion at the frozen geometry. */
export interface NwchemTuningJob extends NwchemJobBase, IonMultiplicities {}

/** Screened rerun of the neutral: beta = 1/epsilon - alpha, gamma at its gas-phase optimum. */
export interface NwchemScreenedJob extends NwchemJobBase {
	/** Dielectric constant (electronic, high-frequency), >= 1. */
	epsilon: number;
}

/** One state written in a deck. */
export interface NwchemDeckState extends DeckState {
	/** `title` written before the state's task (NWChem prints it at the top of the task). */
	title: string;
	/** Orbital file written by the state's task. */
	movecs: string;
}

/** A generated deck and what it contains. */
export interface NwchemDeck {
	engine: 'nwchem';
	kind: 'tuning' | 'screened';
	/** NWChem `start` name (unique per gamma, and per state for per-state decks). */
	jobName: string;
	fileName: string;
	/** Folder-friendly name to run the deck in (`g0p3000`, `screened_e3p0000`). */
	folder: string;
	text: string;
	parameters: SrshParameters;
	states: NwchemDeckState[];
	settings: NwchemSettings;
}

const BASIS_NAME = /^[A-Za-z0-9][A-Za-z0-9+*(),_.-]{0,59}$/;

function checkSettings(partial: Partial<NwchemSettings> | undefined): NwchemSettings {
	const s: NwchemSettings = { ...DEFAULT_NWCHEM_SETTINGS, ...(partial ?? {}) };
	if (typeof s.basis !== 'string' || !BASIS_NAME.test(s.basis)) {
		throw new DeckInputError(
			'settings.basis',
			`basis must be one NWChem library name (letters, digits, + * ( ) , _ . -), got ${JSON.stringify(s.basis)}`
		);
	}
	if (!['spherical', 'cartesian', 'auto'].includes(s.basisType)) {
		throw new DeckInputError('settings.basisType', `basisType must be spherical, cartesian or auto, got ${JSON.stringify(s.basisType)}`);
	}
	if (!(NWCHEM_GRIDS as readonly string[]).includes(s.grid)) {
		throw new DeckInputError('settings.grid', `grid must be one of ${NWCHEM_GRIDS.join(', ')}, got ${JSON.stringify(s.grid)}`);
	}
	formatThreshold(s.energyConvergence, 'settings.energyConvergence');
	if (!Number.isInteger(s.maxIterations) || s.maxIterations < 1 || s.maxIterations > 10000) {
		throw new DeckInputError('settings.maxIterations', `maxIterations must be an integer in [1, 10000], got ${s.maxIterations}`);
	}
	if (!Number.isInteger(s.memoryMb) || s.memoryMb < 100 || s.memoryMb > 10_000_000) {
		throw new DeckInputError('settings.memoryMb', `memoryMb must be an integer in [100, 10000000], got ${s.memoryMb}`);
	}
	if (typeof s.symmetry !== 'boolean') {
		throw new DeckInputError('settings.symmetry', `symmetry must be true or false, got ${JSON.stringify(s.symmetry)}`);
	}
	return s;
}

/** Spherical or Cartesian for a library name when `auto`. */
export function nwchemBasisType(settings: Pick<NwchemSettings, 'basis' | 'basisType'>): 'spherical' | 'cartesian' {
	if (settings.basisType !== 'auto') return settings.basisType;
	return /^((aug|d-aug|jun|may|jul|apr)-)?cc-p|^def2-|^(aug-)?pc(seg)?-/i.test(settings.basis) ? 'spherical' : 'cartesian';
}

/** The two functional lines, exactly in the order NWChem needs. */
export function nwchemFunctionalLines(p: SrshParameters): [string, string] {
	return [
		`xc xwpbe ${formatReal(p.beta)} xpbe96 ${formatReal(fullRangeSemilocalWeight(p))} cpbe96 1.0 hfexch 1.0`,
		`cam ${formatReal(p.gammaBohrInv)} cam_alpha ${formatReal(p.alpha)} cam_beta ${formatReal(p.beta)}`
	];
}

function engineNotes(p: SrshParameters, fileName: string, jobName: string): string[] {
	const [xc, cam] = nwchemFunctionalLines(p);
	return [
		`"${xc}": xwpbe = short-range (HJS) PBE exchange, weight beta; xpbe96 = full-range PBE exchange, weight 1 - alpha - beta; cpbe96 = PBE correlation.`,
		`"${cam}": NWChem's exact exchange is cam_alpha/r + cam_beta*erf(cam*r)/r (same letters as above, cam = gamma in bohr^-1), scaled as a whole by hfexch, which therefore stays 1.0.`,
		'Keep the order cam, cam_alpha, cam_beta: NWChem reads them positionally and any other order sets both fractions to 0 without a warning.',
		'NWChem prints alpha, beta and gamma rounded to 2 decimals in its output; the values on the cam line are the ones used.',
		`Output files are named after the start name "${jobName}"; each state writes its own .movecs file.`,
		`Run: mpirun -np 2 nwchem ${fileName} > ${fileName.replace(/\.nw$/, '')}.out`
	];
}

function geometryBlock(atoms: readonly { element: string; x: number; y: number; z: number }[], symmetry: boolean): string[] {
	const lines = [`geometry units angstroms noautoz${symmetry ? '' : ' noautosym'}`];
	for (const a of atoms) {
		const c = [a.x, a.y, a.z].map((v) => v.toFixed(10).padStart(18)).join('');
		lines.push(`  ${a.element.padEnd(3)}${c}`);
	}
	lines.push('end');
	return lines;
}

function settingsBlock(s: NwchemSettings, p: SrshParameters): string[] {
	const [xc, cam] = nwchemFunctionalLines(p);
	const type = nwchemBasisType(s);
	return [
		'# ---- SETTINGS (editable) ----------------------------------------------------',
		'# memory per process; basis set (anions need diffuse functions); DFT grid and SCF convergence',
		`memory total ${s.memoryMb} mb`,
		'',
		`basis ${type}`,
		`  * library ${s.basis}`,
		'end',
		'',
		'dft',
		`  grid ${s.grid}`,
		`  convergence energy ${formatThreshold(s.energyConvergence, 'settings.energyConvergence')}`,
		`  iterations ${s.maxIterations}`,
		'  # CAM exchange without charge-density fitting runs direct anyway (NWChem forces it)',
		'  direct',
		'  # ---- functional: derived from alpha, beta, gamma above; do not edit by hand ----',
		`  ${xc}`,
		`  ${cam}`,
		'end'
	];
}

function stateBlock(state: NwchemDeckState, index: number, count: number, screened: boolean): string[] {
	const spin = state.unrestricted ? 'spin-unrestricted (odft)' : 'restricted';
	const what = screened ? 'screened neutral' : state.label;
	const lines = [
		`# ---- STATE ${index + 1} of ${count}: ${what}, N = ${state.electrons} electrons, charge ${state.charge}, multiplicity ${state.multiplicity}, ${spin}`,
		`title "${state.title}"`,
		`charge ${state.charge}`,
		'dft'
	];
	if (state.unrestricted) lines.push('  odft');
	lines.push(`  mult ${state.multiplicity}`, `  vectors input atomic output ${state.movecs}`, 'end', 'task dft energy');
	return lines;
}

interface Prepared {
	base: string;
	provenance: DeckProvenance;
	settings: NwchemSettings;
	molecule: ReturnType<typeof checkMolecule>;
}

function prepare(job: NwchemJobBase): Prepared {
	if (!job || typeof job !== 'object') throw new DeckInputError('job', 'a job object is required');
	const provenance = checkProvenance(job.provenance);
	const base = job.jobName === undefined ? jobNameFrom(provenance.molecule) : checkJobName(job.jobName);
	const settings = checkSettings(job.settings);
	const molecule = checkMolecule(job.molecule);
	return { base, provenance, settings, molecule };
}

/** How deck files are named. */
export interface NwchemDeckOptions {
	/**
	 * `start` (default): `<start name>.nw`, unique across a whole scan. `state`: after what the deck
	 * holds (`neutral.nw`, `cation.nw`, `anion.nw`, `neutral-cation-anion.nw` for the three states in
	 * one deck), for layouts where the folder carries gamma or epsilon. The start name (and so the
	 * scratch files) stays unique either way.
	 */
	fileNames?: DeckFileNames;
}

function render(
	kind: 'tuning' | 'screened',
	prep: Prepared,
	parameters: SrshParameters,
	jobName: string,
	folder: string,
	states: DeckState[],
	purpose: string,
	fileNames: DeckFileNames = 'start'
): NwchemDeck {
	checkJobName(jobName, 'jobName', MAX_JOB_NAME);
	const fileName = fileNames === 'start' ? deckFileName(jobName, 'nw') : stateFileName(states, 'nw');
	const molName = titleText(prep.provenance.molecule, 24) || prep.base;
	const deckStates: NwchemDeckState[] = states.map((s) => ({
		...s,
		// At most 24 + 1 + 8 + 1 + 34 = 68 characters: NWChem prints titles centred in 80 columns.
		title: titleText(
			`${molName} ${kind === 'screened' ? 'screened' : s.label} a=${formatReal(parameters.alpha, 6)} ` +
				`b=${formatReal(parameters.beta, 6)} g=${formatReal(parameters.gammaBohrInv, 6)}`,
			72
		),
		movecs: `${jobName}_${kind === 'screened' ? 'screened' : s.label}.movecs`
	}));
	const header = deckHeader({
		title: `Kappaline deck for NWChem 7.x: ${kind === 'tuning' ? 'SRSH-PBE gamma-tuning states at one gamma' : 'SRSH-PBE screened rerun of the neutral'}`,
		purpose,
		provenance: prep.provenance,
		parameters,
		engineNotes: engineNotes(parameters, fileName, jobName)
	});
	const lines: string[] = [...header, '', 'echo', `start ${jobName}`, ''];
	lines.push(...settingsBlock(prep.settings, parameters), '');
	lines.push('# ---- GEOMETRY (frozen, Angstrom; the same for every state) --------------------');
	lines.push(...geometryBlock(prep.molecule.atoms, prep.settings.symmetry), '');
	deckStates.forEach((s, i) => lines.push(...stateBlock(s, i, deckStates.length, kind === 'screened'), ''));
	return {
		engine: 'nwchem',
		kind,
		jobName,
		fileName,
		folder,
		text: lines.join('\n'),
		parameters,
		states: deckStates,
		settings: prep.settings
	};
}

const TUNING_PURPOSE =
	'Gas-phase gamma tuning, one gamma of the scan: the neutral (N electrons), cation (N-1) and anion (N+1) ' +
	'at the same frozen geometry, alpha + beta = 1. From the output: IP = E(N-1) - E(N), EA = E(N) - E(N+1), ' +
	'J_IP = eps_HOMO(N) + IP, J_EA = eps_HOMO(N+1) + EA; the tuned gamma minimises the chosen objective over the scan.';

const SCREENED_PURPOSE =
	'Screened rerun of the neutral: alpha as tuned, gamma at its gas-phase optimum, long-range exact-exchange ' +
	'fraction 1/epsilon (beta = 1/epsilon - alpha). Solid-state estimates from the output: IP_s ~ -eps_HOMO and ' +
	'EA_s ~ -eps_LUMO of this run. Model estimates: no band dispersion, relaxation or disorder.';

/** The tuning states of a job after validation (neutral first, then cation, then anion). */
function statesFor(job: NwchemTuningJob, prep: Prepared): DeckState[] {
	return tuningStates(prep.molecule, {
		cationMultiplicity: job.cationMultiplicity,
		anionMultiplicity: job.anionMultiplicity
	});
}

/**
 * One deck, one gamma: neutral, cation and anion at the frozen geometry, gas phase (beta = 1 - alpha).
 * The `start` name is `<job>_<gamma tag>`; each state writes `<start>_<state>.movecs`. NWChem reads a
 * single `start` per input, so the states share one start name inside this deck; use
 * {@link writeNwchemTuningStateDecks} for one deck (and one start name) per state.
 */
export function writeNwchemTuningJob(job: NwchemTuningJob, options: NwchemDeckOptions = {}): NwchemDeck {
	const fileNames = checkFileNames(options);
	const prep = prepare(job);
	const parameters = gasPhaseSrsh(job.alpha, job.gammaBohrInv);
	const tag = gammaTag(parameters.gammaBohrInv);
	return render('tuning', prep, parameters, `${prep.base}_${tag}`, tag, statesFor(job, prep), TUNING_PURPOSE, fileNames);
}

/** Three decks for one gamma, one per state, each with its own start name `<job>_<gamma tag>_<state>`. */
export function writeNwchemTuningStateDecks(job: NwchemTuningJob, options: NwchemDeckOptions = {}): NwchemDeck[] {
	const fileNames = checkFileNames(options);
	const prep = prepare(job);
	const parameters = gasPhaseSrsh(job.alpha, job.gammaBohrInv);
	const tag = gammaTag(parameters.gammaBohrInv);
	return statesFor(job, prep).map((state) =>
		render('tuning', prep, parameters, `${prep.base}_${tag}_${state.label}`, tag, [state], TUNING_PURPOSE, fileNames)
	);
}

/** Options of {@link writeNwchemTuningScan}. */
export interface NwchemScanOptions extends NwchemDeckOptions {
	/** `combined`: one deck per gamma (default); `per-state`: three decks per gamma. */
	layout?: ScanLayout;
}

/** A tuning scan: the job without a single gamma, plus the gammas (bohr^-1). */
export interface NwchemTuningScan extends Omit<NwchemTuningJob, 'gammaBohrInv'> {
	gammasBohrInv: readonly number[];
}

export { MAX_SCAN_POINTS };

/**
 * Decks for every gamma of a scan, in the order given, each with a folder-friendly name
 * (`g0p1500`, `g0p2000`, ...). Duplicated gammas (same tag) are refused.
 */
export function writeNwchemTuningScan(scan: NwchemTuningScan, options: NwchemScanOptions = {}): NwchemDeck[] {
	return scanDecks<NwchemTuningJob, NwchemDeck>(scan, options, writeNwchemTuningJob, writeNwchemTuningStateDecks);
}

/**
 * The screened rerun: the neutral alone with beta = 1/epsilon - alpha (negative beta is legal and
 * written as is), gamma unchanged. Start name `<job>_<gamma tag>_<epsilon tag>`.
 */
export function writeNwchemScreenedJob(job: NwchemScreenedJob, options: NwchemDeckOptions = {}): NwchemDeck {
	const fileNames = checkFileNames(options);
	const prep = prepare(job);
	const parameters = screenedSrsh(job.alpha, job.gammaBohrInv, job.epsilon);
	const gTag = gammaTag(parameters.gammaBohrInv);
	const eTag = epsilonTag(parameters.epsilon);
	return render(
		'screened',
		prep,
		parameters,
		`${prep.base}_${gTag}_${eTag}`,
		`screened_${eTag}`,
		[neutralState(prep.molecule)],
		SCREENED_PURPOSE,
		fileNames
	);
}
