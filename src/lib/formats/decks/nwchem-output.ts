/**
 * Reader for NWChem 7.x DFT output (text written to stdout by `nwchem job.nw > job.out`).
 *
 * Returns one record per DFT task, in output order: total energy, charge and multiplicity, the
 * printed orbital energies (alpha and beta) with HOMO and LUMO taken from the occupations,
 * convergence and errors. Formats follow real NWChem 7.0.2 runs (fixtures beside this file).
 * Energies stay in hartree, as the engine writes them.
 */
import { EngineOutputError } from './errors';

/** One printed molecular orbital. */
export interface NwchemOrbital {
	/** Vector number as printed (1-based). */
	index: number;
	/** Occupation: 2 or 0 for restricted, 1 or 0 per spin for unrestricted (fractional if smeared). */
	occupation: number;
	energyHartree: number;
	/** Irreducible representation when NWChem used symmetry, else null. */
	symmetry: string | null;
}

/** Frontier orbitals of one spin channel (or of the restricted orbitals). */
export interface NwchemFrontier {
	homoHartree: number | null;
	lumoHartree: number | null;
	homoIndex: number | null;
	lumoIndex: number | null;
}

/** One term of the exchange-correlation functional as NWChem prints it. */
export interface NwchemXcTerm {
	name: string;
	weight: number;
	part: 'local' | 'non-local' | null;
}

/** An error reported by NWChem (the boxed message of its error exit). */
export interface NwchemError {
	message: string;
	/** Integer code printed after the message, when any. */
	code: number | null;
	/** 1-based output line. */
	line: number;
}

/** Range-separation parameters as echoed in the task header: NWChem rounds them to 2 decimals. */
export interface NwchemPrintedRangeSeparation {
	alpha: number;
	beta: number;
	gamma: number;
	shortRangeHf: boolean | null;
}

/** One DFT task. */
export interface NwchemTaskResult {
	/** 0-based position among the DFT tasks of the output. */
	index: number;
	/** 1-based line of the task's "NWChem DFT Module" banner. */
	line: number;
	/** Title set by the deck's `title` directive, or null. */
	title: string | null;
	/** `closed shell`, `spin polarized`, ... as printed. */
	wavefunction: string | null;
	unrestricted: boolean | null;
	electrons: number | null;
	alphaElectrons: number | null;
	betaElectrons: number | null;
	charge: number | null;
	multiplicity: number | null;
	basisFunctions: number | null;
	xc: NwchemXcTerm[];
	rangeSeparation: NwchemPrintedRangeSeparation | null;
	totalEnergyHartree: number | null;
	nuclearRepulsionHartree: number | null;
	/** Number of SCF iterations printed. */
	iterations: number | null;
	/** True when a total energy was printed, no "failed to converge" and no error in the task. */
	converged: boolean;
	/** Restricted: the spatial orbitals; unrestricted: the alpha orbitals. */
	alphaOrbitals: NwchemOrbital[];
	/** Unrestricted only. */
	betaOrbitals: NwchemOrbital[] | null;
	alphaFrontier: NwchemFrontier;
	betaFrontier: NwchemFrontier | null;
	/** Highest occupied orbital energy over both spins. */
	homoHartree: number | null;
	/** Lowest unoccupied orbital energy over both spins. */
	lumoHartree: number | null;
	/** <S^2> and its exact value, unrestricted only. */
	s2: { value: number; exact: number } | null;
	cpuSeconds: number | null;
	wallSeconds: number | null;
	errors: NwchemError[];
}

/** `cam` line found in the echoed input: the exact values the deck asked for. */
export interface NwchemEchoedCam {
	gammaBohrInv: number;
	alpha: number;
	beta: number;
	/** 1-based output line. */
	line: number;
}

/** A whole NWChem output. */
export interface NwchemOutput {
	engine: 'nwchem';
	version: string | null;
	/** File prefix (the `start` name). */
	prefix: string | null;
	nproc: number | null;
	/** The input deck as echoed at the top (present when the deck has `echo`). */
	inputEcho: string | null;
	echoedCam: NwchemEchoedCam[];
	tasks: NwchemTaskResult[];
	/** Every error of the run (task errors included), in output order, without repeats. */
	errors: NwchemError[];
	/** Explanatory lines NWChem prints with errors ("There is an error in ..."). */
	hints: string[];
	/** Problems this reader noticed in the echoed input (e.g. a cam line in the wrong order). */
	warnings: string[];
	/** The run printed its final "Total times" line. */
	completed: boolean;
	totalCpuSeconds: number | null;
	totalWallSeconds: number | null;
}

/** Fortran reals: 1.0D+00 and 1.0E+00. */
function fnum(s: string): number {
	const v = Number(s.trim().replace(/[dD]/, 'e'));
	return v;
}

