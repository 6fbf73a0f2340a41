// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians.
// Rigid-body rotations as row-major 3x3 Float64Array(9): R[3 * row + col].

import { TINY } from './constants';
import type { Vec3 } from './vec3';

/** A row-major 3x3 rotation matrix. */
export type Mat3 = Float64Array;

/** New identity matrix. */
export function mat3(): Mat3 {
	const m = new Float64Array(9);
	m[0] = m[4] = m[8] = 1;
	return m;
}

/** out = rotation by `angle` (rad, right hand) about unit axis `n` (Rodrigues' formula). */
export function axisAngle(out: Mat3, n: Vec3, angle: number): Mat3 {
	return axisCosSin(out, n, new Float64Array([Math.cos(angle), Math.sin(angle)]));
}

/** out = rotation about unit axis `n` by the angle whose [cosine, sine] are cs[0], cs[1]. */
export function axisCosSin(out: Mat3, n: Vec3, cs: Float64Array): Mat3 {
	const c = cs[0];
	const s = cs[1];
	const t = 1 - c;
	const x = n[0];
	const y = n[1];
	const z = n[2];
	out[0] = c + t * x * x;
	out[1] = t * x * y - s * z;
	out[2] = t * x * z + s * y;
	out[3] = t * x * y + s * z;
	out[4] = c + t * y * y;
	out[5] = t * y * z - s * x;
	out[6] = t * x * z - s * y;
	out[7] = t * y * z + s * x;
	out[8] = c + t * z * z;
	return out;
}

/**
 * out = the smallest rotation taking unit vector `u` onto unit vector `v`
 * (R = c I + [k]x + k kᵀ / (1 + c), k = u × v, c = u · v); false when u ≈ -v.
 */
export function minimalRotation(out: Mat3, u: Vec3, v: Vec3): boolean {
	const kx = u[1] * v[2] - u[2] * v[1];
	const ky = u[2] * v[0] - u[0] * v[2];
	const kz = u[0] * v[1] - u[1] * v[0];
	const c = u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
	const h = 1 + c;
	if (!(h > TINY)) return false;
	const f = 1 / h;
	out[0] = c + f * kx * kx;
	out[1] = f * kx * ky - kz;
	out[2] = f * kx * kz + ky;
	out[3] = f * kx * ky + kz;
	out[4] = c + f * ky * ky;
	out[5] = f * ky * kz - kx;
	out[6] = f * kx * kz - ky;
	out[7] = f * ky * kz + kx;
	out[8] = c + f * kz * kz;
	return true;
}

/** out = a b (out may not alias a or b). */
export function mul(out: Mat3, a: Mat3, b: Mat3): Mat3 {
	for (let i = 0; i < 3; i++) {
		const a0 = a[3 * i];
		const a1 = a[3 * i + 1];
		const a2 = a[3 * i + 2];
		out[3 * i] = a0 * b[0] + a1 * b[3] + a2 * b[6];
		out[3 * i + 1] = a0 * b[1] + a1 * b[4] + a2 * b[7];
		out[3 * i + 2] = a0 * b[2] + a1 * b[5] + a2 * b[8];
	}
	return out;
}

/** out = R v (a direction, or a body vector; out may alias v). */
export function rotate(out: Vec3, r: Mat3, v: Vec3): Vec3 {
	const x = v[0];
	const y = v[1];
	const z = v[2];
	out[0] = r[0] * x + r[1] * y + r[2] * z;
	out[1] = r[3] * x + r[4] * y + r[5] * z;
	out[2] = r[6] * x + r[7] * y + r[8] * z;
	return out;
}

/** out = origin + R v: body point `v` (mm, relative to the body origin) placed in the chassis (out may alias v). */
export function place(out: Vec3, r: Mat3, v: Vec3, origin: Vec3): Vec3 {
	rotate(out, r, v);
	out[0] += origin[0];
	out[1] += origin[1];
	out[2] += origin[2];
	return out;
}
