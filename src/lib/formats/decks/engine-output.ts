/**
 * Which engine wrote an output, and its reader: NWChem 7.x (nwchem-output.ts) or Psi4
 * (psi4-output.ts). Outputs of other quantum-chemistry programs are refused by name when their
 * banner is recognised (banners recalled from memory, not checked against real outputs here), and
 * anything else with a message that says which engines are read.
 */
import { EngineOutputError } from './errors';
import { type NwchemOutput, type NwchemTaskResult, readNwchemOutput } from './nwchem-output';
import { type Psi4Output, type Psi4TaskResult, readPsi4Output } from './psi4-output';

export type EngineOutput = NwchemOutput | Psi4Output;
export type EngineTaskResult = NwchemTaskResult | Psi4TaskResult;

/** Range-separation parameters the run's echoed input asked for (NWChem's cam line, Psi4's x_hf). */
export interface EchoedParameters {
	alpha: number;
	beta: number;
	gammaBohrInv: number;
	/** 1-based output line. */
	line: number;
	/** How the engine wrote them, for messages. */
	text: string;
}

const NWCHEM = /Northwest Computational Chemistry Package|NWChem DFT Module|=+ echo of input deck =+/;
const PSI4 = /Psi4: An Open-Source Ab Initio Electronic Structure Package/;
/** Other programs, by a line of their banner (recalled from memory). */
const OTHERS: [string, RegExp][] = [
	['Gaussian', /Entering Gaussian System|Gaussian, Inc\./],
	['ORCA', /\* O {3}R {3}C {3}A \*|Program Version \d+\.\d+\.\d+ - RELEASE/],
	['Q-Chem', /Welcome to Q-Chem/],
	['CP2K', /^\s*CP2K\|/m],
	['GAMESS', /GAMESS VERSION/]
];

/** The engine that wrote the text, from its banner; null when neither NWChem's nor Psi4's is found. */
export function detectEngine(text: string): 'nwchem' | 'psi4' | null {
	if (typeof text !== 'string') return null;
	if (PSI4.test(text)) return 'psi4';
	if (NWCHEM.test(text)) return 'nwchem';
	return null;
}

/**
 * Read an NWChem or Psi4 output, whichever wrote it. Throws {@link EngineOutputError} for an empty
 * text, the output of another program (named when recognised), or what the engine's reader refuses.
 */
export function readEngineOutput(text: string): EngineOutput {
	if (typeof text !== 'string' || text.trim() === '') throw new EngineOutputError('the output is empty');
	const engine = detectEngine(text);
	if (engine === 'psi4') return readPsi4Output(text);
	if (engine === 'nwchem') return readNwchemOutput(text);
	const other = OTHERS.find(([, re]) => re.test(text));
	if (other) throw new EngineOutputError(`this looks like a ${other[0]} output; Kappaline reads NWChem 7.x and Psi4 outputs only`);
	throw new EngineOutputError('not an NWChem or Psi4 output: neither engine\'s banner was found (Kappaline reads NWChem 7.x and Psi4 outputs)');
}

/** The first range-separation parameters echoed from the input, or undefined when none were. */
export function echoedParameters(out: EngineOutput): EchoedParameters | undefined {
	if (out.engine === 'nwchem') {
		const c = out.echoedCam[0];
		return c && { alpha: c.alpha, beta: c.beta, gammaBohrInv: c.gammaBohrInv, line: c.line, text: `cam ${c.gammaBohrInv} cam_alpha ${c.alpha} cam_beta ${c.beta}` };
	}
	const x = out.echoedRangeSeparation[0];
	return x && { alpha: x.alpha, beta: x.beta, gammaBohrInv: x.gammaBohrInv, line: x.line, text: `x_hf alpha ${x.alpha}, beta ${x.beta}, omega ${x.gammaBohrInv}` };
}
