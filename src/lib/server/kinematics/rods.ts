// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians.
// The rods chain (five-link): the upright's six coordinates from five rod lengths and the sweep's
// driver, by Newton's method with the analytic Jacobian. Unknowns are a small displacement δO of
// the origin (the wheel centre) and a small rotation δφ, so a point q = O + r of the upright moves
// by δO + δφ × r; rod i (inner end P) contributes |q − P|² − l² with the row 2 [(q − P), r × (q − P)].
// The same matrix with the heave row gives the velocity analysis (ω and the origin's velocity per
// mm of wheel travel). Fixed-size scratch, no allocation per position.

import { NEWTON_MAX_ITER, PARALLEL_TOL_RAD, TINY } from './constants';
import { SPRING_ROCKER, type CornerModel } from './corner';
import { axisCosSin, mul } from './pose';
import type { Driver } from './solve';
import { FAIL_CONTACT, FAIL_ROD0, OK, finishPose, springVelocity, type Branch, type Pose } from './solve';

/** Rod length error (mm) below which a rods pose counts as assembled. */
const RODS_TOL_MM = 1e-11;
/** A Newton step below this (mm, rotation over a 300 mm lever) ends the iteration (its square is far below RODS_TOL_MM). */
const SMALL_STEP = 1e-7;
/** Largest Newton step (mm, or mm-equivalent rotation over a 300 mm lever), against wild first steps. */
const MAX_NEWTON_STEP = 50;

const J = new Float64Array(36);
const g = new Float64Array(6);
const x = new Float64Array(6);
const R = new Float64Array(9);
const Rn = new Float64Array(9);
const dR = new Float64Array(9);
const O = new Float64Array(3);
const SIN_PARALLEL = Math.sin(PARALLEL_TOL_RAD);

/**
 * Solve A x = b in place for the 6×6 row-major A (Gaussian elimination with partial pivoting);
 * the answer replaces b. False when a pivot is below `tiny` (a singular pose: the links lock or
 * leave a freedom).
 */
export function solve6(A: Float64Array, b: Float64Array): boolean {
	for (let c = 0; c < 6; c++) {
		let piv = c;
		let best = Math.abs(A[6 * c + c]);
		for (let r = c + 1; r < 6; r++) {
			const v = Math.abs(A[6 * r + c]);
			if (v > best) {
				best = v;
				piv = r;
			}
		}
		if (!(best > 1e-12)) return false;
		if (piv !== c) {
			for (let k = 0; k < 6; k++) {
				const t = A[6 * c + k];
				A[6 * c + k] = A[6 * piv + k];
				A[6 * piv + k] = t;
			}
			const t = b[c];
			b[c] = b[piv];
			b[piv] = t;
		}
		const inv = 1 / A[6 * c + c];
		for (let r = c + 1; r < 6; r++) {
			const f = A[6 * r + c] * inv;
			if (f === 0) continue;
			for (let k = c; k < 6; k++) A[6 * r + k] -= f * A[6 * c + k];
			b[r] -= f * b[c];
		}
	}
	for (let r = 5; r >= 0; r--) {
		let s = b[r];
		for (let k = r + 1; k < 6; k++) s -= A[6 * r + k] * b[k];
		b[r] = s / A[6 * r + r];
	}
	return true;
}

/**
 * Rows 0–4 of J and g from the pose (O, R) at rack `rack` (mm); each row scaled by 1/(2 l) so the
 * residual reads as a length error in mm. Writes the rods' outer ends into p.rodOut. Returns the
 * largest |length error| (mm).
 */
