// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians.
// Position solution of one corner. The closed-form chains run in the driving arm's angle θ:
// arms: ball joint on its circle → second ball joint on circle ∩ sphere → upright turned about
// the steering axis until the closing rod fits; slider: the strut's point at the top mount
// instead of the second ball joint; revolute: the upright turns with the arm. A sweep's driving
// condition is then one equation in θ, solved by Newton's method with the analytic derivative
// from a velocity analysis. The rods chain (five-link) is solved in rods.ts. The rocker, on any
// chain, follows in closed form (rocker.ts).

import { ASSEMBLY_SLACK, DIAGNOSE_STEP_RAD, DIAGNOSE_STEPS, DRIVER_SLOPE_MIN, LINEAR_FINISH_MM, NEWTON_MAX_ITER, TINY } from './constants';
import {
	AXIS_NONE,
	AXIS_VIRTUAL,
	CHAIN_REVOLUTE,
	CHAIN_RODS,
	CHAIN_SLIDER,
	SPRING_LOWER,
	SPRING_NONE,
	SPRING_ROCKER,
	SPRING_UPPER,
	SPRING_UPRIGHT,
	contactPoint,
	type ArmCircle,
	type CornerModel
} from './corner';
import { axisCosSin, mat3, minimalRotation, mul, place, rotate } from './pose';
import { placeRocker, rockerVelocity } from './rocker';
import { solveRods, virtualAxis } from './rods';
import { cross, vec3 } from './vec3';

/** Result codes of a pose evaluation (0 = assembled). */
export const OK = 0;
export const FAIL_UPPER = 1;
export const FAIL_TIE_ROD = 2;
export const FAIL_STRUT = 3;
export const FAIL_LOWER = 4;
export const FAIL_CONTACT = 5;
export const FAIL_ROCKER = 6;
/** The rods chain's rod i fails with code FAIL_ROD0 + i; the model's failNames name every code. */
export const FAIL_ROD0 = 7;

/** Branch values of an assembled pose: the continuation carries them from one position to the next. */
export class Branch {
	/** lower-arm angle from design, rad */
	theta = 0;
	/** cosine and sine of the upper-arm angle from design (double wishbone) */
	phiC = 1;
	phiS = 0;
	/** cosine and sine of the rotation about the steering axis */
	psiC = 1;
	psiS = 0;
	/** strut: distance along the strut axis from strut.lower to the point at the top mount, mm */
	tau = 0;
	/** cosine and sine of the rocker's angle from design */
	rockerC = 1;
	rockerS = 0;
	/** rods chain: the upright's origin offset from design (mm) and its rotation from design, row-major */
	readonly q = new Float64Array(12);

	constructor() {
		this.q[3] = this.q[7] = this.q[11] = 1;
	}
}

/** Copy branch b into a. */
export function setBranch(a: Branch, b: Branch): void {
	setAngles(a, b);
	copy12(a.q, b.q);
}

/** Copy branch b's angles into a (the closed-form chains' whole state; the rods chain's pose is not copied). */
export function setAngles(a: Branch, b: Branch): void {
	a.theta = b.theta;
	a.phiC = b.phiC;
	a.phiS = b.phiS;
	a.psiC = b.psiC;
	a.psiS = b.psiS;
	a.tau = b.tau;
	a.rockerC = b.rockerC;
	a.rockerS = b.rockerS;
}

/** a = b for the 12 numbers of a rods pose (a loop: cheaper than TypedArray.set for so few). */
export function copy12(a: Float64Array, b: Float64Array): void {
	for (let i = 0; i < 12; i++) a[i] = b[i];
}

