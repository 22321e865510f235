/**
 * Provenance carried by every generated deck, and the comment block that opens each deck:
 * what it is, what each range-separation parameter means physically, and where the inputs came from.
 */
import { BOHR_A, bohrInvToAngInv } from '$lib/science/units';
import { DeckInputError } from './errors';
import { type SrshParameters, fullRangeSemilocalWeight, longRangeFraction } from './srsh';
import { commentText, formatReal, wrapComment } from './text';

/** Where a deck's inputs came from; written verbatim (one line each) into the deck header. */
export interface DeckProvenance {
	/** Molecule name as the user knows it (required). */
	molecule: string;
	polymorph?: string | null;
	study?: string | null;
	/** Where epsilon came from (user scalar, tensor average, n^2, Clausius-Mossotti ...). */
	epsilonSource?: string | null;
	/** Kappaline version that wrote the deck (required). */
	appVersion: string;
	/** ISO 8601 time stamp; omitted from the deck when not given, so output stays reproducible. */
	generatedAt?: string | null;
}

/** Validate provenance: molecule and appVersion are required, one line each. */
export function checkProvenance(p: DeckProvenance | undefined, field = 'provenance'): DeckProvenance {
	if (!p || typeof p !== 'object') throw new DeckInputError(field, 'provenance is required');
	for (const key of ['molecule', 'appVersion'] as const) {
		if (typeof p[key] !== 'string' || commentText(p[key]).length === 0) {
			throw new DeckInputError(`${field}.${key}`, `${key} is required`);
		}
	}
	for (const key of ['polymorph', 'study', 'epsilonSource', 'generatedAt'] as const) {
		const v = p[key];
		if (v !== undefined && v !== null && typeof v !== 'string') {
			throw new DeckInputError(`${field}.${key}`, `${key} must be text`);
		}
	}
	return p;
}

const RULE = '='.repeat(78);

function field(label: string, value: string | null | undefined): string {
	const v = value === undefined || value === null || commentText(value) === '' ? '(not given)' : commentText(value);
	return `#   ${label.padEnd(16)}: ${v}`;
}

/** Options of the header block. */
export interface DeckHeaderOptions {
	/** One-line title: engine and purpose. */
	title: string;
	/** Longer description of what the deck computes and how to use its results. */
	purpose: string;
	provenance: DeckProvenance;
	parameters: SrshParameters;
	/** Engine-specific lines explaining how the parameters were translated (without '# '). */
	engineNotes: readonly string[];
}

/** The comment block that opens a deck ('#' comments: NWChem, Psi4 and Python all accept them). */
export function deckHeader(o: DeckHeaderOptions): string[] {
	const p = o.parameters;
	const lr = longRangeFraction(p);
	const gAng = bohrInvToAngInv(p.gammaBohrInv);
	const lines: string[] = [`# ${RULE}`, `# ${commentText(o.title)}`, `# ${RULE}`];
	lines.push(...wrapComment('# ', o.purpose));
	lines.push('#', '# Provenance');
	lines.push(field('molecule', o.provenance.molecule));
	lines.push(field('polymorph', o.provenance.polymorph));
	lines.push(field('study', o.provenance.study));
	lines.push(field('epsilon source', p.epsilon === 1 && !o.provenance.epsilonSource ? 'gas phase (epsilon = 1)' : o.provenance.epsilonSource));
	lines.push(field('app version', `Kappaline ${commentText(o.provenance.appVersion)}`));
	if (o.provenance.generatedAt) lines.push(field('generated at', o.provenance.generatedAt));
	lines.push(
		'#',
		'# Range-separated exchange: 1/r = [alpha + beta*erf(gamma*r)]/r + [1 - alpha - beta*erf(gamma*r)]/r,',
		'# first term exact (Fock) exchange, second term semilocal PBE exchange; PBE correlation in full.',
		`#   alpha        = ${formatReal(p.alpha)}   short-range exact-exchange fraction (r -> 0)`,
		`#   alpha + beta = ${formatReal(lr)}   long-range exact-exchange fraction (r -> infinity)${p.epsilon === 1 ? '' : ' = 1/epsilon'}`,
		`#   beta         = ${formatReal(p.beta)}   long-range minus short-range fraction${p.beta < 0 ? ' (negative: 1/epsilon < alpha, legal)' : ''}`,
		`#   gamma        = ${formatReal(p.gammaBohrInv)} bohr^-1 = ${formatReal(gAng, 6)} Angstrom^-1   range-separation parameter`,
		`#                  (crossover length 1/gamma = ${formatReal(1 / p.gammaBohrInv, 4)} bohr = ${formatReal(BOHR_A / p.gammaBohrInv, 4)} Angstrom)`,
		`#   epsilon      = ${formatReal(p.epsilon, 6)}   ${p.epsilon === 1 ? 'gas phase: the exchange tail is the full -1/r' : 'dielectric screening: the exchange tail is -1/(epsilon*r)'}`,
		`#   semilocal exchange: (1 - alpha) short-range + (1 - alpha - beta) long-range`,
		`#                     = ${formatReal(fullRangeSemilocalWeight(p))} x full-range PBE + ${formatReal(p.beta)} x short-range PBE`
	);
	if (o.engineNotes.length) {
		lines.push('#', '# Engine translation');
		for (const note of o.engineNotes) lines.push(...wrapComment('#   ', note));
	}
	lines.push(`# ${RULE}`);
	return lines;
}
