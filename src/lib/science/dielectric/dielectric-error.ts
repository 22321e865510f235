/**
 * Errors raised by the dielectric routines. They extend RangeError (bad input values) and name the input
 * field concerned, so a route can show the message next to the right form field.
 */
export class DielectricError extends RangeError {
	/** Input field concerned, e.g. `tensor`, `refractiveIndex`, `volumePerMoleculeA3`. */
	readonly field: string;

	constructor(field: string, message: string) {
		super(message);
		this.name = 'DielectricError';
		this.field = field;
	}
}

/**
 * Clausius–Mossotti has no solution: 4 pi alpha' / (3 V_m) >= 1 means the local-field feedback diverges
 * (the "polarization catastrophe"), so the polarizability is too large for the volume per molecule given
 * (or the volume is too small, e.g. a cell volume not divided by Z).
 */
export class PolarizationCatastropheError extends DielectricError {
	/** The offending ratio x = 4 pi alpha' / (3 V_m) (>= 1). */
	readonly x: number;

	constructor(x: number, polarizabilityVolumeA3: number, volumePerMoleculeA3: number) {
		super(
			'polarizability',
			`Clausius–Mossotti has no solution: x = 4 pi alpha' / (3 V_m) = ${fmt(x)} >= 1 ` +
				`(alpha' = ${fmt(polarizabilityVolumeA3)} Å^3, V_m = ${fmt(volumePerMoleculeA3)} Å^3). ` +
				'The local-field model diverges (polarization catastrophe): check the polarizability unit and ' +
				'that the volume is per molecule (cell volume divided by Z).'
		);
		this.name = 'PolarizationCatastropheError';
		this.x = x;
	}
}

function fmt(v: number): string {
	return Number(v.toPrecision(4)).toString();
}
