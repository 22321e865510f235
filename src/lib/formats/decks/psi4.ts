/**
 * Psi4 input files (psithon, `.in`) for screened range-separated hybrids with a dictionary functional.
 *
 * Translation (the project's science notes, section 7; Psi4 source
 * psi4/driver/procrouting/dft/dft_builder.py, whose docstring defines the dictionary keys, and
 * psi4/driver/procrouting/dft/hyb_functionals.py, whose wPBE0 entry uses the same pattern):
 *
 *   x_functionals: GGA_X_HJS_PBE {alpha: beta, omega: gamma}  (short-range PBE exchange, weight beta)
 *                  GGA_X_PBE     {alpha: 1 - alpha - beta}      (full-range PBE exchange)
 *   x_hf:          {alpha: alpha, beta: beta, omega: gamma}     (alpha/r + beta*erf(omega r)/r)
 *   c_functionals: GGA_C_PBE     {alpha: 1.0}
 *
 * In a dictionary functional the key "alpha" of an x_functionals entry is that component's weight,
 * while "alpha"/"beta" of x_hf mean the same as NWChem's cam_alpha/cam_beta (and Kappaline's letters).
 * Psi4 1.3.2 (Debian 12) cannot set omega on a LibXC exchange functional (it stops with
 * "set_omega not implemented", fixtures/README.md), so these inputs need Psi4 1.4 or newer (the
 * first release after 1.3.2; that it sets omega is recalled from its release notes, not verified
 * here); the header says so.
 */
import { DeckInputError } from './errors';
import {
	type DeckMolecule,
	type DeckState,
	type IonMultiplicities,
	type CheckedMolecule,
	checkMolecule,
	neutralState,
	tuningStates
} from './molecule';
import { MAX_JOB_NAME, checkJobName, deckFileName, epsilonTag, gammaTag, jobNameFrom } from './names';
import { type DeckProvenance, checkProvenance, deckHeader } from './provenance';
import { type SrshParameters, fullRangeSemilocalWeight, gasPhaseSrsh, screenedSrsh } from './srsh';
import { type DeckFileNames, type ScanLayout, checkFileNames, scanDecks, stateFileName } from './scan';
import { formatReal, formatThreshold } from './text';

/** Editable settings written at the top of every Psi4 input. */
export interface Psi4Settings {
	/** Basis set name, e.g. `aug-cc-pvdz`, `def2-svpd`, `6-31+G*`. */
	basis: string;
	/** `df` (density fitting, fast) or `pk`/`direct` (exact integrals). */
	scfType: 'df' | 'pk' | 'direct' | 'out_of_core';
	energyConvergence: number;
	densityConvergence: number;
	maxIterations: number;
	/** Psi4 `memory` in MB. */
	memoryMb: number;
	/** DFT grid: radial and spherical (Lebedev) points per atom. */
	radialPoints: number;
	sphericalPoints: number;
}

export const DEFAULT_PSI4_SETTINGS: Readonly<Psi4Settings> = Object.freeze({
	basis: 'aug-cc-pvdz',
	scfType: 'df',
	energyConvergence: 1e-8,
	densityConvergence: 1e-6,
	maxIterations: 100,
	memoryMb: 2000,
	radialPoints: 99,
	sphericalPoints: 590
});

/** Lebedev orders Psi4 accepts for DFT_SPHERICAL_POINTS. */
const LEBEDEV = [
	6, 14, 26, 38, 50, 74, 86, 110, 146, 170, 194, 230, 266, 302, 350, 434, 590, 770, 974, 1202, 1454, 1730, 2030,
	2354, 2702, 3074, 3470, 3890, 4334, 4802, 5294, 5810
];

interface Psi4JobBase {
	jobName?: string;
	molecule: DeckMolecule;
	alpha: number;
	gammaBohrInv: number;
	provenance: DeckProvenance;
	settings?: Partial<Psi4Settings>;
}

/** Gas-phase tuning job at one gamma: neutral, cation and anion at the frozen geometry. */
export interface Psi4TuningJob extends Psi4JobBase, IonMultiplicities {}

/** Screened rerun of the neutral with beta = 1/epsilon - alpha. */
export interface Psi4ScreenedJob extends Psi4JobBase {
	epsilon: number;
}

