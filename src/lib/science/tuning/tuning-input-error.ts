/**
 * Error thrown when the input of a tuning routine is invalid. It names the offending field and, for
 * scan points, the row (0-based index of the point in the array that was passed in).
 */
export class TuningInputError extends Error {
	readonly field: string;
	readonly row: number | undefined;

	constructor(message: string, field: string, row?: number) {
		super(message);
		this.name = 'TuningInputError';
		this.field = field;
		this.row = row;
	}
}