const NUM = String.raw`[-+]?(?:\d+\.?\d*|\.\d+)(?:[dDeE][-+]?\d+)?`;
const RE = {
	banner: /Northwest Computational Chemistry Package \(NWChem\)\s+(\S+)/,
	branch: /^\s*nwchem branch\s*=\s*(\S+)/,
	prefix: /^\s*prefix\s*=\s*(\S+)/,
	nproc: /^\s*nproc\s*=\s*(\d+)/,
	echoStart: /^=+ echo of input deck =+$/,
	echoEnd: /^=+$/,
	dftModule: /^\s*NWChem DFT Module\s*$/,
	dashes: /^\s*-{3,}\s*$/,
	wavefunction: /^\s*Wavefunction type:\s*(.+?)\.?\s*$/,
	electrons: /^\s*No\. of electrons\s*:\s*(\d+)/,
	alphaElectrons: /^\s*Alpha electrons\s*:\s*(\d+)/,
	betaElectrons: /^\s*Beta electrons\s*:\s*(\d+)/,
	charge: /^\s*Charge\s*:\s*(-?\d+)/,
	multiplicity: /^\s*Spin multiplicity\s*:\s*(-?\d+)/,
	functions: /^\s*AO basis - number of functions\s*:\s*(\d+)/,
	xcHeader: /^\s*XC Information\s*$/,
	xcTerm: new RegExp(String.raw`^\s*(\S.*?)\s+(${NUM})\s*(local|non-local)?\s*$`),
	rsAlpha: new RegExp(String.raw`^\s*Alpha\s*:\s*(${NUM})\s*$`),
	rsBeta: new RegExp(String.raw`^\s*Beta\s*:\s*(${NUM})\s*$`),
	rsGamma: new RegExp(String.raw`^\s*Gamma\s*:\s*(${NUM})\s*$`),
	rsShortRange: /^\s*Short-Range HF\s*:\s*([TF])\s*$/,
	iteration: /^\s*d=\s*\d+,ls=[-\d.]+(?:,diis)?\s+(\d+)\s+-?\d/,
	notConverged: /Calculation failed to converge/,
	totalEnergy: new RegExp(String.raw`^\s*Total DFT energy\s*=\s*(${NUM})\s*$`),
	nuclear: new RegExp(String.raw`^\s*Nuclear repulsion energy\s*=\s*(${NUM})\s*$`),
	orbitalHeader: /^\s*DFT Final (Alpha |Beta )?Molecular Orbital Analysis\s*$/,
	vector: new RegExp(String.raw`^\s*Vector\s*(\d+)\s+Occ=\s*(${NUM})\s+E=\s*(${NUM})(?:\s+Symmetry=\s*(\S+))?`),
	orbitalEnd: /^\s*(center of mass|Expectation value of S2|Multipole analysis|Task\s+times|Parallel integral file)/,
	s2: new RegExp(String.raw`<S2>\s*=\s*(${NUM})\s*\(Exact\s*=\s*(${NUM})\)`),
	taskTimes: /^\s*Task\s+times\s+cpu:\s*([\d.]+)s\s+wall:\s*([\d.]+)s/,
	totalTimes: /^\s*Total times\s+cpu:\s*([\d.]+)s\s+wall:\s*([\d.]+)s/,
	errorRule: /^ -{72}\s*$/,
	errorCode: /^(.*\S)\s+(-?\d+)$/,
	echoCam: new RegExp(String.raw`^\s*cam\s+(${NUM})\s+cam_alpha\s+(${NUM})\s+cam_beta\s+(${NUM})\s*(?:#.*)?$`, 'i'),
	echoCamAny: /^\s*cam(\s|$)/i
};

/** Occupations at or below this count as empty. */
const EMPTY_OCCUPATION = 1e-3;

/** HOMO and LUMO of a list of orbitals, from their occupations (highest occupied, lowest empty). */
export function frontierOrbitals(orbitals: readonly NwchemOrbital[]): NwchemFrontier {
	let homo: NwchemOrbital | null = null;
	let lumo: NwchemOrbital | null = null;
	for (const o of orbitals) {
		if (o.occupation > EMPTY_OCCUPATION) {
			if (!homo || o.energyHartree > homo.energyHartree) homo = o;
		} else if (!lumo || o.energyHartree < lumo.energyHartree) {
			lumo = o;
		}
	}
	return {
		homoHartree: homo?.energyHartree ?? null,
		lumoHartree: lumo?.energyHartree ?? null,
		homoIndex: homo?.index ?? null,
		lumoIndex: lumo?.index ?? null
	};
}