/** A solved pose and its velocity per unit θ: scratch buffers, reused for every position. */
export class Pose {
	readonly branch = new Branch();
	/** rack travel along +y, mm */
	rack = 0;
	/** [cos θ, sin θ] */
	readonly csTheta = new Float64Array(2);
	readonly L = vec3();
	/** second steering-axis point: upper.outer, or strut.top */
	readonly K = vec3();
	readonly R = mat3();
	readonly T = vec3();
	readonly W = vec3();
	/** unit spin axis, outboard */
	readonly a = vec3();
	readonly S = vec3();
	/** the unit strut axis (strut only) */
	readonly d = vec3();
	readonly B = vec3();
	springLength = 0;
	/** velocities per unit θ (mm/rad, 1/rad for ω and da) */
	readonly dL = vec3();
	readonly omega = vec3();
	readonly dW = vec3();
	readonly da = vec3();
	readonly dB = vec3();
	readonly dK = vec3();
	readonly dd = vec3();
	dPhi = 0;
	dSpringLength = 0;
	/** steering-axis ends used by the measures (lower, upper); axisOk false when the kind has none or it is undefined here */
	readonly AL = vec3();
	readonly AU = vec3();
	axisOk = false;
	/** rocker: rod outer end, rod end and spring end (mm), the angle from design (rad) and its rate per unit θ */
	readonly rodOuter = vec3();
	readonly dRodOuter = vec3();
	readonly rodEnd = vec3();
	readonly springEnd = vec3();
	rockerAngle = 0;
	dRocker = 0;
	/** rods chain: the predicted start of Newton (origin and rotation, as Branch.q) */
	readonly guessQ = new Float64Array(12);
	/** the same pose evaluated exactly after the linear finish (for the point list), or null: read this one */
	exact: Pose | null = null;
	/** rods chain: the rods' outer ends at this pose (5 × 3, mm) */
	readonly rodOut = new Float64Array(15);
	/** false at a toggle position where the velocity analysis is singular */
	velocityOk = false;
	/** the link at the toggle when velocityOk is false (FAIL_* code) */
	velocityFail = 0;
	/** solver inputs kept here so that no number is boxed on a call: start angle, last step (rad) */
	guess = 0;
	step = 0;
	/** keep every point exact (tie-rod end, strut.lower, spring.body), not only those the measures use */
	allPoints = true;
}

// Module-level scratch: the solver is synchronous, so one set serves every call.
const tmpA = vec3();
const tmpB = vec3();
const tmpC = vec3();
const tmpD = vec3();
const vhat = vec3();
const uhat = vec3();
const rMin = mat3();
const rPsi = mat3();
const tMin = vec3();
/** circleRoot's input [A, B, C, pc, ps] and output [cos x, sin x] (scratch, shared with rocker.ts). */
export const root = new Float64Array(2);
export const rootIn = new Float64Array(5);
const csPhi = new Float64Array(2);

/** out = the arm point on circle `arm` at the angle whose [cosine, sine] are cs[0], cs[1]. */
export function onCircle(out: Float64Array, arm: ArmCircle, cs: Float64Array): void {
	const c = cs[0];
	const s = cs[1];
	out[0] = arm.c[0] + c * arm.r[0] + s * arm.s[0];
	out[1] = arm.c[1] + c * arm.r[1] + s * arm.s[1];
	out[2] = arm.c[2] + c * arm.r[2] + s * arm.s[2];
}

/**
 * Solve A cos x + B sin x = C on the unit circle without trigonometry, taking the root whose
 * (cos, sin) is nearest (pc, ps); reads rootIn = [A, B, C, pc, ps] (scratch, so no number is
 * boxed on the call), writes root = [cos x, sin x]. False when no root exists (link cannot reach).
 */
export function circleRoot(): boolean {
	const A = rootIn[0];
	const B = rootIn[1];
	const C = rootIn[2];
	const pc = rootIn[3];
	const ps = rootIn[4];
	const M2 = A * A + B * B;
	if (!(M2 > TINY * TINY)) return false;
	let D = M2 - C * C;
	if (D < 0) {
		if (D < -2 * ASSEMBLY_SLACK * M2) return false;
		D = 0;
	}
	const r = Math.sqrt(D);
	const k = 1 / M2;
	const c1 = (A * C - B * r) * k;
	const s1 = (B * C + A * r) * k;
	const c2 = (A * C + B * r) * k;
	const s2 = (B * C - A * r) * k;
	const first = c1 * pc + s1 * ps >= c2 * pc + s2 * ps;
	root[0] = first ? c1 : c2;
	root[1] = first ? s1 : s2;
	return true;
}

