/**
 * Radius (Å) of the sphere whose volume equals the volume per molecule: R = (3V / (4π))^(1/3).
 * Throws RangeError unless the volume is finite and > 0.
 */
export function bornRadiusA(volumePerMoleculeA3: number): number {
	if (typeof volumePerMoleculeA3 !== 'number' || !Number.isFinite(volumePerMoleculeA3) || volumePerMoleculeA3 <= 0) {
		throw new RangeError(`volume per molecule must be a finite number > 0 Å³, got ${volumePerMoleculeA3}`);
	}
	return Math.cbrt((3 * volumePerMoleculeA3) / (4 * Math.PI));
}
