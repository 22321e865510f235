import { CliInputError, CliUsageError } from './types';

/** A required numeric option: usage error when missing, input error when not a finite number. */
export function requiredNumber(name: string, v: string | undefined): number {
	if (v === undefined) throw new CliUsageError(`--${name} is required`);
	const n = Number(v);
	if (v.trim() === '' || !Number.isFinite(n)) throw new CliInputError(`--${name} must be a number, got "${v}"`);
	return n;
}
