/**
 * Small 3x3 helpers shared inside the dielectric folder (not exported from the barrel).
 */
import { DielectricError } from './dielectric-error';

export type Vec3 = [number, number, number];
export type Matrix3 = number[][];
export type Matrix3Input = readonly (readonly number[])[];

const AXES = ['x', 'y', 'z'];

/** Check a 3x3 matrix of finite numbers and return a fresh copy. */
export function checkedMatrix3(m: unknown, field: string): Matrix3 {
	if (!Array.isArray(m) || m.length !== 3 || !m.every((r) => Array.isArray(r) && r.length === 3)) {
		throw new DielectricError(field, `${field} must be a 3x3 matrix`);
	}
	return (m as unknown[][]).map((row, i) =>
		row.map((v, j) => {
			if (typeof v !== 'number' || !Number.isFinite(v)) {
				throw new DielectricError(field, `${field} entry ${AXES[i]}${AXES[j]} must be a finite number, got ${String(v)}`);
			}
			return v;
		})
	);
}

/** Check a 3-vector of finite numbers and return a fresh copy. */
export function checkedVec3(v: unknown, field: string): Vec3 {
	if (!Array.isArray(v) || v.length !== 3) throw new DielectricError(field, `${field} must have 3 components`);
	return v.map((x, i) => {
		if (typeof x !== 'number' || !Number.isFinite(x)) {
			throw new DielectricError(field, `${field} component ${i + 1} must be a finite number, got ${String(x)}`);
		}
		return x;
	}) as Vec3;
}

export function det3(m: Matrix3Input): number {
	return (
		m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
		m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
		m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
	);
}

export function cross(a: readonly number[], b: readonly number[]): Vec3 {
	return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

export function dot(a: readonly number[], b: readonly number[]): number {
	return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

export function norm(a: readonly number[]): number {
	return Math.hypot(a[0], a[1], a[2]);
}