/** Upper ball joint on its circle at distance kingpinLength from L (double wishbone). */
function placeUpper(m: CornerModel, ref: Branch, p: Pose): number {
	const u = m.upper;
	const Dx = u.c[0] - p.L[0];
	const Dy = u.c[1] - p.L[1];
	const Dz = u.c[2] - p.L[2];
	const rr = m.upperRadius2;
	const A = 2 * (Dx * u.r[0] + Dy * u.r[1] + Dz * u.r[2]);
	const B = 2 * (Dx * u.s[0] + Dy * u.s[1] + Dz * u.s[2]);
	const C = m.kingpinLength * m.kingpinLength - (Dx * Dx + Dy * Dy + Dz * Dz) - rr;
	rootIn[0] = A;
	rootIn[1] = B;
	rootIn[2] = C;
	rootIn[3] = ref.phiC;
	rootIn[4] = ref.phiS;
	if (!circleRoot()) return FAIL_UPPER;
	p.branch.phiC = root[0];
	p.branch.phiS = root[1];
	onCircle(p.K, u, root);
	return OK;
}

/** Strut: the body point of the strut axis that sits at the top mount; writes uhat. */
function placeStrut(m: CornerModel, ref: Branch, p: Pose): number {
	const P = m.strutTop;
	const rx = P[0] - p.L[0];
	const ry = P[1] - p.L[1];
	const rz = P[2] - p.L[2];
	const rho2 = rx * rx + ry * ry + rz * rz;
	const g = m.bodySL;
	const gd = (g[0] * m.strutAxis0[0] + g[1] * m.strutAxis0[1] + g[2] * m.strutAxis0[2]);
	const disc = gd * gd - (g[0] * g[0] + g[1] * g[1] + g[2] * g[2]) + rho2;
	if (disc < 0) return FAIL_STRUT;
	const sq = Math.sqrt(disc);
	const t1 = -gd + sq;
	const t2 = -gd - sq;
	const tau = Math.abs(t1 - ref.tau) <= Math.abs(t2 - ref.tau) ? t1 : t2;
	p.branch.tau = tau;
	tmpA[0] = g[0] + tau * m.strutAxis0[0];
	tmpA[1] = g[1] + tau * m.strutAxis0[1];
	tmpA[2] = g[2] + tau * m.strutAxis0[2];
	const l = Math.sqrt(tmpA[0] * tmpA[0] + tmpA[1] * tmpA[1] + tmpA[2] * tmpA[2]);
	if (!(l > TINY)) return FAIL_STRUT;
	uhat[0] = tmpA[0] / l;
	uhat[1] = tmpA[1] / l;
	uhat[2] = tmpA[2] / l;
	p.K[0] = P[0];
	p.K[1] = P[1];
	p.K[2] = P[2];
	return OK;
}

/** Turn the upright about the steering axis until the tie rod fits; writes p.R. */
function closeTieRod(m: CornerModel, ref: Branch, p: Pose): number {
	rotate(tMin, rMin, m.bodyT);
	const ac = (tMin[0] * vhat[0] + tMin[1] * vhat[1] + tMin[2] * vhat[2]);
	const rx = tMin[0] - ac * vhat[0];
	const ry = tMin[1] - ac * vhat[1];
	const rz = tMin[2] - ac * vhat[2];
	const sx = vhat[1] * rz - vhat[2] * ry;
	const sy = vhat[2] * rx - vhat[0] * rz;
	const sz = vhat[0] * ry - vhat[1] * rx;
	const Dx = p.L[0] + ac * vhat[0] - p.S[0];
	const Dy = p.L[1] + ac * vhat[1] - p.S[1];
	const Dz = p.L[2] + ac * vhat[2] - p.S[2];
	const A = 2 * (Dx * rx + Dy * ry + Dz * rz);
	const B = 2 * (Dx * sx + Dy * sy + Dz * sz);
	const l = m.tieRodLength;
	const C = l * l - (Dx * Dx + Dy * Dy + Dz * Dz) - (rx * rx + ry * ry + rz * rz);
	rootIn[0] = A;
	rootIn[1] = B;
	rootIn[2] = C;
	rootIn[3] = ref.psiC;
	rootIn[4] = ref.psiS;
	if (!circleRoot()) return FAIL_TIE_ROD;
	p.branch.psiC = root[0];
	p.branch.psiS = root[1];
	axisCosSin(rPsi, vhat, root);
	mul(p.R, rPsi, rMin);
	return OK;
}

/**
 * Assemble the corner at lower-arm angle `theta` (rad) and rack travel `rack` (mm), choosing
 * each branch nearest to `ref`; fills `p` (positions and velocities). Returns OK or a FAIL code.
 */
