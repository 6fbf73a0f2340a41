// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians
// (converted to degrees only when samples are written out).
// Every measured quantity of the contract table, computed from a solved pose into a flat row.

import { PARALLEL_TOL_RAD, TINY } from './constants';
import { CHAIN_SLIDER, IC_MOTION, SPRING_NONE, contactPoint, type CornerModel } from './corner';
import type { Pose } from './solve';
import { vec3 } from './vec3';

/** Column indices of one measures row; `has` flags say which columns apply (else null). */
export const F_CAMBER = 0;
export const F_TOE = 1;
export const F_CASTER = 2;
export const F_KPI = 3;
export const F_SCRUB = 4;
export const F_TRAIL = 5;
export const F_HALF_TRACK = 6;
export const F_WHEELBASE = 7;
export const F_FVIC_Y = 8;
export const F_FVIC_Z = 9;
export const F_FVSA = 10;
export const F_RC = 11;
export const F_SVIC_X = 12;
export const F_SVIC_Z = 13;
export const F_ANTI_DIVE = 14;
export const F_ANTI_SQUAT = 15;
export const F_CAMBER_GROUND = 16;
export const F_MOTION_RATIO = 17;
export const F_WC_X = 18;
export const F_CP_X = 21;
export const F_SPRING_LENGTH = 24;
export const F_ROCKER_ANGLE = 25;
/** Width of one measures row. */
export const N_FIELDS = 26;

/** Sweep kinds as numbers. */
export const SWEEP_HEAVE = 0;
export const SWEEP_ROLL = 1;
export const SWEEP_STEER = 2;

/** Where the pose was solved: sweep kind, roll (rad) and the unit ground normal in chassis axes. */
export interface MeasureContext {
	sweep: number;
	roll: number;
	n: Float64Array;
}

const C = vec3();
/** sine of the contract's 1e-9 rad parallel tolerance, computed once */
const SIN_PARALLEL = Math.sin(PARALLEL_TOL_RAD);
const line = new Float64Array(6);
const planes = new Float64Array(8);
const hit = new Float64Array(2);

/** Mark out[i] present when finite, else null (0 stored); takes no number argument, so none is boxed. */
function mark(out: Float64Array, has: Uint8Array, i: number): void {
	if (Number.isFinite(out[i])) has[i] = 1;
	else {
		out[i] = 0;
		has[i] = 0;
	}
}

/** Mark column f of row o as null. */
function none(out: Float64Array, has: Uint8Array, o: number, f: number): void {
	out[o + f] = 0;
	has[o + f] = 0;
}

/**
 * All measures of pose p (corner m, context ctx) into row `row` of `out`/`has` (N_FIELDS wide).
 * Returns false when the contact point is undefined (the wheel lies flat on the ground).
 */