function rodRows(m: CornerModel, rack: number, p: Pose): number {
	let worst = 0;
	const out = p.rodOut;
	for (let i = 0; i < 5; i++) {
		const bx = m.rodBody[3 * i];
		const by = m.rodBody[3 * i + 1];
		const bz = m.rodBody[3 * i + 2];
		const rx = R[0] * bx + R[1] * by + R[2] * bz;
		const ry = R[3] * bx + R[4] * by + R[5] * bz;
		const rz = R[6] * bx + R[7] * by + R[8] * bz;
		out[3 * i] = O[0] + rx;
		out[3 * i + 1] = O[1] + ry;
		out[3 * i + 2] = O[2] + rz;
		const dx = out[3 * i] - m.rodInner[3 * i];
		const dy = out[3 * i + 1] - m.rodInner[3 * i + 1] - (i === m.rackRod ? rack : 0);
		const dz = out[3 * i + 2] - m.rodInner[3 * i + 2];
		const l2 = m.rodLength2[i];
		const k = 1 / Math.sqrt(l2); // (|d|² − l²)/(2l): the length error to first order
		const err = 0.5 * (dx * dx + dy * dy + dz * dz - l2) * k;
		g[i] = err;
		if (Math.abs(err) > worst) worst = Math.abs(err);
		const o = 6 * i;
		J[o] = dx * k;
		J[o + 1] = dy * k;
		J[o + 2] = dz * k;
		J[o + 3] = (ry * dz - rz * dy) * k;
		J[o + 4] = (rz * dx - rx * dz) * k;
		J[o + 5] = (rx * dy - ry * dx) * k;
	}
	return worst;
}

/** Row 5 of J and g: the driver (wheel-centre height, or the contact point on a rolled ground). False when the wheel lies flat. */
function driverRow(m: CornerModel, d: Driver): boolean {
	if (d.mode === 0) {
		g[5] = O[2] - d.targetZ;
		J[30] = 0;
		J[31] = 0;
		J[32] = 1;
		J[33] = J[34] = J[35] = 0;
		return true;
	}
	const n = d.n;
	const a0 = m.spinAxis0;
	const ax = R[0] * a0[0] + R[1] * a0[1] + R[2] * a0[2];
	const ay = R[3] * a0[0] + R[4] * a0[1] + R[5] * a0[2];
	const az = R[6] * a0[0] + R[7] * a0[1] + R[8] * a0[2];
	const na = n[0] * ax + n[1] * ay + n[2] * az;
	const q = 1 - na * na;
	if (!(q > TINY)) return false;
	const sq = Math.sqrt(q);
	g[5] = n[0] * O[0] + n[1] * O[1] + n[2] * O[2] - m.tyreRadius * sq;
	const f = (m.tyreRadius * na) / sq; // d(−r √(1 − na²)) / d(na)
	J[30] = n[0];
	J[31] = n[1];
	J[32] = n[2];
	J[33] = f * (ay * n[2] - az * n[1]);
	J[34] = f * (az * n[0] - ax * n[2]);
	J[35] = f * (ax * n[1] - ay * n[0]);
	return true;
}

/** R ← Rot(φ) R for the small rotation vector φ = x[3..5] (Rodrigues' formula, pose.ts). */
function turn(): void {
	const t = Math.sqrt(x[3] * x[3] + x[4] * x[4] + x[5] * x[5]);
	if (t === 0) return;
	unit[0] = x[3] / t;
	unit[1] = x[4] / t;
	unit[2] = x[5] / t;
	cs[0] = Math.cos(t);
	cs[1] = Math.sin(t);
	axisCosSin(dR, unit, cs);
	mul(Rn, dR, R);
	R.set(Rn);
}

const unit = new Float64Array(3);
const cs = new Float64Array(2);

/** Load the pose q (origin offset from design and rotation, as Branch.q) into O and R, re-orthonormalising R. */
function load(m: CornerModel, q: Float64Array): void {
	O[0] = m.L0[0] + q[0];
	O[1] = m.L0[1] + q[1];
	O[2] = m.L0[2] + q[2];
	// Gram–Schmidt on the rows: a predicted rotation is only nearly orthonormal
	let a = Math.hypot(q[3], q[4], q[5]) || 1;
	R[0] = q[3] / a;
	R[1] = q[4] / a;
	R[2] = q[5] / a;
	const d = R[0] * q[6] + R[1] * q[7] + R[2] * q[8];
	R[3] = q[6] - d * R[0];
	R[4] = q[7] - d * R[1];
	R[5] = q[8] - d * R[2];
	a = Math.hypot(R[3], R[4], R[5]) || 1;
	R[3] /= a;
	R[4] /= a;
	R[5] /= a;
	R[6] = R[1] * R[5] - R[2] * R[4];
	R[7] = R[2] * R[3] - R[0] * R[5];
	R[8] = R[0] * R[4] - R[1] * R[3];
}