export function assemble(m: CornerModel, ref: Branch, theta: number, rack: number, p: Pose): number {
	p.branch.theta = theta;
	p.rack = rack;
	return evalPose(m, ref, p);
}

/** As `assemble`, with θ (rad) and rack (mm) already in p.branch.theta and p.rack (hot path). */
export function evalPose(m: CornerModel, ref: Branch, p: Pose): number {
	if (m.chain === CHAIN_REVOLUTE) return evalRevolute(m, ref, p);
	const theta = p.branch.theta;
	const rack = p.rack;
	p.csTheta[0] = Math.cos(theta);
	p.csTheta[1] = Math.sin(theta);
	onCircle(p.L, m.lower, p.csTheta);
	p.S[0] = m.steerInner0[0];
	p.S[1] = m.steerInner0[1] + rack;
	p.S[2] = m.steerInner0[2];
	const strut = m.chain === CHAIN_SLIDER;
	const code = strut ? placeStrut(m, ref, p) : placeUpper(m, ref, p);
	if (code !== OK) return code;
	if (!strut) {
		uhat[0] = m.bodyUnitU[0];
		uhat[1] = m.bodyUnitU[1];
		uhat[2] = m.bodyUnitU[2];
	}
	vhat[0] = p.K[0] - p.L[0];
	vhat[1] = p.K[1] - p.L[1];
	vhat[2] = p.K[2] - p.L[2];
	const vl = Math.sqrt(vhat[0] * vhat[0] + vhat[1] * vhat[1] + vhat[2] * vhat[2]);
	if (!(vl > TINY)) return strut ? FAIL_STRUT : FAIL_UPPER;
	const iv = 1 / vl;
	vhat[0] *= iv;
	vhat[1] *= iv;
	vhat[2] *= iv;
	if (!minimalRotation(rMin, uhat, vhat)) return strut ? FAIL_STRUT : FAIL_UPPER;
	const tie = closeTieRod(m, ref, p);
	if (tie !== OK) return tie;
	placeBodies(m, p);
	velocity(m, p);
	return finishPose(m, ref, p);
}

/** The revolute chain: the upright turns with the arm about its pivot axis by θ (origin on the axis). */
function evalRevolute(m: CornerModel, ref: Branch, p: Pose): number {
	const theta = p.branch.theta;
	p.csTheta[0] = Math.cos(theta);
	p.csTheta[1] = Math.sin(theta);
	const lo = m.lower;
	p.L[0] = m.L0[0];
	p.L[1] = m.L0[1];
	p.L[2] = m.L0[2];
	axisCosSin(p.R, lo.e, p.csTheta);
	p.S[0] = p.S[1] = p.S[2] = 0;
	placeBodies(m, p);
	p.dL[0] = p.dL[1] = p.dL[2] = 0;
	p.omega[0] = lo.e[0];
	p.omega[1] = lo.e[1];
	p.omega[2] = lo.e[2];
	bodyVelocity(p, p.W, p.dW);
	cross(p.da, p.omega, p.a);
	springVelocity(m, p);
	p.velocityOk = true;
	return finishPose(m, ref, p);
}

/** After any chain: the rocker (and the spring it works), then the steering-axis ends. */
export function finishPose(m: CornerModel, ref: Branch, p: Pose): number {
	if (m.rocker) {
		if (!placeRocker(m, ref, p)) return FAIL_ROCKER;
		if (p.velocityOk && !rockerVelocity(m, p)) {
			p.velocityOk = false;
			p.velocityFail = FAIL_ROCKER;
		}
	}
	steeringAxis(m, p);
	return OK;
}

/** The steering axis ends AL, AU of the measures: the chain's two axis points, the virtual axis, or none. */
function steeringAxis(m: CornerModel, p: Pose): void {
	if (m.axis === AXIS_NONE) {
		p.axisOk = false;
		return;
	}
	if (m.axis === AXIS_VIRTUAL) {
		p.axisOk = virtualAxis(m, p);
		return;
	}
	p.axisOk = true;
	for (let i = 0; i < 3; i++) {
		p.AL[i] = p.L[i];
		p.AU[i] = p.K[i];
	}
}