export function computeMeasures(
	m: CornerModel,
	p: Pose,
	ctx: MeasureContext,
	out: Float64Array,
	has: Uint8Array,
	row: number
): boolean {
	const o = row * N_FIELDS;
	if (!contactPoint(C, p.W, p.a, ctx.n, m)) return false;
	const s = m.side;
	const az = p.a[2] > 1 ? 1 : p.a[2] < -1 ? -1 : p.a[2];
	const camber = -Math.asin(az);
	out[o + F_CAMBER] = camber;
	has[o + F_CAMBER] = 1; // finite by construction (bounded inverse trig, differences)
	// atan2(y, x) through the cheaper atan where x > 0 (the two agree there)
	const ay0 = Math.abs(p.a[1]);
	out[o + F_TOE] = ay0 > 0 ? Math.atan(p.a[0] / ay0) : Math.atan2(p.a[0], ay0);
	has[o + F_TOE] = 1; // finite by construction (bounded inverse trig, differences)
	if (p.axisOk) {
		const ax = p.AU[0] - p.AL[0];
		const ay = p.AU[1] - p.AL[1];
		const azz = p.AU[2] - p.AL[2];
		out[o + F_CASTER] = azz > 0 ? Math.atan(-ax / azz) : Math.atan2(-ax, azz);
		has[o + F_CASTER] = 1; // finite by construction (bounded inverse trig, differences)
		out[o + F_KPI] = azz > 0 ? Math.atan((-s * ay) / azz) : Math.atan2(-s * ay, azz);
		has[o + F_KPI] = 1; // finite by construction (bounded inverse trig, differences)
		groundPoint(p, ctx.n, out, has, o, s);
	} else {
		none(out, has, o, F_CASTER);
		none(out, has, o, F_KPI);
		none(out, has, o, F_SCRUB);
		none(out, has, o, F_TRAIL);
	}
	out[o + F_HALF_TRACK] = s * (C[1] - m.contact0[1]);
	has[o + F_HALF_TRACK] = 1; // finite by construction (bounded inverse trig, differences)
	out[o + F_WHEELBASE] = C[0] - m.contact0[0];
	has[o + F_WHEELBASE] = 1; // finite by construction (bounded inverse trig, differences)
	instantCentres(m, p, ctx, out, has, o);
	if (ctx.sweep === SWEEP_ROLL) {
		out[o + F_CAMBER_GROUND] = camber + s * ctx.roll;
		mark(out, has, o + F_CAMBER_GROUND);
	} else none(out, has, o, F_CAMBER_GROUND);
	motionRatio(m, p, out, has, o);
	for (let i = 0; i < 3; i++) {
		out[o + F_WC_X + i] = p.W[i];
		has[o + F_WC_X + i] = 1;
		out[o + F_CP_X + i] = C[i];
		has[o + F_CP_X + i] = 1;
	}
	if (m.springOn === SPRING_NONE) none(out, has, o, F_SPRING_LENGTH);
	else {
		out[o + F_SPRING_LENGTH] = p.springLength;
		mark(out, has, o + F_SPRING_LENGTH);
	}
	if (m.rocker) {
		out[o + F_ROCKER_ANGLE] = p.rockerAngle;
		mark(out, has, o + F_ROCKER_ANGLE);
	} else none(out, has, o, F_ROCKER_ANGLE);
	return true;
}

/** Scrub radius and trail from G, where the steering axis (L + t·axis) meets the ground. */
function groundPoint(p: Pose, n: Float64Array, out: Float64Array, has: Uint8Array, o: number, s: number): void {
	const ax = p.AU[0] - p.AL[0];
	const ay = p.AU[1] - p.AL[1];
	const az = p.AU[2] - p.AL[2];
	const den = n[0] * ax + n[1] * ay + n[2] * az;
	if (Math.abs(den) < TINY) {
		none(out, has, o, F_SCRUB);
		none(out, has, o, F_TRAIL);
		return;
	}
	const t = -(n[0] * p.AL[0] + n[1] * p.AL[1] + n[2] * p.AL[2]) / den;
	const gx = p.AL[0] + t * ax;
	const gy = p.AL[1] + t * ay;
	out[o + F_SCRUB] = s * (C[1] - gy);
	mark(out, has, o + F_SCRUB);
	out[o + F_TRAIL] = gx - C[0];
	mark(out, has, o + F_TRAIL);
}

/** Normal (not unit) of the plane through an arm's pivot axis and its ball joint, and n·pivot, into planes[k..k+3]. */
function armPlane(e: Float64Array, pivot: Float64Array, joint: Float64Array, k: number): void {
	const rx = joint[0] - pivot[0];
	const ry = joint[1] - pivot[1];
	const rz = joint[2] - pivot[2];
	const nx = e[1] * rz - e[2] * ry;
	const ny = e[2] * rx - e[0] * rz;
	const nz = e[0] * ry - e[1] * rx;
	planes[k] = nx;
	planes[k + 1] = ny;
	planes[k + 2] = nz;
	planes[k + 3] = nx * pivot[0] + ny * pivot[1] + nz * pivot[2];
}

/**
 * Cut of plane planes[j..j+3] by x = wheel-centre x (view 0, front: a y + b z = c) or by
 * y = wheel-centre y (view 1, side: a x + b z = c), into line[k..k+2].
 */
function cutPlane(p: Pose, view: number, j: number, k: number): void {
	const nx = planes[j];
	const ny = planes[j + 1];
	line[k] = view === 0 ? ny : nx;
	line[k + 1] = planes[j + 2];
	line[k + 2] = view === 0 ? planes[j + 3] - nx * p.W[0] : planes[j + 3] - ny * p.W[1];
}

