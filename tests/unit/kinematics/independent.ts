// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// The contract's measures (../shared/geometry-format.md) computed outside the engine, from poses
// the independent general-purpose solver (mathjs 6-DOF Newton, reference-solver.ts) gives at any
// sweep position: the upright's points are placed by the rigid motion read from that pose, the
// chassis points stay (steer.inner moves by the rack), and the contract's wording is applied in
// plain arithmetic here. Nothing of the engine's chains, poses or measure code is used.

import { referenceSweep, type ReferencePose } from '../../../src/lib/server/kinematics/reference-solver';
import type { CornerInput, Sample, SweepKind } from '../../../src/lib/server/kinematics/index';
import { DEG, dot, norm, sub } from './helpers';

export type V = number[];
export const cross = (a: V, b: V): V => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const scale = (a: V, k: number): V => a.map((v) => v * k);
export const add = (a: V, b: V): V => a.map((v, i) => v + b[i]);
const unit = (a: V): V => scale(a, 1 / norm(a));

/** The first point the reference reports, by kind (its lower joint; the front pivot on a semi-trailing arm). */
const FIRST: Record<string, string> = {
	double_wishbone: 'lower.outer',
	strut: 'lower.outer',
	multi_link: 'lower_front.outer',
	semi_trailing: 'arm.front'
};

/** Points of the upright that the chassis does not hold, by kind. */
const UPRIGHT: Record<string, string[]> = {
	double_wishbone: ['lower.outer', 'upper.outer', 'steer.outer'],
	strut: ['lower.outer', 'strut.lower', 'steer.outer'],
	multi_link: ['lower_front.outer', 'lower_rear.outer', 'upper_front.outer', 'upper_rear.outer', 'steer.outer'],
	semi_trailing: []
};

/** Orthonormal frame (columns e1 e2 e3) of three non-collinear points o, p, q. */
function frame(o: V, p: V, q: V): V[] {
	const e1 = unit(sub(p, o));
	const e3 = unit(cross(e1, sub(q, o)));
	return [e1, cross(e3, e1), e3];
}

/** A rigid motion: design point → its position at the pose (R as three rows, W the moved wheel centre). */
export interface Motion {
	R: V[];
	W: V;
	W0: V;
}

/** The upright's rigid motion at reference pose r of corner c (from wheel centre, axis inner and first point). */
export function motionOf(c: CornerInput, r: ReferencePose): Motion {
	const P = c.points;
	const d = frame(P['wheel.centre'], P['wheel.axis_inner'], P[FIRST[c.kind]]);
	const m = frame(r.wheelCentre, r.axisInner, r.lowerOuter);
	// R = M D^T with the frames as columns
	const R = [0, 1, 2].map((i) => [0, 1, 2].map((j) => m[0][i] * d[0][j] + m[1][i] * d[1][j] + m[2][i] * d[2][j]));
	return { R, W: r.wheelCentre, W0: P['wheel.centre'] };
}

/** Design point p carried by motion m. */
export function carry(m: Motion, p: V): V {
	const q = sub(p, m.W0);
	return m.R.map((row, i) => m.W[i] + dot(row, q));
}

/** Every point of corner c at a pose: chassis points as designed (steer.inner moved by `rack` along +y), upright points carried. */
export function pointsAt(c: CornerInput, m: Motion, rack: number): Record<string, V> {
	const out: Record<string, V> = {};
	for (const [k, p] of Object.entries(c.points)) out[k] = p.slice();
	out['steer.inner'] &&= add(out['steer.inner'], [0, rack, 0]);
	for (const k of [...UPRIGHT[c.kind], 'wheel.centre', 'wheel.axis_inner']) out[k] = carry(m, c.points[k]);
	return out;
}

/** Line {u: a·u + b·z = c} cut from the plane through p, q, r by the plane coord[axis] = at (front view keeps y, side view x). */
function cut(p: V, q: V, r: V, axis: 0 | 1, at: number): V {
	const n = cross(sub(q, p), sub(r, p));
	const u = axis === 0 ? 1 : 0;
	return [n[u], n[2], dot(n, p) - n[axis] * at];
}

