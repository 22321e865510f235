/**
 * Error raised by the screening routines for invalid inputs. Extends RangeError and names the input field,
 * so a route can show the message next to the right form field.
 */
export class ScreeningError extends RangeError {
	/** Input field concerned, e.g. `epsilon`, `alpha`, `radiusA`. */
	readonly field: string;

	constructor(field: string, message: string) {
		super(message);
		this.name = 'ScreeningError';
		this.field = field;
	}
}