/** Strut upper line: through the top mount's projection, perpendicular to the projected strut axis. */
function strutLine(m: CornerModel, p: Pose, view: number, k: number): void {
	const P = m.strutTop;
	const da = view === 0 ? p.d[1] : p.d[0];
	const pa = view === 0 ? P[1] : P[0];
	line[k] = da;
	line[k + 1] = p.d[2];
	line[k + 2] = da * pa + p.d[2] * P[2];
}

/** Meet of the lines in `line`; false when either is degenerate or they are parallel within 1e-9 rad. */
function meet(): boolean {
	const a1 = line[0];
	const b1 = line[1];
	const a2 = line[3];
	const b2 = line[4];
	const q1 = a1 * a1 + b1 * b1;
	const q2 = a2 * a2 + b2 * b2;
	if (!(q1 > TINY * TINY) || !(q2 > TINY * TINY)) return false;
	const det = a1 * b2 - a2 * b1;
	// |sin(angle between the lines)| = |det| / (|n1| |n2|), compared squared to spare two roots
	if (det * det < SIN_PARALLEL * SIN_PARALLEL * q1 * q2) return false;
	const inv = 1 / det;
	hit[0] = (line[2] * b2 - line[5] * b1) * inv;
	hit[1] = (a1 * line[5] - a2 * line[2]) * inv;
	return true;
}

/** Fill the lines of both arms (or arm and strut) for one view at the wheel-centre plane. */
function viewLines(m: CornerModel, p: Pose, view: number): void {
	cutPlane(p, view, 0, 0);
	if (m.chain === CHAIN_SLIDER) strutLine(m, p, view, 3);
	else cutPlane(p, view, 4, 3);
}

/** fvic, fvsa, rc_height, svic, anti-dive and anti-squat. */
function instantCentres(m: CornerModel, p: Pose, ctx: MeasureContext, out: Float64Array, has: Uint8Array, o: number): void {
	if (m.icMode === IC_MOTION) return motionCentres(m, p, ctx, out, has, o);
	armPlane(m.lower.e, m.lower.pivot, p.L, 0);
	if (m.chain !== CHAIN_SLIDER) armPlane(m.upper.e, m.upper.pivot, p.K, 4);
	viewLines(m, p, 0);
	const fv = meet();
	frontView(fv, out, has, o);
	if (ctx.sweep === SWEEP_HEAVE) rollCentre(fv, out, has, o);
	else none(out, has, o, F_RC);
	viewLines(m, p, 1);
	sideView(meet(), out, has, o);
	anti(m, p, has[o + F_SVIC_X] === 1, out, has, o);
}

/** Write fvic and fvsa from `hit` (or null them). */
function frontView(fv: boolean, out: Float64Array, has: Uint8Array, o: number): void {
	if (fv) {
		out[o + F_FVIC_Y] = hit[0];
		mark(out, has, o + F_FVIC_Y);
		out[o + F_FVIC_Z] = hit[1];
		mark(out, has, o + F_FVIC_Z);
		out[o + F_FVSA] = Math.sqrt((C[1] - hit[0]) * (C[1] - hit[0]) + (C[2] - hit[1]) * (C[2] - hit[1]));
		mark(out, has, o + F_FVSA);
	} else {
		none(out, has, o, F_FVIC_Y);
		none(out, has, o, F_FVIC_Z);
		none(out, has, o, F_FVSA);
	}
}

/** Write svic from `hit` (or null it). */
function sideView(sv: boolean, out: Float64Array, has: Uint8Array, o: number): void {
	if (sv) {
		out[o + F_SVIC_X] = hit[0];
		mark(out, has, o + F_SVIC_X);
		out[o + F_SVIC_Z] = hit[1];
		mark(out, has, o + F_SVIC_Z);
	} else {
		none(out, has, o, F_SVIC_X);
		none(out, has, o, F_SVIC_Z);
	}
}

/** Below this |ω| per mm of heave (rad/mm) an instant centre is at infinity (contract). */
const OMEGA_MIN = 1e-9;

/**
 * Instant centres from the motion (contract, "More kinds"): with ω and the wheel centre's velocity v
 * per mm of heave, the point of the plane x = W_x that moves only along x is
 * [W_y − v_z/ω_x, W_z + v_y/ω_x]; of the plane y = W_y, [W_x + v_z/ω_y, W_z − v_x/ω_y].
 */