/** Upright and spring points from the solved rotation. */
function placeBodies(m: CornerModel, p: Pose): void {
	place(p.T, p.R, m.bodyT, p.L);
	place(p.W, p.R, m.bodyW, p.L);
	rotate(p.a, p.R, m.spinAxis0);
	if (m.chain === CHAIN_SLIDER) rotate(p.d, p.R, m.strutAxis0);
	if (m.springOn === SPRING_NONE || m.springOn === SPRING_ROCKER) return;
	if (m.springOn === SPRING_UPRIGHT) place(p.B, p.R, m.bodySpring, p.L);
	else if (m.springOn === SPRING_LOWER) onCircle(p.B, m.springBody, p.csTheta);
	else {
		csPhi[0] = p.branch.phiC;
		csPhi[1] = p.branch.phiS;
		onCircle(p.B, m.springBody, csPhi);
	}
	const bx = p.B[0] - m.springChassis[0];
	const by = p.B[1] - m.springChassis[1];
	const bz = p.B[2] - m.springChassis[2];
	p.springLength = Math.sqrt(bx * bx + by * by + bz * bz);
}

/**
 * Velocity analysis per unit θ: dL = e × (L − c); the upright's angular velocity ω is the part
 * fixed by the second steering-axis point plus a turn λ about the axis set by the tie rod.
 */
function velocity(m: CornerModel, p: Pose): void {
	p.velocityOk = false;
	p.velocityFail = m.chain === CHAIN_SLIDER ? FAIL_STRUT : FAIL_UPPER;
	const lo = m.lower;
	cross(p.dL, lo.e, sub3(tmpA, p.L, lo.c));
	const w = tmpB; // velocity of the steering-axis point K relative to L
	if (m.chain === CHAIN_SLIDER) {
		// the upright point at the top mount slides along the strut axis: σ d − dL ⊥ (K − L)
		sub3(tmpC, p.K, p.L);
		const dv = (p.d[0] * tmpC[0] + p.d[1] * tmpC[1] + p.d[2] * tmpC[2]);
		if (Math.abs(dv) < TINY) return;
		const sigma = (p.dL[0] * tmpC[0] + p.dL[1] * tmpC[1] + p.dL[2] * tmpC[2]) / dv;
		for (let i = 0; i < 3; i++) w[i] = sigma * p.d[i] - p.dL[i];
		p.dK[0] = p.dK[1] = p.dK[2] = 0;
	} else {
		const up = m.upper;
		cross(tmpC, up.e, sub3(tmpA, p.K, up.c)); // dU per unit φ
		sub3(tmpD, p.K, p.L);
		const den = (tmpD[0] * tmpC[0] + tmpD[1] * tmpC[1] + tmpD[2] * tmpC[2]);
		if (Math.abs(den) < TINY) return;
		p.dPhi = (tmpD[0] * p.dL[0] + tmpD[1] * p.dL[1] + tmpD[2] * p.dL[2]) / den;
		for (let i = 0; i < 3; i++) {
			p.dK[i] = p.dPhi * tmpC[i];
			w[i] = p.dK[i] - p.dL[i];
		}
	}
	p.velocityFail = FAIL_TIE_ROD;
	if (!turnAboutAxis(p, w)) return;
	bodyVelocity(p, p.W, p.dW);
	cross(p.da, p.omega, p.a);
	if (m.chain === CHAIN_SLIDER) cross(p.dd, p.omega, p.d);
	springVelocity(m, p);
	p.velocityOk = true;
}

/** out = velocity of upright point q: dL + ω × (q − L). */
export function bodyVelocity(p: Pose, q: Float64Array, out: Float64Array): void {
	const x = q[0] - p.L[0];
	const y = q[1] - p.L[1];
	const z = q[2] - p.L[2];
	const w = p.omega;
	out[0] = p.dL[0] + w[1] * z - w[2] * y;
	out[1] = p.dL[1] + w[2] * x - w[0] * z;
	out[2] = p.dL[2] + w[0] * y - w[1] * x;
}