/** Meet of two lines a u + b z = c, or null when parallel. */
export function meet(l1: V, l2: V): [number, number] | null {
	const det = l1[0] * l2[1] - l2[0] * l1[1];
	if (Math.abs(det) < 1e-9 * Math.hypot(l1[0], l1[1]) * Math.hypot(l2[0], l2[1])) return null;
	return [(l1[2] * l2[1] - l2[2] * l1[1]) / det, (l1[0] * l2[2] - l2[0] * l1[2]) / det];
}

/** Midpoint of the shortest segment between the line p1→q1 and the line p2→q2 (closest points of two lines, closed form). */
function closestMid(p1: V, q1: V, p2: V, q2: V): V {
	const d1 = sub(q1, p1);
	const d2 = sub(q2, p2);
	const r = sub(p1, p2);
	const [a, b, e] = [dot(d1, d1), dot(d1, d2), dot(d2, d2)];
	const [cc, f] = [dot(d1, r), dot(d2, r)];
	const den = a * e - b * b;
	const s = (b * f - cc * e) / den;
	const t = (a * f - b * cc) / den;
	return scale(add(add(p1, scale(d1, s)), add(p2, scale(d2, t))), 0.5);
}

/** Instant centres from the motion (contract, motion kinds): ω and v(W) per mm of heave by a central difference of reference poses. */
function motionCentres(c: CornerInput, travel: number, rack: number): { fvic: [number, number] | null; svic: [number, number] | null } {
	const h = 1e-2; // smaller steps let the poses' 1e-12 mm rounding dominate the difference
	const ref = referenceSweep(c, 'heave', [travel - h, travel, travel + h], rack).poses;
	const [m0, m1, m2] = ref.map((r) => motionOf(c, r!));
	const vW = scale(sub(m2.W, m0.W), 1 / (2 * h));
	// Ω = dR/dt · Rᵀ, skew-symmetric; ω = (Ω32, Ω13, Ω21)
	const dR = m2.R.map((row, i) => scale(sub(row, m0.R[i]), 1 / (2 * h)));
	const Om = (i: number, j: number) => [0, 1, 2].reduce((acc, k) => acc + dR[i][k] * m1.R[j][k], 0);
	const w = [(Om(2, 1) - Om(1, 2)) / 2, (Om(0, 2) - Om(2, 0)) / 2, (Om(1, 0) - Om(0, 1)) / 2];
	const W = m1.W;
	// front view: p = W + (0, dy, dz), v_y = vW_y − ω_x dz = 0, v_z = vW_z + ω_x dy = 0
	const fvic: [number, number] | null = Math.abs(w[0]) < 1e-9 ? null : [W[1] - vW[2] / w[0], W[2] + vW[1] / w[0]];
	// side view: p = W + (dx, 0, dz), v_x = vW_x + ω_y dz = 0, v_z = vW_z − ω_y dx = 0
	const svic: [number, number] | null = Math.abs(w[1]) < 1e-9 ? null : [W[0] + vW[2] / w[1], W[2] - vW[0] / w[1]];
	return { fvic, svic };
}

/** What the contract defines at one pose, computed here (the sample's own keys and types; nothing of the engine runs). */
export type ByHand = Pick<Sample, 'camber' | 'toe' | 'caster' | 'kpi' | 'scrub_radius' | 'trail' | 'fvic' | 'svic' | 'fvsa' | 'rc_height' | 'anti_dive' | 'anti_squat' | 'half_track_change' | 'wheelbase_change'> & {
	contact_patch: V;
	wheel_centre: V;
};

/** Contact point (contract): lowest point of the wheel circle (radius R about W, normal a) against the ground normal n. */
function contactOf(W: V, a: V, n: V, R: number): V {
	const down = sub(n, scale(a, dot(a, n)));
	return sub(W, scale(down, R / norm(down)));
}

