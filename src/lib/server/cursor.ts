import { ValidationError } from './errors';

/** Opaque keyset cursors for list endpoints: base64url of the last row's sort key. */
export function encodeCursor(key: Record<string, string>): string {
	return Buffer.from(JSON.stringify(key)).toString('base64url');
}

export function decodeCursor<K extends string>(raw: string | null, fields: readonly K[]): Record<K, string> | undefined {
	if (!raw) return undefined;
	try {
		const v = JSON.parse(Buffer.from(raw, 'base64url').toString('utf8'));
		if (fields.every((f) => typeof v?.[f] === 'string')) return v;
	} catch {
		/* fall through */
	}
	throw new ValidationError('cursor is not valid: pass back the nextCursor of a previous page', 'cursor');
}

export function pageLimit(raw: string | null, max = 100, fallback = 25): number {
	if (raw === null) return fallback;
	const n = Number(raw);
	if (!Number.isInteger(n) || n < 1 || n > max) throw new ValidationError(`limit must be a whole number from 1 to ${max}`, 'limit');
	return n;
}
