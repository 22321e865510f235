/**
 * Small text helpers shared by the deck writers: number formatting engines read back exactly,
 * and comment and token sanitising so that user text cannot break a deck.
 */
import { DeckInputError } from './errors';

/**
 * A real number in plain decimal notation with up to `decimals` decimals, trailing zeros removed
 * but at least one decimal kept (`0.8`, `1.0`, `0.133333333333`, `-0.033333333333`).
 * No exponent, so every Fortran or Python reader takes it as written.
 */
export function formatReal(x: number, decimals = 12): string {
	if (!Number.isFinite(x)) throw new DeckInputError('number', `cannot write non-finite value ${x}`);
	if (Math.abs(x) >= 1e15) throw new DeckInputError('number', `value ${x} is too large for a deck`);
	let s = x.toFixed(decimals);
	if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '.0');
	if (/^-0\.0$/.test(s)) s = '0.0';
	return s;
}

/** A small positive threshold in exponent notation (`1e-8`), as engines document them. */
export function formatThreshold(x: number, field: string): string {
	if (!Number.isFinite(x) || x <= 0 || x >= 1) {
		throw new DeckInputError(field, `threshold must be a finite number in (0, 1), got ${x}`);
	}
	return x.toExponential().replace('e+', 'e');
}

/** One line of free text made safe for a comment: control characters and line breaks become spaces. */
export function commentText(s: string): string {
	// eslint-disable-next-line no-control-regex
	return s.replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, ' ').trim();
}

/** Word-wrap a text into comment lines of at most `width` characters after the prefix. */
export function wrapComment(prefix: string, text: string, width = 96): string[] {
	const words = commentText(text).split(/\s+/).filter(Boolean);
	const lines: string[] = [];
	let line = '';
	for (const w of words) {
		if (line && line.length + 1 + w.length > width) {
			lines.push(prefix + line);
			line = w;
		} else {
			line = line ? `${line} ${w}` : w;
		}
	}
	if (line || lines.length === 0) lines.push(prefix + line);
	return lines;
}

/** ASCII-only label for engine titles: letters, digits and a few safe signs; others become '_'. */
export function titleText(s: string, max = 70): string {
	return commentText(s)
		.replace(/[^A-Za-z0-9 _.,:=+\-()/^*]/g, '_')
		.slice(0, max)
		.trim();
}
