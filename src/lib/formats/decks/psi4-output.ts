/**
 * Reader for Psi4 SCF/DFT output (the file `psi4 job.in -o job.out` writes, or its standard output
 * with `-o stdout`), for the inputs written by psi4.ts.
 *
 * Returns one record per SCF task (one `energy("scf", ...)` call), in output order: total energy
 * (`@RKS Final Energy:` / `@UKS Final Energy:`), charge, multiplicity and electron counts from the
 * task's geometry block, the orbital energies of each spin with their occupations (the
 * "Orbital Energies [Eh]" tables: Doubly/Singly Occupied and Virtual for restricted, Alpha/Beta
 * Occupied and Virtual for unrestricted references), convergence ("Energy and wave function
 * converged." or "Failed to converge."), the exact-exchange fractions Psi4 prints for the task, and
 * errors. The input Psi4 echoes at the top gives the exact `x_hf` alpha, beta and omega the run used.
 *
 * Formats follow real Psi4 1.3.2 runs (Debian 12; fixtures/psi4_*.out). A text without Psi4's banner
 * is refused, and so is an output that stops before Psi4's closing line ("*** Psi4 exiting
 * successfully" or "*** Psi4 encountered an error"), since its last task may be half written.
 * Energies stay in hartree, as the engine writes them.
 */
import { EngineOutputError } from './errors';
import { type NwchemFrontier, type NwchemTaskResult, blankTaskNumbers } from './nwchem-output';

/** One printed orbital. */
export interface Psi4Orbital {
	/** Number within its irreducible representation, as printed (`5A` -> 5). */
	index: number;
	/** Irreducible representation (`A` in c1 symmetry). */
	symmetry: string;
	/** 2 (doubly occupied) or 0 for restricted; 1 (singly occupied, or occupied per spin) or 0. */
	occupation: number;
	energyHartree: number;
}

/** Frontier orbitals of one spin channel (or of the restricted orbitals). */
export type Psi4Frontier = NwchemFrontier;

/** An error Psi4 reported (Fatal Error, PsiException or the Python exception that ended the run). */
export interface Psi4Error {
	message: string;
	/** 1-based output line. */
	line: number;
}

/** The `x_hf` entry of the echoed input: the exact values the input asked for. */
export interface Psi4EchoedRangeSeparation {
	/** Short-range (full-range) exact-exchange fraction, x_hf "alpha". */
	alpha: number;
	/** Long-range minus short-range fraction, x_hf "beta". */
	beta: number;
	/** x_hf "omega", bohr^-1. */
	gammaBohrInv: number;
	/** "omega" of the GGA_X_HJS_PBE entry, or null when the input leaves it at libxc's default. */
	hjsOmega: number | null;
	/** 1-based output line of the x_hf entry. */
	line: number;
}

/** Exact exchange as Psi4 prints it for the task (4 decimals). */
export interface Psi4PrintedExchange {
	/** Full-range HF fraction ("HF"), or null when not printed. */
	hf: number | null;
	/** Long-range HF fraction ("HF,LR"), or null. */
	hfLr: number | null;
	/** omega of the long-range term, bohr^-1. */
	omega: number | null;
}

/**
 * One SCF task. The fields shared with NWChem's task record (electron counts, charge, multiplicity,
 * energy, frontier orbitals) mean the same; `line` is the task's "... Reference" banner line.
 */