/** The contract's measures of corner c at sweep position `pos`, from the independent solver's pose. */
export function byContract(c: CornerInput, sweep: SweepKind, pos: number): ByHand {
	const rack = sweep === 'steer' ? pos : 0;
	const ref = referenceSweep(c, sweep, [pos]).poses[0];
	if (!ref) throw new Error(`the reference route did not reach ${sweep} ${pos}`);
	const P = pointsAt(c, motionOf(c, ref), rack);
	const W = P['wheel.centre'];
	const s = Math.sign(c.points['wheel.centre'][1]);
	const r = sweep === 'roll' ? pos / DEG : 0;
	const n = [0, -Math.sin(r), Math.cos(r)];
	const a = unit(sub(W, P['wheel.axis_inner']));
	const R = c.tyre.loaded_radius;
	const C = contactOf(W, a, n, R);
	const W0 = c.points['wheel.centre'];
	const C0 = contactOf(W0, unit(sub(W0, c.points['wheel.axis_inner'])), [0, 0, 1], R);

	// steering axis ends L (lower), U (upper)
	let L: V | null = null;
	let U: V | null = null;
	if (c.kind === 'double_wishbone') [L, U] = [P['lower.outer'], P['upper.outer']];
	if (c.kind === 'strut') [L, U] = [P['lower.outer'], P['strut.top']];
	if (c.kind === 'multi_link') {
		L = closestMid(P['lower_front.inner'], P['lower_front.outer'], P['lower_rear.inner'], P['lower_rear.outer']);
		U = closestMid(P['upper_front.inner'], P['upper_front.outer'], P['upper_rear.inner'], P['upper_rear.outer']);
	}
	let steering: Pick<ByHand, 'caster' | 'kpi' | 'scrub_radius' | 'trail'> = { caster: null, kpi: null, scrub_radius: null, trail: null };
	if (L && U) {
		const ax = sub(U, L);
		const G = add(L, scale(ax, -dot(n, L) / dot(n, ax))); // the axis meets the (rolled) ground
		steering = {
			caster: Math.atan2(-(U[0] - L[0]), U[2] - L[2]) * DEG,
			kpi: Math.atan2(-s * (U[1] - L[1]), U[2] - L[2]) * DEG,
			scrub_radius: s * (C[1] - G[1]),
			trail: G[0] - C[0]
		};
	}

	let fvic: [number, number] | null;
	let svic: [number, number] | null;
	if (c.kind === 'double_wishbone' || c.kind === 'strut') {
		// arm planes: each through its pivot axis and its ball joint's current position, cut by x = W_x and y = W_y
		const lowerFront = cut(P['lower.front'], P['lower.rear'], P['lower.outer'], 0, W[0]);
		const lowerSide = cut(P['lower.front'], P['lower.rear'], P['lower.outer'], 1, W[1]);
		let upperFront: V;
		let upperSide: V;
		if (c.kind === 'strut') {
			// the line through strut.top perpendicular to the projected strut axis in each view
			const d = sub(P['strut.top'], P['strut.lower']);
			const T = P['strut.top'];
			upperFront = [d[1], d[2], d[1] * T[1] + d[2] * T[2]];
			upperSide = [d[0], d[2], d[0] * T[0] + d[2] * T[2]];
		} else {
			upperFront = cut(P['upper.front'], P['upper.rear'], P['upper.outer'], 0, W[0]);
			upperSide = cut(P['upper.front'], P['upper.rear'], P['upper.outer'], 1, W[1]);
		}
		fvic = meet(lowerFront, upperFront);
		svic = meet(lowerSide, upperSide);
	} else {
		({ fvic, svic } = motionCentres(c, sweep === 'heave' ? pos : W[2] - W0[2], rack));
	}

	const v = c.vehicle;
	return {
		camber: -Math.asin(a[2]) * DEG,
		toe: Math.atan2(a[0], Math.abs(a[1])) * DEG,
		...steering,
		fvic,
		svic,
		fvsa: fvic && Math.hypot(C[1] - fvic[0], C[2] - fvic[1]),
		// heave only: where the line from C through fvic crosses y = 0
		rc_height: sweep !== 'heave' || !fvic ? null : C[2] + ((fvic[1] - C[2]) * (0 - C[1])) / (fvic[0] - C[1]),
		anti_dive: v && v.axle === 'front' && svic ? (100 * v.front_brake_fraction! * (v.wheelbase / v.cg_height) * (svic[1] - C[2])) / (C[0] - svic[0]) : null,
		anti_squat: v && v.axle === 'rear' && svic ? (100 * (v.rear_drive_fraction ?? 1) * (v.wheelbase / v.cg_height) * (svic[1] - W[2])) / (svic[0] - W[0]) : null,
		half_track_change: s * (C[1] - C0[1]),
		wheelbase_change: C[0] - C0[0],
		contact_patch: C,
		wheel_centre: W
	};
}
