/**
 * Volume per formula unit (per molecule) in Å³: V_cell / Z.
 * Throws RangeError unless the volume is finite and > 0 and Z is finite and > 0.
 */
export function volumePerMoleculeA3(volumeA3: number, z: number): number {
	if (typeof volumeA3 !== 'number' || !Number.isFinite(volumeA3) || volumeA3 <= 0) {
		throw new RangeError(`cell volume must be a finite number > 0 Å³, got ${volumeA3}`);
	}
	if (typeof z !== 'number' || !Number.isFinite(z) || z <= 0) {
		throw new RangeError(`Z (formula units per cell) must be a finite number > 0, got ${z}`);
	}
	return volumeA3 / z;
}