export interface Psi4TaskResult
	extends Pick<
		NwchemTaskResult,
		| 'index'
		| 'line'
		| 'unrestricted'
		| 'electrons'
		| 'alphaElectrons'
		| 'betaElectrons'
		| 'charge'
		| 'multiplicity'
		| 'basisFunctions'
		| 'totalEnergyHartree'
		| 'iterations'
		| 'homoHartree'
		| 'lumoHartree'
	> {
	/** Molecule of the task's energy() call in the echoed input, underscores as spaces (`water screened`). */
	title: string | null;
	/** RKS, UKS, ROKS, RHF, UHF, ... as printed. */
	reference: string;
	printedExchange: Psi4PrintedExchange;
	/** True when the SCF converged and a final energy was printed, with no error in the task. */
	converged: boolean;
	/** Restricted: the spatial orbitals; unrestricted: the alpha orbitals. */
	alphaOrbitals: Psi4Orbital[];
	/** Unrestricted only. */
	betaOrbitals: Psi4Orbital[] | null;
	alphaFrontier: Psi4Frontier;
	betaFrontier: Psi4Frontier | null;
	errors: Psi4Error[];
}

/** A `KAPPALINE <label> E = ... HOMO = ... LUMO = ...` line printed by the inputs' summary loop. */
export interface Psi4SummaryLine {
	label: string;
	totalEnergyHartree: number;
	homoHartree: number;
	lumoHartree: number;
	line: number;
}

/** A whole Psi4 output. */
export interface Psi4Output {
	engine: 'psi4';
	/** `1.3.2` from "Psi4 1.3.2 release". */
	version: string | null;
	/** Psi4 has no start name; always null (kept for symmetry with the NWChem reader). */
	prefix: null;
	/** The input as echoed under "==> Input File <==". */
	inputEcho: string | null;
	echoedRangeSeparation: Psi4EchoedRangeSeparation[];
	tasks: Psi4TaskResult[];
	/** Every error of the run, in output order, without repeats. */
	errors: Psi4Error[];
	/** Problems this reader noticed in the echoed input (an HJS omega that differs from x_hf's). */
	warnings: string[];
	/** The KAPPALINE summary lines, when the run got that far. */
	summary: Psi4SummaryLine[];
	/** Psi4 printed "*** Psi4 exiting successfully". */
	completed: boolean;
	wallSeconds: number | null;
}

const NUM = String.raw`[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?`;
const RE = {
	banner: /Psi4: An Open-Source Ab Initio Electronic Structure Package/,
	version: /^\s*Psi4 (\d+\.\d+(?:\.\d+)?\S*) release/,
	success: /^\*\*\* Psi4 exiting successfully/,
	failure: /^\*\*\* Psi4 encountered an error/,
	inputStart: /^\s*==> Input File <==/,
	rule: /^-{20,}\s*$/,
	reference: /^\s+(RKS|UKS|ROKS|CUKS|RHF|UHF|ROHF|CUHF) Reference\s*$/,
	charge: /^\s*Charge\s+=\s+(-?\d+)\s*$/,
	multiplicity: /^\s*Multiplicity\s+=\s+(\d+)\s*$/,
	electrons: /^\s*Electrons\s+=\s+(\d+)\s*$/,
	nalpha: /^\s*Nalpha\s+=\s+(\d+)\s*$/,
	nbeta: /^\s*Nbeta\s+=\s+(\d+)\s*$/,
	basisFunctions: /^\s*Number of basis functions?:\s+(\d+)/,
	hf: new RegExp(String.raw`^\s*(${NUM})\s+HF\s*$`),
	hfLr: new RegExp(String.raw`^\s*(${NUM})\s+HF,LR \[omega = (${NUM})\]`),
	iteration: /^\s*@\S+ iter\s+(\d+):/,
	converged: /^\s*Energy and wave function converged\./,
	failed: /^\s*Failed to converge\./,
	finalEnergy: new RegExp(String.raw`^\s*@\S+ Final Energy:\s+(${NUM})`),
	orbitalsStart: /^\s*Orbital Energies \[Eh\]/,
	orbitalsEnd: /^\s*Final Occupation by Irrep:/,
	orbitalBlock: /^\s*(Doubly Occupied|Singly Occupied|Virtual|Alpha Occupied|Alpha Virtual|Beta Occupied|Beta Virtual):\s*$/,
	orbitalEntry: new RegExp(String.raw`(\d+)([A-Za-z][A-Za-z0-9'"]*)\s+(${NUM})`, 'g'),
	fatal: /^Fatal Error: (.+?)\s*$/,
	psiException: /^PsiException: (.+?)\s*$/,
	pythonError: /^(?:[\w.]+\.)?(\w*(?:Error|Exception)): (.+?)\s*$/,
	summary: new RegExp(String.raw`^KAPPALINE (\w+)\s+E = (${NUM})\s+HOMO = (${NUM})\s+LUMO = (${NUM})\s*$`),
	wall: /^\s*Psi4 wall time for execution: (\d+):(\d+):(\d+(?:\.\d+)?)/,
	energyCall: /^(?:\w+\s*,\s*\w+\s*=\s*)?energy\(\s*["']scf["'].*\bmolecule\s*=\s*(\w+)/,
	xHf: /"x_hf"\s*:\s*\{([^}]*)\}/,
	hjs: /"GGA_X_HJS_PBE"\s*:\s*\{([^}]*)\}/
};

