// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Keep-out volumes: how deep a point or a rod (a straight segment between two joints) reaches into a box or a
// cylinder fixed to the chassis, or into the space a wheel's rim takes (everything at or beyond the barrel's
// inner radius, less the clearance, from the spin axis, across the rim's width). Depth > 0 is inside (mm from the
// nearest way out); depth < 0 is outside, minus the distance to the volume (clearance).

/** A keep-out volume as the studies hand it over: the car file's fields (src/lib/schemas/keep-out.ts). */
export type Volume =
	| { shape: 'box'; name: string; min: ArrayLike<number>; max: ArrayLike<number> }
	| { shape: 'cylinder'; name: string; from: ArrayLike<number>; to: ArrayLike<number>; radius: number }
	| { shape: 'rim'; name: string; barrel_radius: number; clearance: number; inboard: number; outboard: number };

/** A rim's wheel frame at one pose: wheel centre and the unit spin axis pointing outboard. */
export interface WheelFrame {
	centre: ArrayLike<number>;
	axis: ArrayLike<number>;
}

const p = new Float64Array(3);

/** Depth of point (x, y, z) in volume v (mm; < 0 outside, minus the distance to it). `wheel` is needed for a rim. */
export function depthOfPoint(v: Volume, x: number, y: number, z: number, wheel: WheelFrame | null): number {
	if (v.shape === 'box') {
		// per axis: how far the point lies beyond a face (> 0) or inside both faces (≤ 0, minus the nearer one)
		const gx = Math.max(v.min[0] - x, x - v.max[0]);
		const gy = Math.max(v.min[1] - y, y - v.max[1]);
		const gz = Math.max(v.min[2] - z, z - v.max[2]);
		if (gx <= 0 && gy <= 0 && gz <= 0) return -Math.max(gx, gy, gz);
		return -Math.hypot(Math.max(gx, 0), Math.max(gy, 0), Math.max(gz, 0));
	}
	if (v.shape === 'cylinder') {
		const ax = v.to[0] - v.from[0];
		const ay = v.to[1] - v.from[1];
		const az = v.to[2] - v.from[2];
		const L = Math.hypot(ax, ay, az);
		const t = ((x - v.from[0]) * ax + (y - v.from[1]) * ay + (z - v.from[2]) * az) / L;
		const r = radial(x - v.from[0], y - v.from[1], z - v.from[2], ax / L, ay / L, az / L, t);
		if (t >= 0 && t <= L && r <= v.radius) return Math.min(v.radius - r, t, L - t);
		const dr = Math.max(r - v.radius, 0);
		const dt = Math.max(-t, t - L, 0);
		return -Math.hypot(dr, dt);
	}
	if (!wheel) throw new Error('a rim volume needs the wheel frame');
	const c = wheel.centre;
	const a = wheel.axis;
	const t = (x - c[0]) * a[0] + (y - c[1]) * a[1] + (z - c[2]) * a[2];
	const r = radial(x - c[0], y - c[1], z - c[2], a[0], a[1], a[2], t);
	const inner = v.barrel_radius - v.clearance;
	const lo = -v.inboard;
	const hi = v.outboard;
	if (t >= lo && t <= hi) return r >= inner ? Math.min(r - inner, t - lo, hi - t) : r - inner;
	const dt = t < lo ? lo - t : t - hi;
	return -Math.hypot(dt, Math.max(inner - r, 0));
}

/** Distance of d (a vector from a point on a line) to the line of unit direction u, given t = d·u. */
function radial(dx: number, dy: number, dz: number, ux: number, uy: number, uz: number, t: number): number {
	p[0] = dx - t * ux;
	p[1] = dy - t * uy;
	p[2] = dz - t * uz;
	return Math.hypot(p[0], p[1], p[2]);
}

/** Samples along a segment before the golden-section refinement. */
const SAMPLES = 9;
/** Golden-section steps: the bracket shrinks to 0.618^30 ≈ 5e-7 of one sample interval. */
const GOLDEN_STEPS = 30;
const INV_PHI = (Math.sqrt(5) - 1) / 2;

/**
 * The deepest point of segment a–b in v: returns the depth and writes the segment parameter s (0 at a, 1 at b) into
 * at[0]. The depth along a line is concave for a box and a cylinder (minus the signed distance to a convex set), so
 * the samples bracket its maximum and the golden-section search finds it; for a rim (not convex) the samples every
 * 1/8 of the segment and the refinement around the best of them are the resolution.
 */