/** A generated Psi4 input. */
export interface Psi4Deck {
	engine: 'psi4';
	kind: 'tuning' | 'screened';
	jobName: string;
	fileName: string;
	folder: string;
	text: string;
	parameters: SrshParameters;
	states: DeckState[];
	settings: Psi4Settings;
}

const BASIS_NAME = /^[A-Za-z0-9][A-Za-z0-9+*(),_.-]{0,59}$/;

function checkSettings(partial: Partial<Psi4Settings> | undefined): Psi4Settings {
	const s: Psi4Settings = { ...DEFAULT_PSI4_SETTINGS, ...(partial ?? {}) };
	if (typeof s.basis !== 'string' || !BASIS_NAME.test(s.basis)) {
		throw new DeckInputError('settings.basis', `basis must be one Psi4 basis name, got ${JSON.stringify(s.basis)}`);
	}
	if (!['df', 'pk', 'direct', 'out_of_core'].includes(s.scfType)) {
		throw new DeckInputError('settings.scfType', `scfType must be df, pk, direct or out_of_core, got ${JSON.stringify(s.scfType)}`);
	}
	formatThreshold(s.energyConvergence, 'settings.energyConvergence');
	formatThreshold(s.densityConvergence, 'settings.densityConvergence');
	if (!Number.isInteger(s.maxIterations) || s.maxIterations < 1 || s.maxIterations > 10000) {
		throw new DeckInputError('settings.maxIterations', `maxIterations must be an integer in [1, 10000], got ${s.maxIterations}`);
	}
	if (!Number.isInteger(s.memoryMb) || s.memoryMb < 100 || s.memoryMb > 10_000_000) {
		throw new DeckInputError('settings.memoryMb', `memoryMb must be an integer in [100, 10000000], got ${s.memoryMb}`);
	}
	if (!Number.isInteger(s.radialPoints) || s.radialPoints < 10 || s.radialPoints > 1000) {
		throw new DeckInputError('settings.radialPoints', `radialPoints must be an integer in [10, 1000], got ${s.radialPoints}`);
	}
	if (!LEBEDEV.includes(s.sphericalPoints)) {
		throw new DeckInputError('settings.sphericalPoints', `sphericalPoints must be a Lebedev order (${LEBEDEV.join(', ')}), got ${s.sphericalPoints}`);
	}
	return s;
}

/** The dictionary functional, as Python source lines (indented by 4). */
export function psi4FunctionalDict(p: SrshParameters, name = 'kappaline_srsh_pbe'): string[] {
	const g = formatReal(p.gammaBohrInv);
	return [
		'srsh_pbe = {',
		`    "name": "${name}",`,
		'    "x_functionals": {',
		`        "GGA_X_HJS_PBE": {"alpha": ${formatReal(p.beta)}, "omega": ${g}},`,
		`        "GGA_X_PBE": {"alpha": ${formatReal(fullRangeSemilocalWeight(p))}},`,
		'    },',
		`    "x_hf": {"alpha": ${formatReal(p.alpha)}, "beta": ${formatReal(p.beta)}, "omega": ${g}},`,
		'    "c_functionals": {',
		'        "GGA_C_PBE": {"alpha": 1.0},',
		'    },',
		'}'
	];
}

function moleculeBlock(name: string, m: CheckedMolecule, state: DeckState): string[] {
	const lines = [`molecule ${name} {`, `${state.charge} ${state.multiplicity}`];
	for (const a of m.atoms) {
		lines.push(`  ${a.element.padEnd(3)}${[a.x, a.y, a.z].map((v) => v.toFixed(10).padStart(18)).join('')}`);
	}
	lines.push('units angstrom', 'symmetry c1', 'no_reorient', 'no_com', '}');
	return lines;
}

function engineNotes(p: SrshParameters, fileName: string): string[] {
	return [
		`x_functionals: GGA_X_HJS_PBE (short-range PBE exchange, HJS model) with weight beta = ${formatReal(p.beta)} and omega = gamma; GGA_X_PBE (full-range PBE exchange) with weight 1 - alpha - beta = ${formatReal(fullRangeSemilocalWeight(p))}. The key "alpha" inside an x_functionals entry is that component's weight.`,
		'x_hf: {alpha, beta, omega} is Psi4\'s exact exchange alpha/r + beta*erf(omega*r)/r: the same letters as above (omega = gamma, bohr^-1).',
		PSI4_VERSION_NOTE,
		'Ions are spin-unrestricted (reference uks); geometry frozen (no_reorient, no_com, symmetry c1).',
		`Run: psi4 -n 2 ${fileName}`
	];
}

