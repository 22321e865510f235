/**
 * Job, file and folder names for decks. Engines name scratch and restart files after the job name,
 * so every name is unique per state and per gamma, and safe in a shell and on any file system.
 */
import { DeckInputError } from './errors';
import { checkEpsilon, checkGamma } from './srsh';

/** Longest base job name a user may give; writers append gamma, epsilon and state tags. */
export const MAX_BASE_JOB_NAME = 48;
/** Longest full job name (base plus tags). */
export const MAX_JOB_NAME = 96;

/**
 * Check a job name (engine `start` name and file prefix): a letter first, then letters, digits,
 * '_' or '-'; at most `max` characters. Returns it unchanged.
 */
export function checkJobName(name: unknown, field = 'jobName', max = MAX_BASE_JOB_NAME): string {
	if (typeof name !== 'string' || !/^[A-Za-z][A-Za-z0-9_-]*$/.test(name) || name.length > max) {
		throw new DeckInputError(
			field,
			`job name must start with a letter and contain only letters, digits, '_' or '-' (max ${max}), got ${JSON.stringify(name)}`
		);
	}
	return name;
}

/** A job name derived from free text (a molecule name): lower case, runs of other signs become '_'. */
export function jobNameFrom(text: string, field = 'jobName'): string {
	let slug = text
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '_')
		.replace(/^_+|_+$/g, '')
		.slice(0, 32)
		.replace(/_+$/g, '');
	if (slug && !/^[a-z]/.test(slug)) slug = `m_${slug}`;
	if (!slug) throw new DeckInputError(field, `cannot derive a job name from ${JSON.stringify(text)}; give jobName`);
	return slug;
}

/**
 * Folder-friendly tag of a gamma value in bohr^-1: `g0p3000` for 0.3, `g0p31255` for 0.31255
 * (at least 4 decimals, more only when needed, at most 6). Gammas that differ below 1e-6 bohr^-1
 * share a tag, which the scan writer reports as a duplicate.
 */
export function gammaTag(gammaBohrInv: number, field = 'gammaBohrInv'): string {
	const g = checkGamma(gammaBohrInv, field);
	let s = g.toFixed(6).replace(/0+$/, '');
	const [int, frac = ''] = s.split('.');
	s = `${int}p${frac.padEnd(4, '0')}`;
	return `g${s}`;
}

/** Folder-friendly tag of a dielectric constant (>= 1): `e3p0000` for 3. */
export function epsilonTag(epsilon: number, field = 'epsilon'): string {
	const e = checkEpsilon(epsilon, field);
	const [int, frac = ''] = e.toFixed(4).split('.');
	return `e${int}p${frac}`;
}

/** Tag of the state inside a job name. */
export type StateTag = 'neutral' | 'cation' | 'anion' | 'screened';

/** File name of a deck: `<job>.<ext>` with the job name checked. */
export function deckFileName(jobName: string, extension: 'nw' | 'in' | 'py'): string {
	return `${checkJobName(jobName, 'jobName', MAX_JOB_NAME)}.${extension}`;
}