/** Default omega of libxc's GGA_X_HJS_PBE (the value Psi4 1.3.2 uses when the input sets none; fixtures/README.md). */
const HJS_DEFAULT_OMEGA = 0.11;

function dictNumber(body: string, key: string): number | null {
	const m = new RegExp(String.raw`"${key}"\s*:\s*(${NUM})`).exec(body);
	return m ? Number(m[1]) : null;
}

function frontier(orbitals: readonly Psi4Orbital[]): Psi4Frontier {
	let homo: Psi4Orbital | null = null;
	let lumo: Psi4Orbital | null = null;
	for (const o of orbitals) {
		if (o.occupation > 0 && (homo === null || o.energyHartree > homo.energyHartree)) homo = o;
		if (o.occupation === 0 && (lumo === null || o.energyHartree < lumo.energyHartree)) lumo = o;
	}
	return { homoHartree: homo?.energyHartree ?? null, lumoHartree: lumo?.energyHartree ?? null, homoIndex: homo?.index ?? null, lumoIndex: lumo?.index ?? null };
}

/** The orbital tables of one task: lines from "Orbital Energies [Eh]" to "Final Occupation by Irrep". */
function readOrbitals(lines: readonly string[], from: number, to: number, restricted: boolean): { alpha: Psi4Orbital[]; beta: Psi4Orbital[] } {
	const alpha: Psi4Orbital[] = [];
	const beta: Psi4Orbital[] = [];
	let block: string | null = null;
	for (let i = from; i < to; i++) {
		const l = lines[i];
		if (RE.orbitalsEnd.test(l)) break;
		const b = RE.orbitalBlock.exec(l);
		if (b) {
			block = b[1];
			continue;
		}
		if (!block) continue;
		const occupied = block.includes('Occupied');
		const occupation = !occupied ? 0 : block === 'Doubly Occupied' ? 2 : 1;
		const into = block.startsWith('Beta') ? beta : alpha;
		for (const m of l.matchAll(RE.orbitalEntry)) {
			into.push({ index: Number(m[1]), symmetry: m[2], occupation: restricted && block === 'Singly Occupied' ? 1 : occupation, energyHartree: Number(m[3]) });
		}
	}
	return { alpha, beta };
}

function errorAt(l: string, line: number): Psi4Error | null {
	const m = RE.fatal.exec(l) ?? RE.psiException.exec(l);
	if (m) return { message: m[1], line };
	const p = RE.pythonError.exec(l);
	return p && p[2].trim() !== '' ? { message: p[2], line } : null;
}

/**
 * Read a Psi4 output. Throws {@link EngineOutputError} for an empty text, a text that is not Psi4
 * output, or an output that ends before Psi4's closing line (truncated, or the run is still going).
 */