/** The release these inputs need, stated in every header, the bundle README and the bundle page. */
export const PSI4_MIN_VERSION = '1.4';
export const PSI4_VERSION_NOTE = `Needs Psi4 ${PSI4_MIN_VERSION} or newer, which can set omega (gamma) on LibXC exchange functionals: Psi4 1.3.2 (Debian 12) stops with "set_omega not implemented".`;

function settingsBlock(s: Psi4Settings): string[] {
	return [
		'# ---- SETTINGS (editable) ----------------------------------------------------',
		`memory ${s.memoryMb} mb`,
		'',
		'set {',
		`  basis ${s.basis}`,
		`  scf_type ${s.scfType}`,
		`  e_convergence ${formatThreshold(s.energyConvergence, 'settings.energyConvergence')}`,
		`  d_convergence ${formatThreshold(s.densityConvergence, 'settings.densityConvergence')}`,
		`  maxiter ${s.maxIterations}`,
		`  dft_radial_points ${s.radialPoints}`,
		`  dft_spherical_points ${s.sphericalPoints}`,
		'}'
	];
}

function render(
	kind: 'tuning' | 'screened',
	base: string,
	provenance: DeckProvenance,
	settings: Psi4Settings,
	molecule: CheckedMolecule,
	parameters: SrshParameters,
	jobName: string,
	folder: string,
	states: DeckState[],
	purpose: string,
	fileNames: DeckFileNames = 'start'
): Psi4Deck {
	checkJobName(jobName, 'jobName', MAX_JOB_NAME);
	const fileName = fileNames === 'start' ? deckFileName(jobName, 'in') : stateFileName(states, 'in');
	const lines = deckHeader({
		title: `Kappaline input for Psi4 (dictionary functional): ${kind === 'tuning' ? 'SRSH-PBE gamma-tuning states at one gamma' : 'SRSH-PBE screened rerun of the neutral'}`,
		purpose,
		provenance,
		parameters,
		engineNotes: engineNotes(parameters, fileName)
	});
	lines.push('', ...settingsBlock(settings), '');
	lines.push('# ---- functional: derived from alpha, beta, gamma above; do not edit by hand ----');
	lines.push(...psi4FunctionalDict(parameters), '');
	lines.push('# ---- GEOMETRY (frozen, Angstrom; the same for every state) --------------------');
	const names = states.map((s) => `${base.replace(/-/g, '_')}_${kind === 'screened' ? 'screened' : s.label}`);
	states.forEach((s, i) => lines.push(...moleculeBlock(names[i], molecule, s), ''));
	lines.push('results = {}');
	states.forEach((s, i) => {
		lines.push(
			`# ---- STATE ${i + 1} of ${states.length}: ${kind === 'screened' ? 'screened neutral' : s.label}, N = ${s.electrons} electrons, charge ${s.charge}, multiplicity ${s.multiplicity}, ${s.unrestricted ? 'uks' : 'rks'}`,
			`set reference ${s.unrestricted ? 'uks' : 'rks'}`,
			`e, wfn = energy("scf", dft_functional=srsh_pbe, molecule=${names[i]}, return_wfn=True)`,
			`results["${s.label}"] = (e, wfn)`,
			'clean()',
			''
		);
	});
	lines.push(
		'# ---- SUMMARY (hartree): total energy, HOMO and LUMO over both spins ----',
		'for label, (e, wfn) in results.items():',
		'    ea, eb = wfn.epsilon_a().to_array(), wfn.epsilon_b().to_array()',
		'    na, nb = wfn.nalpha(), wfn.nbeta()',
		'    homo = max(ea[na - 1] if na > 0 else float("-inf"), eb[nb - 1] if nb > 0 else float("-inf"))',
		'    lumo = min(ea[na] if na < len(ea) else float("inf"), eb[nb] if nb < len(eb) else float("inf"))',
		'    print_out("KAPPALINE %-8s E = %.10f  HOMO = %.8f  LUMO = %.8f\\n" % (label, e, homo, lumo))'
	);
	return {
		engine: 'psi4',
		kind,
		jobName,
		fileName,
		folder,
		text: lines.join('\n') + '\n',
		parameters,
		states,
		settings
	};
}