/** Store O and R into the pose q (as Branch.q). */
function store(m: CornerModel, q: Float64Array): void {
	q[0] = O[0] - m.L0[0];
	q[1] = O[1] - m.L0[1];
	q[2] = O[2] - m.L0[2];
	for (let i = 0; i < 9; i++) q[3 + i] = R[i];
}

/** Newton from the pose in `start`; OK, or FAIL_CONTACT / -1 (did not converge or singular). */
function newton(m: CornerModel, d: Driver, p: Pose, start: Float64Array): number {
	load(m, start);
	for (let iter = 0; iter < NEWTON_MAX_ITER; iter++) {
		const worst = rodRows(m, p.rack, p);
		if (!driverRow(m, d)) return FAIL_CONTACT;
		if (worst < RODS_TOL_MM && Math.abs(g[5]) < RODS_TOL_MM) return OK;
		for (let i = 0; i < 6; i++) x[i] = -g[i];
		if (!solve6(J, x)) return -1;
		const size = Math.sqrt(x[0] * x[0] + x[1] * x[1] + x[2] * x[2]) + 300 * Math.sqrt(x[3] * x[3] + x[4] * x[4] + x[5] * x[5]);
		if (size > MAX_NEWTON_STEP) {
			const f = MAX_NEWTON_STEP / size;
			for (let i = 0; i < 6; i++) x[i] *= f;
		}
		O[0] += x[0];
		O[1] += x[1];
		O[2] += x[2];
		turn();
		// Newton converges quadratically: after a step this small the error left is about its square over a link
		// length (below 1e-15 mm), so the pose is taken without evaluating the rows once more
		if (size < SMALL_STEP && worst < 1e-4) return OK;
	}
	return -1;
}

/**
 * Solve the rods chain at the walker's position (p.rack, driver d) from the predicted pose
 * p.guessQ, else from the last solved pose ref.q; fill the pose, its velocity per mm of heave
 * and the rocker. Returns OK or the code of the link that cannot be assembled.
 */
export function solveRods(m: CornerModel, ref: Branch, d: Driver, p: Pose): number {
	let code = newton(m, d, p, p.guessQ);
	if (code !== OK && code !== FAIL_CONTACT) code = newton(m, d, p, ref.q);
	if (code === FAIL_CONTACT) return code;
	if (code !== OK) return diagnose(m, d, p, ref);
	store(m, p.branch.q);
	return finish(m, ref, p);
}

/** Pose, velocity (per mm of heave, rack held) and rocker from the solved O, R. */
function finish(m: CornerModel, ref: Branch, p: Pose): number {
	p.L.set(O);
	p.R.set(R);
	p.W.set(O); // the origin is the wheel centre
	const a0 = m.spinAxis0;
	p.a[0] = R[0] * a0[0] + R[1] * a0[1] + R[2] * a0[2];
	p.a[1] = R[3] * a0[0] + R[4] * a0[1] + R[5] * a0[2];
	p.a[2] = R[6] * a0[0] + R[7] * a0[1] + R[8] * a0[2];
	p.velocityOk = velocity(m, p);
	p.velocityFail = FAIL_ROD0;
	if (m.springOn !== 0 && m.springOn !== SPRING_ROCKER) {
		const b = m.bodySpring;
		for (let i = 0; i < 3; i++) p.B[i] = O[i] + R[3 * i] * b[0] + R[3 * i + 1] * b[1] + R[3 * i + 2] * b[2];
		const sx = p.B[0] - m.springChassis[0];
		const sy = p.B[1] - m.springChassis[1];
		const sz = p.B[2] - m.springChassis[2];
		p.springLength = Math.sqrt(sx * sx + sy * sy + sz * sz);
		if (p.velocityOk) springVelocity(m, p);
	}
	return finishPose(m, ref, p);
}

/** ω and the origin's velocity per mm of heave: the rods' rows with the heave row, J ξ = e₆. */
function velocity(m: CornerModel, p: Pose): boolean {
	rodRows(m, p.rack, p);
	J[30] = J[31] = 0;
	J[32] = 1;
	J[33] = J[34] = J[35] = 0;
	x[0] = x[1] = x[2] = x[3] = x[4] = 0;
	x[5] = 1;
	if (!solve6(J, x)) return false;
	for (let i = 0; i < 3; i++) {
		p.dL[i] = x[i];
		p.dW[i] = x[i];
		p.omega[i] = x[3 + i];
	}
	const w = p.omega;
	p.da[0] = w[1] * p.a[2] - w[2] * p.a[1];
	p.da[1] = w[2] * p.a[0] - w[0] * p.a[2];
	p.da[2] = w[0] * p.a[1] - w[1] * p.a[0];
	return true;
}

