// Frame: any right-handed Cartesian frame; lengths in mm.
// Small tuple helpers for the import (plain numbers; the import is not a hot loop).

export type Vec3 = [number, number, number];

/** a − b (mm). */
export const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
/** a + b (mm). */
export const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
/** s · a. */
export const scale = (a: Vec3, s: number): Vec3 => [a[0] * s, a[1] * s, a[2] * s];
/** a · b. */
export const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
/** a × b. */
export const cross = (a: Vec3, b: Vec3): Vec3 => [
	a[1] * b[2] - a[2] * b[1],
	a[2] * b[0] - a[0] * b[2],
	a[0] * b[1] - a[1] * b[0]
];
/** |a| (mm). */
export const norm = (a: Vec3): number => Math.hypot(a[0], a[1], a[2]);
/** |a − b| (mm). */
export const dist = (a: Vec3, b: Vec3): number => norm(sub(a, b));

/** A rigid or reflected map p ↦ R p + t; R row-major 3×3. */
export interface Affine {
	R: [Vec3, Vec3, Vec3];
	t: Vec3;
}

export const IDENTITY: Affine = { R: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], t: [0, 0, 0] };

/** Apply map m to point p (mm). */
export function apply(m: Affine, p: Vec3): Vec3 {
	return add([dot(m.R[0], p), dot(m.R[1], p), dot(m.R[2], p)], m.t);
}

/** The map "first a, then b" (b ∘ a). */
export function compose(b: Affine, a: Affine): Affine {
	const col = (j: number): Vec3 => [a.R[0][j], a.R[1][j], a.R[2][j]];
	const R = b.R.map((row) => [dot(row, col(0)), dot(row, col(1)), dot(row, col(2))]) as Affine['R'];
	return { R, t: apply(b, a.t) };
}
