/** A unit cell: edge lengths in Å and inter-axial angles in degrees (alpha = angle(b, c), etc.). */
export interface UnitCell {
	a: number;
	b: number;
	c: number;
	alphaDeg: number;
	betaDeg: number;
	gammaDeg: number;
}

/** A 3-vector (Å for Cartesian positions, dimensionless for fractional ones). */
export type Vec3 = readonly [number, number, number];

/** A 3x3 matrix stored as rows. For a cell matrix the rows are the lattice vectors a, b, c (Å). */
export type Matrix3 = readonly [Vec3, Vec3, Vec3];