export function depthOfSegment(v: Volume, a: ArrayLike<number>, b: ArrayLike<number>, wheel: WheelFrame | null, at: Float64Array): number {
	const dx = b[0] - a[0];
	const dy = b[1] - a[1];
	const dz = b[2] - a[2];
	const f = (s: number) => depthOfPoint(v, a[0] + s * dx, a[1] + s * dy, a[2] + s * dz, wheel);
	if (dx === 0 && dy === 0 && dz === 0) {
		at[0] = 0;
		return f(0);
	}
	let best = -Infinity;
	let bestK = 0;
	for (let k = 0; k < SAMPLES; k++) {
		const d = f(k / (SAMPLES - 1));
		if (d > best) {
			best = d;
			bestK = k;
		}
	}
	let lo = Math.max(0, (bestK - 1) / (SAMPLES - 1));
	let hi = Math.min(1, (bestK + 1) / (SAMPLES - 1));
	let x1 = hi - INV_PHI * (hi - lo);
	let x2 = lo + INV_PHI * (hi - lo);
	let f1 = f(x1);
	let f2 = f(x2);
	for (let i = 0; i < GOLDEN_STEPS; i++) {
		if (f1 < f2) {
			lo = x1;
			x1 = x2;
			f1 = f2;
			x2 = lo + INV_PHI * (hi - lo);
			f2 = f(x2);
		} else {
			hi = x2;
			x2 = x1;
			f2 = f1;
			x1 = hi - INV_PHI * (hi - lo);
			f1 = f(x1);
		}
	}
	const s = f1 > f2 ? x1 : x2;
	const refined = Math.max(f1, f2);
	if (refined > best) {
		at[0] = s;
		return refined;
	}
	at[0] = bestK / (SAMPLES - 1);
	return best;
}

/** A bounding test that needs no search: true when segment a–b surely stays out of v (depth ≤ −margin everywhere). */
export function surelyClear(v: Volume, a: ArrayLike<number>, b: ArrayLike<number>, wheel: WheelFrame | null, margin: number): boolean {
	if (v.shape === 'box') {
		for (let i = 0; i < 3; i++) {
			if (a[i] < v.min[i] - margin && b[i] < v.min[i] - margin) return true;
			if (a[i] > v.max[i] + margin && b[i] > v.max[i] + margin) return true;
		}
		return false;
	}
	if (v.shape === 'cylinder') {
		// the bounding sphere of the cylinder against the segment's nearest point
		const cx = (v.from[0] + v.to[0]) / 2;
		const cy = (v.from[1] + v.to[1]) / 2;
		const cz = (v.from[2] + v.to[2]) / 2;
		const R = Math.hypot(Math.hypot(v.to[0] - v.from[0], v.to[1] - v.from[1], v.to[2] - v.from[2]) / 2, v.radius);
		return segmentPointDistance(a, b, cx, cy, cz) > R + margin;
	}
	// a rim: the distance from the spin axis is convex along a segment, so both ends inside the inner radius keep
	// the whole segment inside it; the position along the axis is linear, so both ends beyond one edge keep it out
	const c = wheel!.centre;
	const u = wheel!.axis;
	const ta = (a[0] - c[0]) * u[0] + (a[1] - c[1]) * u[1] + (a[2] - c[2]) * u[2];
	const tb = (b[0] - c[0]) * u[0] + (b[1] - c[1]) * u[1] + (b[2] - c[2]) * u[2];
	if ((ta < -v.inboard - margin && tb < -v.inboard - margin) || (ta > v.outboard + margin && tb > v.outboard + margin)) return true;
	const inner = v.barrel_radius - v.clearance - margin;
	return radial(a[0] - c[0], a[1] - c[1], a[2] - c[2], u[0], u[1], u[2], ta) < inner && radial(b[0] - c[0], b[1] - c[1], b[2] - c[2], u[0], u[1], u[2], tb) < inner;
}

/** Distance from point (x, y, z) to segment a–b. */
function segmentPointDistance(a: ArrayLike<number>, b: ArrayLike<number>, x: number, y: number, z: number): number {
	const dx = b[0] - a[0];
	const dy = b[1] - a[1];
	const dz = b[2] - a[2];
	const L2 = dx * dx + dy * dy + dz * dz;
	let s = L2 > 0 ? ((x - a[0]) * dx + (y - a[1]) * dy + (z - a[2]) * dz) / L2 : 0;
	s = Math.min(1, Math.max(0, s));
	return Math.hypot(a[0] + s * dx - x, a[1] + s * dy - y, a[2] + s * dz - z);
}