function prepare(job: Psi4JobBase) {
	if (!job || typeof job !== 'object') throw new DeckInputError('job', 'a job object is required');
	const provenance = checkProvenance(job.provenance);
	const base = job.jobName === undefined ? jobNameFrom(provenance.molecule) : checkJobName(job.jobName);
	const settings = checkSettings(job.settings);
	const molecule = checkMolecule(job.molecule);
	return { base, provenance, settings, molecule };
}

const TUNING_PURPOSE =
	'Gas-phase gamma tuning, one gamma of the scan: the neutral (N electrons), cation (N-1) and anion (N+1) ' +
	'at the same frozen geometry, alpha + beta = 1. IP = E(N-1) - E(N), EA = E(N) - E(N+1), ' +
	'J_IP = eps_HOMO(N) + IP, J_EA = eps_HOMO(N+1) + EA. The KAPPALINE lines at the end of the output list E, HOMO, LUMO.';

const SCREENED_PURPOSE =
	'Screened rerun of the neutral: alpha as tuned, gamma at its gas-phase optimum, long-range exact-exchange ' +
	'fraction 1/epsilon (beta = 1/epsilon - alpha). IP_s ~ -eps_HOMO and EA_s ~ -eps_LUMO of this run.';

/** How Psi4 input files are named (see {@link DeckFileNames}). */
export interface Psi4DeckOptions {
	fileNames?: DeckFileNames;
}

/** Psi4 input for the three tuning states at one gamma (gas phase, beta = 1 - alpha). */
export function writePsi4TuningJob(job: Psi4TuningJob, options: Psi4DeckOptions = {}): Psi4Deck {
	const fileNames = checkFileNames(options);
	const { base, provenance, settings, molecule } = prepare(job);
	const parameters = gasPhaseSrsh(job.alpha, job.gammaBohrInv);
	const tag = gammaTag(parameters.gammaBohrInv);
	const states = tuningStates(molecule, { cationMultiplicity: job.cationMultiplicity, anionMultiplicity: job.anionMultiplicity });
	return render('tuning', base, provenance, settings, molecule, parameters, `${base}_${tag}`, tag, states, TUNING_PURPOSE, fileNames);
}

/** Three inputs for one gamma, one per state, named `<job>_<gamma tag>_<state>`. */
export function writePsi4TuningStateDecks(job: Psi4TuningJob, options: Psi4DeckOptions = {}): Psi4Deck[] {
	const fileNames = checkFileNames(options);
	const { base, provenance, settings, molecule } = prepare(job);
	const parameters = gasPhaseSrsh(job.alpha, job.gammaBohrInv);
	const tag = gammaTag(parameters.gammaBohrInv);
	const states = tuningStates(molecule, { cationMultiplicity: job.cationMultiplicity, anionMultiplicity: job.anionMultiplicity });
	return states.map((state) =>
		render('tuning', base, provenance, settings, molecule, parameters, `${base}_${tag}_${state.label}`, tag, [state], TUNING_PURPOSE, fileNames)
	);
}

/** A Psi4 tuning scan: the job without a single gamma, plus the gammas (bohr^-1). */
export interface Psi4TuningScan extends Omit<Psi4TuningJob, 'gammaBohrInv'> {
	gammasBohrInv: readonly number[];
}

/** Inputs for every gamma of a scan, in the order given (`combined` by default, or `per-state`). */
export function writePsi4TuningScan(scan: Psi4TuningScan, options: Psi4DeckOptions & { layout?: ScanLayout } = {}): Psi4Deck[] {
	return scanDecks<Psi4TuningJob, Psi4Deck>(scan, options, writePsi4TuningJob, writePsi4TuningStateDecks);
}

/** Psi4 input for the screened neutral: beta = 1/epsilon - alpha, gamma unchanged. */
export function writePsi4ScreenedJob(job: Psi4ScreenedJob, options: Psi4DeckOptions = {}): Psi4Deck {
	const fileNames = checkFileNames(options);
	const { base, provenance, settings, molecule } = prepare(job);
	const parameters = screenedSrsh(job.alpha, job.gammaBohrInv, job.epsilon);
	const gTag = gammaTag(parameters.gammaBohrInv);
	const eTag = epsilonTag(parameters.epsilon);
	return render(
		'screened',
		base,
		provenance,
		settings,
		molecule,
		parameters,
		`${base}_${gTag}_${eTag}`,
		`screened_${eTag}`,
		[neutralState(molecule)],
		SCREENED_PURPOSE,
		fileNames
	);
}