/** The counts, energies and frontier fields of a task before anything is read (shared with the Psi4 reader). */
export function blankTaskNumbers(index: number, line: number) {
	return {
		index,
		line,
		electrons: null,
		alphaElectrons: null,
		betaElectrons: null,
		charge: null,
		multiplicity: null,
		basisFunctions: null,
		totalEnergyHartree: null,
		iterations: null,
		converged: false,
		alphaFrontier: { homoHartree: null, lumoHartree: null, homoIndex: null, lumoIndex: null },
		betaFrontier: null,
		homoHartree: null,
		lumoHartree: null
	};
}

function blankTask(index: number, line: number): NwchemTaskResult {
	return {
		...blankTaskNumbers(index, line),
		title: null,
		wavefunction: null,
		unrestricted: null,
		xc: [],
		rangeSeparation: null,
		nuclearRepulsionHartree: null,
		alphaOrbitals: [],
		betaOrbitals: null,
		s2: null,
		cpuSeconds: null,
		wallSeconds: null,
		errors: []
	};
}

/**
 * Read an NWChem output. Throws {@link EngineOutputError} when the text is not NWChem output;
 * a run that stopped early or failed is still read (see `completed`, `errors`, task `converged`).
 */
export function readNwchemOutput(text: string): NwchemOutput {
	if (typeof text !== 'string' || text.trim() === '') throw new EngineOutputError('the output is empty');
	const lines = text.split(/\r?\n/);
	const isNwchem = lines.some((l) => RE.banner.test(l) || RE.dftModule.test(l) || RE.echoStart.test(l));
	if (!isNwchem) {
		throw new EngineOutputError('not an NWChem output: no "Northwest Computational Chemistry Package (NWChem)" banner');
	}

	const out: NwchemOutput = {
		engine: 'nwchem',
		version: null,
		prefix: null,
		nproc: null,
		inputEcho: null,
		echoedCam: [],
		tasks: [],
		errors: [],
		hints: [],
		warnings: [],
		completed: false,
		totalCpuSeconds: null,
		totalWallSeconds: null
	};

	let task: NwchemTaskResult | null = null;
	let orbitalTarget: NwchemOrbital[] | null = null;
	let rs: Partial<NwchemPrintedRangeSeparation> | null = null;
	let inXc = false;
	let failedToConverge = false;

	const finishTask = () => {
		if (!task) return;
		if (rs && rs.alpha !== undefined && rs.beta !== undefined && rs.gamma !== undefined) {
			task.rangeSeparation = { alpha: rs.alpha, beta: rs.beta, gamma: rs.gamma, shortRangeHf: rs.shortRangeHf ?? null };
		}
		task.alphaFrontier = frontierOrbitals(task.alphaOrbitals);
		task.betaFrontier = task.betaOrbitals ? frontierOrbitals(task.betaOrbitals) : null;
		const homos = [task.alphaFrontier.homoHartree, task.betaFrontier?.homoHartree ?? null].filter((v): v is number => v !== null);
		const lumos = [task.alphaFrontier.lumoHartree, task.betaFrontier?.lumoHartree ?? null].filter((v): v is number => v !== null);
		task.homoHartree = homos.length ? Math.max(...homos) : null;
		task.lumoHartree = lumos.length ? Math.min(...lumos) : null;
		task.converged = task.totalEnergyHartree !== null && !failedToConverge && task.errors.length === 0;
		out.tasks.push(task);
		task = null;
	};

	for (let i = 0; i < lines.length; i++) {
		const line = lines[i];
		const lineNo = i + 1;
		let m: RegExpExecArray | null;

		// Job header and echoed input.
		if (RE.echoStart.test(line)) {
			const echo: string[] = [];
			let j = i + 1;
			for (; j < lines.length && !RE.echoEnd.test(lines[j]); j++) {
				echo.push(lines[j]);
				const code = lines[j].replace(/#.*/, '');
				if ((m = RE.echoCam.exec(lines[j]))) {
					out.echoedCam.push({ gammaBohrInv: fnum(m[1]), alpha: fnum(m[2]), beta: fnum(m[3]), line: j + 1 });
				} else if (RE.echoCamAny.test(code)) {
					out.warnings.push(
						`output line ${j + 1} (echoed input): cam line "${code.trim()}" is not "cam <gamma> cam_alpha <alpha> cam_beta <beta>"; ` +
							'NWChem then uses cam_alpha = cam_beta = 0'
					);
				}
			}
			out.inputEcho = echo.join('\n');
			i = j;
			continue;
		}
		if (!out.version && (m = RE.banner.exec(line))) out.version = m[1];
		else if (!out.version && (m = RE.branch.exec(line))) out.version = m[1];
		if (!out.prefix && (m = RE.prefix.exec(line))) out.prefix = m[1].replace(/\.$/, '');
		if (out.nproc === null && (m = RE.nproc.exec(line))) out.nproc = Number(m[1]);

		// Error boxes: a rule, a message, a rule.
		if (RE.errorRule.test(line) && i + 2 < lines.length && RE.errorRule.test(lines[i + 2]) && !RE.errorRule.test(lines[i + 1])) {
			const msg = lines[i + 1].trim();
			if (msg && !/^current input line/i.test(msg)) {
				const c = RE.errorCode.exec(msg);
				if (c) {
					const err: NwchemError = { message: c[1].trim(), code: Number(c[2]), line: lineNo + 1 };
					if (!out.errors.some((e) => e.message === err.message && e.code === err.code)) out.errors.push(err);
					if (task && !task.errors.some((e) => e.message === err.message)) task.errors.push(err);
				} else if (!out.hints.includes(msg)) {
					out.hints.push(msg);
				}
			}
			i += 1;
			continue;
		}

		if ((m = RE.totalTimes.exec(line))) {
			finishTask();
			out.completed = true;
			out.totalCpuSeconds = Number(m[1]);
			out.totalWallSeconds = Number(m[2]);
			continue;
		}

		if (RE.dftModule.test(line)) {
			finishTask();
			task = blankTask(out.tasks.length, lineNo);
			orbitalTarget = null;
			rs = null;
			inXc = false;
			failedToConverge = false;
			// Title: NWChem prints it centred, alone, after the banner's underline. The first non-blank
			// line counts when it is indented, followed by a blank line and not itself underlined.
			let j = i + 1;
			if (j < lines.length && RE.dashes.test(lines[j])) j++;
			while (j < lines.length && lines[j].trim() === '') j++;
			if (j + 1 < lines.length && /^\s{2,}\S/.test(lines[j]) && lines[j + 1].trim() === '') {
				task.title = lines[j].trim();
			}
			continue;
		}
		if (!task) continue;
		const t: NwchemTaskResult = task;

		if (orbitalTarget) {
			if ((m = RE.vector.exec(line))) {
				orbitalTarget.push({ index: Number(m[1]), occupation: fnum(m[2]), energyHartree: fnum(m[3]), symmetry: m[4] ?? null });
				continue;
			}
			if (RE.orbitalEnd.test(line) || RE.orbitalHeader.test(line) || RE.totalEnergy.test(line)) orbitalTarget = null;
		}
		if ((m = RE.orbitalHeader.exec(line))) {
			const spin = m[1]?.trim();
			if (spin === 'Beta') {
				t.betaOrbitals = [];
				orbitalTarget = t.betaOrbitals;
			} else {
				t.alphaOrbitals = [];
				orbitalTarget = t.alphaOrbitals;
			}
			continue;
		}

		if (inXc) {
			if (line.trim() === '') {
				if (t.xc.length) inXc = false;
			} else if (!RE.dashes.test(line) && (m = RE.xcTerm.exec(line))) {
				t.xc.push({ name: m[1].trim(), weight: fnum(m[2]), part: (m[3] as 'local' | 'non-local' | undefined) ?? null });
			}
			continue;
		}
		if (RE.xcHeader.test(line)) {
			inXc = true;
			continue;
		}

		if ((m = RE.wavefunction.exec(line))) {
			t.wavefunction = m[1].trim();
			t.unrestricted = !/closed shell/i.test(t.wavefunction);
		} else if ((m = RE.electrons.exec(line))) t.electrons = Number(m[1]);
		else if ((m = RE.alphaElectrons.exec(line))) t.alphaElectrons = Number(m[1]);
		else if ((m = RE.betaElectrons.exec(line))) t.betaElectrons = Number(m[1]);
		else if ((m = RE.charge.exec(line))) t.charge = Number(m[1]);
		else if ((m = RE.multiplicity.exec(line))) t.multiplicity = Number(m[1]);
		else if ((m = RE.functions.exec(line))) t.basisFunctions = Number(m[1]);
		else if ((m = RE.rsAlpha.exec(line))) (rs ??= {}).alpha = fnum(m[1]);
		else if ((m = RE.rsBeta.exec(line))) (rs ??= {}).beta = fnum(m[1]);
		else if ((m = RE.rsGamma.exec(line))) (rs ??= {}).gamma = fnum(m[1]);
		else if ((m = RE.rsShortRange.exec(line))) (rs ??= {}).shortRangeHf = m[1] === 'T';
		else if ((m = RE.iteration.exec(line))) t.iterations = Number(m[1]);
		else if (RE.notConverged.test(line)) failedToConverge = true;
		else if ((m = RE.totalEnergy.exec(line))) t.totalEnergyHartree = fnum(m[1]);
		else if ((m = RE.nuclear.exec(line))) t.nuclearRepulsionHartree = fnum(m[1]);
		else if ((m = RE.s2.exec(line))) t.s2 = { value: fnum(m[1]), exact: fnum(m[2]) };
		else if ((m = RE.taskTimes.exec(line))) {
			t.cpuSeconds = Number(m[1]);
			t.wallSeconds = Number(m[2]);
		}
	}
	finishTask();
	return out;
}