export function readPsi4Output(text: string): Psi4Output {
	if (typeof text !== 'string' || text.trim() === '') throw new EngineOutputError('the output is empty');
	const lines = text.split(/\r?\n/);
	if (!lines.some((l) => RE.banner.test(l))) {
		throw new EngineOutputError('not a Psi4 output: no "Psi4: An Open-Source Ab Initio Electronic Structure Package" banner');
	}
	const closing = lines.findIndex((l) => RE.success.test(l) || RE.failure.test(l));
	if (closing < 0) {
		let last = lines.length;
		while (last > 1 && lines[last - 1].trim() === '') last--;
		throw new EngineOutputError(
			'the Psi4 output ends without Psi4\'s closing line ("*** Psi4 exiting successfully" or "*** Psi4 encountered an error"): it is truncated, or the run was killed or is still going',
			last
		);
	}

	const out: Psi4Output = {
		engine: 'psi4',
		version: null,
		prefix: null,
		inputEcho: null,
		echoedRangeSeparation: [],
		tasks: [],
		errors: [],
		warnings: [],
		summary: [],
		completed: RE.success.test(lines[closing]),
		wallSeconds: null
	};

	// The echoed input: between the rules after "==> Input File <==".
	const titles: string[] = [];
	const inputAt = lines.findIndex((l) => RE.inputStart.test(l));
	let inputEnd = -1;
	if (inputAt >= 0) {
		const open = lines.findIndex((l, i) => i > inputAt && RE.rule.test(l));
		const close = open < 0 ? -1 : lines.findIndex((l, i) => i > open && RE.rule.test(l));
		if (open >= 0 && close > open) {
			inputEnd = close;
			out.inputEcho = lines.slice(open + 1, close).join('\n');
			let hjsOmega: number | null = null;
			for (let i = open + 1; i < close; i++) {
				const l = lines[i];
				if (/^\s*#/.test(l)) continue;
				const h = RE.hjs.exec(l);
				if (h) hjsOmega = dictNumber(h[1], 'omega');
				const x = RE.xHf.exec(l);
				if (x) {
					const alpha = dictNumber(x[1], 'alpha');
					const beta = dictNumber(x[1], 'beta');
					const omega = dictNumber(x[1], 'omega');
					if (alpha !== null && beta !== null && omega !== null) out.echoedRangeSeparation.push({ alpha, beta, gammaBohrInv: omega, hjsOmega, line: i + 1 });
				}
				const e = RE.energyCall.exec(l.trim());
				if (e) titles.push(e[1].replace(/_/g, ' '));
			}
		}
	}
	for (const r of out.echoedRangeSeparation) {
		const hjs = r.hjsOmega ?? HJS_DEFAULT_OMEGA;
		if (Math.abs(hjs - r.gammaBohrInv) > 1e-12) {
			out.warnings.push(
				`line ${r.line}: the short-range PBE exchange (GGA_X_HJS_PBE) uses omega ${hjs}${r.hjsOmega === null ? " (libxc's default: the input sets none)" : ''} but the exact exchange uses omega ${r.gammaBohrInv}: the functional is not the SRSH the input describes`
			);
		}
	}

	// Tasks: from one "... Reference" banner line to the next.
	const starts: number[] = [];
	lines.forEach((l, i) => {
		if (i > inputEnd && RE.reference.test(l)) starts.push(i);
	});
	// The same message comes as PsiException, then again as the Python exception: keep the first.
	const addError = (e: Psi4Error, task: Psi4TaskResult | null) => {
		if (task && !task.errors.some((x) => x.message === e.message)) task.errors.push(e);
		if (!out.errors.some((x) => x.message === e.message)) out.errors.push(e);
	};
	const firstTask = starts.length ? starts[0] : lines.length;
	for (let i = inputEnd + 1; i < firstTask; i++) {
		const e = errorAt(lines[i], i + 1);
		if (e) addError(e, null);
	}
	starts.forEach((start, k) => {
		const end = k + 1 < starts.length ? starts[k + 1] : lines.length;
		const reference = (RE.reference.exec(lines[start]) as RegExpExecArray)[1];
		const unrestricted = /^(UKS|CUKS|UHF|CUHF)$/.test(reference);
		const task: Psi4TaskResult = {
			...blankTaskNumbers(k, start + 1),
			title: titles[k] ?? null,
			reference,
			unrestricted,
			printedExchange: { hf: null, hfLr: null, omega: null },
			alphaOrbitals: [],
			betaOrbitals: unrestricted ? [] : null,
			errors: []
		};
		let scfConverged = false;
		let scfFailed = false;
		for (let i = start + 1; i < end; i++) {
			const l = lines[i];
			let m: RegExpExecArray | null;
			if (task.charge === null && (m = RE.charge.exec(l))) task.charge = Number(m[1]);
			else if (task.multiplicity === null && (m = RE.multiplicity.exec(l))) task.multiplicity = Number(m[1]);
			else if (task.electrons === null && (m = RE.electrons.exec(l))) task.electrons = Number(m[1]);
			else if (task.alphaElectrons === null && (m = RE.nalpha.exec(l))) task.alphaElectrons = Number(m[1]);
			else if (task.betaElectrons === null && (m = RE.nbeta.exec(l))) task.betaElectrons = Number(m[1]);
			else if (task.basisFunctions === null && (m = RE.basisFunctions.exec(l))) task.basisFunctions = Number(m[1]);
			else if ((m = RE.hfLr.exec(l))) task.printedExchange = { ...task.printedExchange, hfLr: Number(m[1]), omega: Number(m[2]) };
			else if ((m = RE.hf.exec(l))) task.printedExchange = { ...task.printedExchange, hf: Number(m[1]) };
			else if ((m = RE.iteration.exec(l))) task.iterations = Math.max(task.iterations ?? 0, Number(m[1]));
			else if (RE.converged.test(l)) scfConverged = true;
			else if (RE.failed.test(l)) scfFailed = true;
			else if ((m = RE.finalEnergy.exec(l))) task.totalEnergyHartree = Number(m[1]);
			else if (RE.orbitalsStart.test(l)) {
				const { alpha, beta } = readOrbitals(lines, i + 1, end, !unrestricted);
				task.alphaOrbitals = alpha;
				if (unrestricted) task.betaOrbitals = beta;
			} else {
				const e = errorAt(l, i + 1);
				// Errors after a task's final energy belong to the run, not to that finished task.
				if (e) addError(e, task.totalEnergyHartree === null ? task : null);
			}
		}
		task.alphaFrontier = frontier(task.alphaOrbitals);
		task.betaFrontier = task.betaOrbitals ? frontier(task.betaOrbitals) : null;
		const homos = [task.alphaFrontier.homoHartree, task.betaFrontier?.homoHartree ?? null].filter((v): v is number => v !== null);
		const lumos = [task.alphaFrontier.lumoHartree, task.betaFrontier?.lumoHartree ?? null].filter((v): v is number => v !== null);
		task.homoHartree = homos.length ? Math.max(...homos) : null;
		task.lumoHartree = lumos.length ? Math.min(...lumos) : null;
		task.converged = scfConverged && !scfFailed && task.totalEnergyHartree !== null && task.errors.length === 0;
		out.tasks.push(task);
	});
	lines.forEach((l, i) => {
		let m: RegExpExecArray | null;
		if (out.version === null && (m = RE.version.exec(l))) out.version = m[1];
		else if (i > inputEnd && (m = RE.summary.exec(l))) {
			out.summary.push({ label: m[1], totalEnergyHartree: Number(m[2]), homoHartree: Number(m[3]), lumoHartree: Number(m[4]), line: i + 1 });
		} else if ((m = RE.wall.exec(l))) out.wallSeconds = Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3]);
	});
	return out;
}
