/**
 * Errors raised by the engine deck writers and output readers.
 *
 * Writers throw {@link DeckInputError} before producing any text when a job would give the engine
 * wrong or ambiguous input; readers throw {@link EngineOutputError} when a text is not an output of
 * the engine they read. Both carry the offending field or line so a route can turn them into a
 * `fail(400, ...)` with that message.
 */

/** A job that cannot be written as a correct engine deck. `field` names the offending input. */
export class DeckInputError extends Error {
	readonly field: string;

	constructor(field: string, message: string) {
		super(`${field}: ${message}`);
		this.name = 'DeckInputError';
		this.field = field;
	}
}

/** A text that cannot be read as the engine output it claims to be. `line` is 1-based when known. */
export class EngineOutputError extends Error {
	readonly line: number | null;

	constructor(message: string, line: number | null = null) {
		super(line === null ? message : `line ${line}: ${message}`);
		this.name = 'EngineOutputError';
		this.line = line;
	}
}