/**
 * Name the rod that stops a position Newton could not reach: from the last solved pose, a damped
 * least-squares walk (Levenberg–Marquardt on the same rows, the driver held hardest) settles
 * where the links come closest to assembling; the rod left with the largest length error is the
 * one that cannot reach.
 */
function diagnose(m: CornerModel, d: Driver, p: Pose, ref: Branch): number {
	load(m, ref.q);
	let lambda = 1e-3;
	for (let iter = 0; iter < 200; iter++) {
		rodRows(m, p.rack, p);
		if (!driverRow(m, d)) return FAIL_CONTACT;
		// normal equations (JᵀWJ + λ I) x = −JᵀW g, driver weighted 1e3
		for (let i = 0; i < 6; i++) {
			let bi = 0;
			for (let r = 0; r < 6; r++) bi -= J[6 * r + i] * g[r] * (r === 5 ? 1e6 : 1);
			x[i] = bi;
			for (let j = 0; j < 6; j++) {
				let s = 0;
				for (let r = 0; r < 6; r++) s += J[6 * r + i] * J[6 * r + j] * (r === 5 ? 1e6 : 1);
				NJ[6 * i + j] = s + (i === j ? lambda : 0);
			}
		}
		if (!solve6(NJ, x)) break;
		O[0] += x[0];
		O[1] += x[1];
		O[2] += x[2];
		turn();
	}
	rodRows(m, p.rack, p);
	let worst = 0;
	for (let i = 1; i < 5; i++) if (Math.abs(g[i]) > Math.abs(g[worst])) worst = i;
	return FAIL_ROD0 + worst;
}

const NJ = new Float64Array(36);

/**
 * The virtual steering axis (contract: multi_link): AL the midpoint of the shortest segment between
 * the lines of the two lower links at this pose, AU the same for the upper pair. False when a pair is parallel.
 */
export function virtualAxis(m: CornerModel, p: Pose): boolean {
	return closest(m, p, m.axisRods[0], m.axisRods[1], p.AL) && closest(m, p, m.axisRods[2], m.axisRods[3], p.AU);
}

/** Midpoint of the shortest segment between the lines of rods i and j (inner → outer) into out. */
function closest(m: CornerModel, p: Pose, i: number, j: number, out: Float64Array): boolean {
	const P = m.rodInner;
	const Q = p.rodOut;
	const rackI = i === m.rackRod ? p.rack : 0;
	const rackJ = j === m.rackRod ? p.rack : 0;
	const ux = Q[3 * i] - P[3 * i];
	const uy = Q[3 * i + 1] - P[3 * i + 1] - rackI;
	const uz = Q[3 * i + 2] - P[3 * i + 2];
	const vx = Q[3 * j] - P[3 * j];
	const vy = Q[3 * j + 1] - P[3 * j + 1] - rackJ;
	const vz = Q[3 * j + 2] - P[3 * j + 2];
	const wx = P[3 * i] - P[3 * j];
	const wy = P[3 * i + 1] + rackI - P[3 * j + 1] - rackJ;
	const wz = P[3 * i + 2] - P[3 * j + 2];
	const a = ux * ux + uy * uy + uz * uz;
	const b = ux * vx + uy * vy + uz * vz;
	const c = vx * vx + vy * vy + vz * vz;
	const d = ux * wx + uy * wy + uz * wz;
	const e = vx * wx + vy * wy + vz * wz;
	const den = a * c - b * b; // = |u × v|²
	if (!(den > SIN_PARALLEL * SIN_PARALLEL * a * c)) return false;
	const s = (b * e - c * d) / den;
	const t = (a * e - b * d) / den;
	out[0] = 0.5 * (P[3 * i] + s * ux + P[3 * j] + t * vx);
	out[1] = 0.5 * (P[3 * i + 1] + rackI + s * uy + P[3 * j + 1] + rackJ + t * vy);
	out[2] = 0.5 * (P[3 * i + 2] + s * uz + P[3 * j + 2] + t * vz);
	return true;
}
