/** Input checks shared inside the screening folder (not exported from the barrel). */
import { ScreeningError } from './screening-error';

export function finiteNumber(value: unknown, field: string): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ScreeningError(field, `${field} must be a finite number, got ${String(value)}`);
	}
	return value;
}

export function positiveNumber(value: unknown, field: string): number {
	const v = finiteNumber(value, field);
	if (v <= 0) throw new ScreeningError(field, `${field} must be > 0, got ${v}`);
	return v;
}

export function nonNegativeNumber(value: unknown, field: string): number {
	const v = finiteNumber(value, field);
	if (v < 0) throw new ScreeningError(field, `${field} must be >= 0, got ${v}`);
	return v;
}

/** A dielectric constant: finite and >= 1. */
export function epsilonValue(value: unknown, field = 'epsilon'): number {
	const v = finiteNumber(value, field);
	if (v < 1) throw new ScreeningError(field, `${field} must be >= 1, got ${v}`);
	return v;
}

/** An exact-exchange fraction: 0 <= alpha <= 1. */
export function fractionValue(value: unknown, field = 'alpha'): number {
	const v = finiteNumber(value, field);
	if (v < 0 || v > 1) throw new ScreeningError(field, `${field} must be between 0 and 1, got ${v}`);
	return v;
}

export function inputObject(input: unknown, what: string): void {
	if (input === null || typeof input !== 'object') throw new ScreeningError('input', `${what} expects an object input`);
}