/** ω = (v × w)/|v|² + λ v̂, λ from the tie rod (T − S)·dT = 0; false at a toggle. */
function turnAboutAxis(p: Pose, w: Float64Array): boolean {
	sub3(tmpC, p.K, p.L);
	const ivv = 1 / (tmpC[0] * tmpC[0] + tmpC[1] * tmpC[1] + tmpC[2] * tmpC[2]);
	cross(p.omega, tmpC, w);
	for (let i = 0; i < 3; i++) p.omega[i] *= ivv;
	const TL = sub3(tmpD, p.T, p.L);
	cross(tmpA, p.omega, TL);
	for (let i = 0; i < 3; i++) tmpA[i] += p.dL[i];
	const ts0 = p.T[0] - p.S[0];
	const ts1 = p.T[1] - p.S[1];
	const ts2 = p.T[2] - p.S[2];
	const num = ts0 * tmpA[0] + ts1 * tmpA[1] + ts2 * tmpA[2];
	cross(tmpA, vhat, TL);
	const den = ts0 * tmpA[0] + ts1 * tmpA[1] + ts2 * tmpA[2];
	if (Math.abs(den) < TINY) return false;
	const lambda = -num / den;
	for (let i = 0; i < 3; i++) p.omega[i] += lambda * vhat[i];
	return true;
}

/** Rate of change of the spring length per unit θ (mm/rad). */
export function springVelocity(m: CornerModel, p: Pose): void {
	if (m.springOn === SPRING_NONE || m.springOn === SPRING_ROCKER) return;
	if (m.springOn === SPRING_UPRIGHT) {
		bodyVelocity(p, p.B, p.dB);
	} else {
		const arm = m.springOn === SPRING_LOWER ? m.lower : m.upper;
		const rate = m.springOn === SPRING_UPPER ? p.dPhi : 1;
		cross(p.dB, arm.e, sub3(tmpC, p.B, arm.c));
		for (let i = 0; i < 3; i++) p.dB[i] *= rate;
	}
	sub3(tmpC, p.B, m.springChassis);
	p.dSpringLength = p.springLength > TINY ? (tmpC[0] * p.dB[0] + tmpC[1] * p.dB[1] + tmpC[2] * p.dB[2]) / p.springLength : 0;
}

/** out = a − b (local copy to keep this file's hot path self-contained). */
export function sub3(out: Float64Array, a: Float64Array, b: Float64Array): Float64Array {
	out[0] = a[0] - b[0];
	out[1] = a[1] - b[1];
	out[2] = a[2] - b[2];
	return out;
}

/** What a sweep holds fixed: one scalar equation f(θ) = 0 (mm). */
export interface Driver {
	/** 0: wheel-centre z = target; 1: contact point on the ground of normal n */
	mode: number;
	/** target wheel-centre z, mm (mode 0) */
	targetZ: number;
	/** unit ground normal in chassis axes (mode 1) */
	n: Float64Array;
}

/** f(θ) and f'(θ) of the driver at pose p; writes residual[0], residual[1]. */
export function driverResidual(m: CornerModel, d: Driver, p: Pose, out: Float64Array): boolean {
	if (d.mode === 0) {
		out[0] = p.W[2] - d.targetZ;
		out[1] = p.dW[2];
		return true;
	}
	const n = d.n;
	const na = (n[0] * p.a[0] + n[1] * p.a[1] + n[2] * p.a[2]);
	const q = 1 - na * na;
	if (!(q > TINY)) return false;
	const sq = Math.sqrt(q);
	out[0] = (n[0] * p.W[0] + n[1] * p.W[1] + n[2] * p.W[2]) - m.tyreRadius * sq;
	out[1] = (n[0] * p.dW[0] + n[1] * p.dW[1] + n[2] * p.dW[2]) + (m.tyreRadius * na * (n[0] * p.da[0] + n[1] * p.da[1] + n[2] * p.da[2])) / sq;
	return true;
}

const residual = new Float64Array(2);

/**
 * Newton on θ from p.guess (rad), rack p.rack (mm), until the driver holds, branches nearest `ref`; the solved
 * pose is left in `p`. Once the residual is below LINEAR_FINISH_MM the last Newton step is
 * applied to the whole pose through its velocity (error O(step²), below 1e-10 mm), so a
 * well-predicted position costs one evaluation. Returns OK or the FAIL code of the link.
 */
