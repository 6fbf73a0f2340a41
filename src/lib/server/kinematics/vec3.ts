// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Three-vectors as Float64Array(3); every function writes into `out` and allocates nothing.

/** A 3-vector of float64 (mm or unitless). */
export type Vec3 = Float64Array;

/** New zero vector, or a copy of [x, y, z]. */
export function vec3(x = 0, y = 0, z = 0): Vec3 {
	const v = new Float64Array(3);
	v[0] = x;
	v[1] = y;
	v[2] = z;
	return v;
}

/** out = a (copy). */
export function copy(out: Vec3, a: ArrayLike<number>): Vec3 {
	out[0] = a[0];
	out[1] = a[1];
	out[2] = a[2];
	return out;
}

/** out = a - b. */
export function sub(out: Vec3, a: Vec3, b: Vec3): Vec3 {
	out[0] = a[0] - b[0];
	out[1] = a[1] - b[1];
	out[2] = a[2] - b[2];
	return out;
}

/** out = a + b. */
export function add(out: Vec3, a: Vec3, b: Vec3): Vec3 {
	out[0] = a[0] + b[0];
	out[1] = a[1] + b[1];
	out[2] = a[2] + b[2];
	return out;
}

/** out = a + k b (k unitless). */
export function addScaled(out: Vec3, a: Vec3, b: Vec3, k: number): Vec3 {
	out[0] = a[0] + k * b[0];
	out[1] = a[1] + k * b[1];
	out[2] = a[2] + k * b[2];
	return out;
}

/** out = k a. */
export function scale(out: Vec3, a: Vec3, k: number): Vec3 {
	out[0] = k * a[0];
	out[1] = k * a[1];
	out[2] = k * a[2];
	return out;
}

/** Dot product a · b. */
export function dot(a: Vec3, b: Vec3): number {
	return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** out = a × b (out may not alias a or b). */
export function cross(out: Vec3, a: Vec3, b: Vec3): Vec3 {
	const x = a[1] * b[2] - a[2] * b[1];
	const y = a[2] * b[0] - a[0] * b[2];
	const z = a[0] * b[1] - a[1] * b[0];
	out[0] = x;
	out[1] = y;
	out[2] = z;
	return out;
}

/** Euclidean length |a|. */
export function len(a: Vec3): number {
	return Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
}

/** Distance |a - b| between two points (mm). */
export function dist(a: Vec3, b: Vec3): number {
	const x = a[0] - b[0];
	const y = a[1] - b[1];
	const z = a[2] - b[2];
	return Math.sqrt(x * x + y * y + z * z);
}

/** out = a / |a|; returns false (out untouched) when |a| is below `minLen` (mm). */
export function normalize(out: Vec3, a: Vec3, minLen: number): boolean {
	const l = len(a);
	if (!(l > minLen)) return false;
	out[0] = a[0] / l;
	out[1] = a[1] / l;
	out[2] = a[2] / l;
	return true;
}