function motionCentres(m: CornerModel, p: Pose, ctx: MeasureContext, out: Float64Array, has: Uint8Array, o: number): void {
	const h = p.dW[2];
	if (!p.velocityOk || Math.abs(h) < TINY) {
		frontView(false, out, has, o);
		none(out, has, o, F_RC);
		sideView(false, out, has, o);
		return anti(m, p, false, out, has, o);
	}
	const wx = p.omega[0] / h;
	const wy = p.omega[1] / h;
	const vx = p.dW[0] / h;
	const vy = p.dW[1] / h;
	const fv = Math.abs(wx) >= OMEGA_MIN;
	if (fv) {
		hit[0] = p.W[1] - 1 / wx;
		hit[1] = p.W[2] + vy / wx;
	}
	frontView(fv, out, has, o);
	if (ctx.sweep === SWEEP_HEAVE) motionRollCentre(p, fv, h, out, has, o);
	else none(out, has, o, F_RC);
	const sv = Math.abs(wy) >= OMEGA_MIN;
	if (sv) {
		hit[0] = p.W[0] + 1 / wy;
		hit[1] = p.W[2] - vx / wy;
	}
	sideView(sv, out, has, o);
	anti(m, p, sv, out, has, o);
}

/** rc_height of the motion kinds: through fvic, or (fvic null) perpendicular to C's velocity in the front view. */
function motionRollCentre(p: Pose, fv: boolean, h: number, out: Float64Array, has: Uint8Array, o: number): void {
	if (fv) return rollCentre(true, out, has, o);
	// velocity of the upright point at C: dL + ω × (C − L), per unit of the chain's driver
	const w = p.omega;
	const x = C[0] - p.L[0];
	const y = C[1] - p.L[1];
	const z = C[2] - p.L[2];
	const cy = (p.dL[1] + w[2] * x - w[0] * z) / h;
	const cz = (p.dL[2] + w[0] * y - w[1] * x) / h;
	// the line from C with direction (cz, −cy) ⊥ (cy, cz)
	const dy = cz;
	const dz = -cy;
	if (Math.abs(dy) < TINY) return none(out, has, o, F_RC);
	out[o + F_RC] = C[2] + (dz * (0 - C[1])) / dy;
	mark(out, has, o + F_RC);
}

/** Height where the line from C through fvic (or parallel to the arm lines) crosses y = 0. */
function rollCentre(fv: boolean, out: Float64Array, has: Uint8Array, o: number): void {
	let dy: number;
	let dz: number;
	if (fv) {
		dy = hit[0] - C[1];
		dz = hit[1] - C[2];
	} else {
		dy = -line[1];
		dz = line[0];
	}
	if (Math.abs(dy) < TINY) return none(out, has, o, F_RC);
	out[o + F_RC] = C[2] + (dz * (0 - C[1])) / dy;
	mark(out, has, o + F_RC);
}

/** Anti-dive (front) / anti-squat (rear), percent (Milliken & Milliken, RCVD ch. 17, as in the contract). */
function anti(m: CornerModel, p: Pose, sv: boolean, out: Float64Array, has: Uint8Array, o: number): void {
	none(out, has, o, F_ANTI_DIVE);
	none(out, has, o, F_ANTI_SQUAT);
	const v = m.vehicle;
	if (!v || !sv) return;
	const k = 100 * v.fraction * (v.wheelbase / v.cgHeight);
	const sx = hit[0];
	const sz = hit[1];
	if (v.front) {
		if (C[0] === sx) return;
		out[o + F_ANTI_DIVE] = (k * (sz - C[2])) / (C[0] - sx);
		mark(out, has, o + F_ANTI_DIVE);
	} else {
		if (sx === p.W[0]) return;
		out[o + F_ANTI_SQUAT] = (k * (sz - p.W[2])) / (sx - p.W[0]);
		mark(out, has, o + F_ANTI_SQUAT);
	}
}

/** Motion ratio −d(spring length)/d(travel) from the velocity analysis (heave, rack held). */
function motionRatio(m: CornerModel, p: Pose, out: Float64Array, has: Uint8Array, o: number): void {
	if (m.springOn === SPRING_NONE || !p.velocityOk || Math.abs(p.dW[2]) < TINY) {
		return none(out, has, o, F_MOTION_RATIO);
	}
	out[o + F_MOTION_RATIO] = -p.dSpringLength / p.dW[2];
	mark(out, has, o + F_MOTION_RATIO);
}