export function solvePosition(m: CornerModel, ref: Branch, d: Driver, p: Pose): number {
	p.exact = null;
	if (m.chain === CHAIN_RODS) return solveRods(m, ref, d, p);
	let theta = p.guess;
	let good = ref.theta;
	let lastFail = FAIL_LOWER;
	for (let iter = 0; iter < NEWTON_MAX_ITER; iter++) {
		p.branch.theta = theta;
		const code = evalPose(m, ref, p);
		if (code !== OK || !p.velocityOk || !driverResidual(m, d, p, residual)) {
			lastFail = code !== OK ? code : p.velocityOk ? FAIL_CONTACT : p.velocityFail;
			theta = 0.5 * (theta + good); // back off toward the last assembled angle
			continue;
		}
		if (Math.abs(residual[1]) < DRIVER_SLOPE_MIN) return lastFail;
		const dTheta = -residual[0] / residual[1];
		if (Math.abs(residual[0]) < LINEAR_FINISH_MM) {
			p.step = dTheta;
			advance(m, p);
			return OK;
		}
		good = theta;
		theta += dTheta;
	}
	return diagnose(m, ref, d, p, lastFail);
}

/**
 * Name the link that stops a position Newton could not reach, independently of Newton's path:
 * walk θ from the last solved angle toward the target until a link fails to assemble (that
 * link) or the driver turns back (the lower arm has reached the end of its travel).
 */
function diagnose(m: CornerModel, ref: Branch, d: Driver, p: Pose, fallback: number): number {
	p.branch.theta = ref.theta;
	let code = evalPose(m, ref, p);
	if (code !== OK) return code;
	if (!p.velocityOk) return p.velocityFail;
	if (!driverResidual(m, d, p, residual) || residual[1] === 0) return fallback;
	const dir = -Math.sign(residual[0] * residual[1]);
	const slope0 = residual[1];
	for (let k = 1; k <= DIAGNOSE_STEPS; k++) {
		p.branch.theta = ref.theta + dir * k * DIAGNOSE_STEP_RAD;
		code = evalPose(m, ref, p);
		if (code !== OK) return code;
		if (!p.velocityOk) return p.velocityFail;
		if (!driverResidual(m, d, p, residual) || residual[1] * slope0 <= 0) return FAIL_LOWER;
	}
	return fallback;
}

/**
 * Move pose p by p.step (rad of θ) along its velocity: the final Newton step, to first order.
 * When every point is wanted (the per-sample point list) the pose is evaluated anew instead, so
 * each point is exact; otherwise only what the measures read is moved.
 */
function advance(m: CornerModel, p: Pose): void {
	const h = p.step;
	p.branch.theta += h;
	p.exact = null;
	if (p.allPoints) {
		// the branch values just found are the nearest reference for the re-evaluation
		setBranch(exactRef, p.branch);
		exactPose.branch.theta = p.branch.theta;
		exactPose.rack = p.rack;
		if (evalPose(m, exactRef, exactPose) === OK) p.exact = exactPose;
	}
	nudge(p.L, p.dL, p);
	nudge(p.K, p.dK, p);
	nudge(p.W, p.dW, p);
	nudge(p.a, p.da, p);
	renormalize(p.a);
	p.springLength += h * p.dSpringLength;
	p.rockerAngle += h * p.dRocker;
	if (m.chain === CHAIN_SLIDER) {
		nudge(p.d, p.dd, p);
		renormalize(p.d);
	}
	if (m.axis === AXIS_VIRTUAL) return;
	for (let i = 0; i < 3; i++) {
		p.AL[i] = p.L[i];
		p.AU[i] = p.K[i];
	}
}

const exactRef = new Branch();
const exactPose = new Pose();

/** v += p.step · dv (mm, or unitless for directions); the step is read from p so no number is boxed. */
function nudge(v: Float64Array, dv: Float64Array, p: Pose): void {
	const h = p.step;
	v[0] += h * dv[0];
	v[1] += h * dv[1];
	v[2] += h * dv[2];
}

/** Scale unit vector v back to length 1 after a first-order update. */
function renormalize(v: Float64Array): void {
	const l = Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
	v[0] /= l;
	v[1] /= l;
	v[2] /= l;
}

/** Contact point of pose p against the ground of unit normal n (mm); false when the wheel lies flat. */
export function poseContact(m: CornerModel, p: Pose, n: Float64Array, out: Float64Array): boolean {
	return contactPoint(out, p.W, p.a, n, m);
}
