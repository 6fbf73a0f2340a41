// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians inside
// (roll positions are kept in degrees, as the user gives them, and converted here).
// Sweeps: the step grid, and continuation outward from design in both directions, so the
// solution follows one assembly branch; each solved position is written into flat buffers.

import { GRID_DECIMALS, GRID_TOL, MAX_SAMPLES, MAX_STEP_MM, MAX_STEP_ROLL_RAD, RAD } from './constants';
import { B_CHASSIS, B_LOWER, B_RACK, B_ROCKER, B_UPPER, CHAIN_RODS, type CornerModel } from './corner';
import { computeMeasures, N_FIELDS, SWEEP_HEAVE, SWEEP_ROLL, SWEEP_STEER, type MeasureContext } from './measures';
import { axisCosSin, mat3, rotate } from './pose';
import { Branch, copy12, FAIL_CONTACT, OK, Pose, setAngles, setBranch, solvePosition, type Driver } from './solve';
import { vec3 } from './vec3';

/** A sweep request: kind (SWEEP_*), grid (mm or degrees), rack held (mm; heave and roll). */
export interface SweepSpec {
	sweep: number;
	from: number;
	to: number;
	step: number;
	rack: number;
	points: boolean;
}

/** Solved rows of one sweep: rows lo..hi (inclusive) are valid; `failCode` ≠ OK names the link. */
export class SweepBuffer {
	positions = new Float64Array(0);
	values = new Float64Array(0);
	has = new Uint8Array(0);
	points = new Float64Array(0);
	count = 0;
	lo = 0;
	hi = -1;
	failCode = OK;
	failPosition = 0;

	/** points per row in `points` (the model's point list) */
	nPoints = 0;

	/** Make room for n rows of nPoints points each (grows only, so a reused buffer allocates nothing). */
	reserve(n: number, points: boolean, nPoints: number): void {
		if (this.positions.length < n) {
			this.positions = new Float64Array(n);
			this.values = new Float64Array(n * N_FIELDS);
			this.has = new Uint8Array(n * N_FIELDS);
		}
		this.nPoints = nPoints;
		if (points && this.points.length < n * nPoints * 3) this.points = new Float64Array(n * nPoints * 3);
	}
}

/** Number of grid positions from..to by step, `to` included when within GRID_TOL of a step. */
export function gridCount(from: number, to: number, step: number): number {
	return Math.floor((to - from) / step + GRID_TOL) + 1;
}

const GRID_SCALE = 10 ** GRID_DECIMALS; // exactly 1e12

/** Grid position k, rounded to GRID_DECIMALS decimals so 0.1-type steps print cleanly. */
function gridValue(from: number, step: number, k: number): number {
	return Math.round((from + k * step) * GRID_SCALE) / GRID_SCALE;
}

/** The continuation state carried from one position to the next (numbers kept in fields so none is boxed). */
class Walker {
	readonly ref = new Branch();
	readonly pose = new Pose();
	readonly driver: Driver = { mode: 0, targetZ: 0, n: vec3(0, 0, 1) };
	readonly ctx: MeasureContext = { sweep: 0, roll: 0, n: vec3(0, 0, 1) };
	readonly start = new Branch();
	/** sweep kind (SWEEP_*), rack held (mm), current and target position (mm or degrees) */
	sweep = 0;
	rackHeld = 0;
	at = 0;
	target = 0;
	prevP = 0;
	prevTheta = 0;
	prev2P = 0;
	prev2Theta = 0;
	prev3P = 0;
	prev3Theta = 0;
	prev4P = 0;
	prev4Theta = 0;
	nHist = 0;
	/** rods chain: the last three solved poses (Branch.q) */
	readonly prevQ = new Float64Array(12);
	readonly prev2Q = new Float64Array(12);
	readonly prev3Q = new Float64Array(12);
}

const walker = new Walker();
const DESIGN = new Branch();

const hist = new Float64Array(4);
/** Lagrange weights of the last solved positions at w.at (newest first). */
const lw = new Float64Array(4);

/**
 * Fill lw with the Lagrange weights at w.at of the last `most` (≤ 4) solved positions, fewer when the history is
 * shorter or two positions coincide; returns how many are used (0: no history). Cubic through four points on a
 * 1 mm grid errs about a tenth of the quadratic.
 */
function weights(w: Walker, most: number): number {
	hist[0] = w.prevP;
	hist[1] = w.prev2P;
	hist[2] = w.prev3P;
	hist[3] = w.prev4P;
	let n = Math.min(w.nHist, most);
	for (let k = 1; k < n; k++) {
		for (let j = 0; j < k; j++) if (hist[k] === hist[j]) n = k;
	}
	const x = w.at;
	for (let i = 0; i < n; i++) {
		let l = 1;
		for (let j = 0; j < n; j++) if (j !== i) l *= (x - hist[j]) / (hist[i] - hist[j]);
		lw[i] = l;
	}
	return n;
}

/** Set w.pose.guess: θ (rad) at w.at extrapolated from the last one to four solutions (the rods chain: its pose). */
function predict(m: CornerModel, w: Walker): void {
	if (m.chain === CHAIN_RODS) return predictPose(w);
	const n = weights(w, 4);
	if (n === 0) {
		w.pose.guess = w.ref.theta;
		return;
	}
	let g = lw[0] * w.prevTheta;
	if (n > 1) g += lw[1] * w.prev2Theta;
	if (n > 2) g += lw[2] * w.prev3Theta;
	if (n > 3) g += lw[3] * w.prev4Theta;
	w.pose.guess = g;
}

/** Rods chain: w.pose.guessQ extrapolated from the last one to three solved poses (Newton re-orthonormalises). */
function predictPose(w: Walker): void {
	const g = w.pose.guessQ;
	const n = weights(w, 3);
	if (n === 0) return copy12(g, w.ref.q);
	const l1 = lw[0];
	const l2 = n > 1 ? lw[1] : 0;
	const l3 = n > 2 ? lw[2] : 0;
	for (let i = 0; i < 12; i++) g[i] = l1 * w.prevQ[i] + l2 * w.prev2Q[i] + l3 * w.prev3Q[i];
}

/** Set the driver, context and rack (w.pose.rack) for w.sweep at position w.at (mm or degrees). */
function drive(m: CornerModel, w: Walker): void {
	w.ctx.sweep = w.sweep;
	const n = w.ctx.n;
	w.pose.rack = w.sweep === SWEEP_STEER ? w.at : w.rackHeld;
	if (w.sweep === SWEEP_ROLL) {
		const r = w.at * RAD;
		w.ctx.roll = r;
		n[0] = 0;
		n[1] = -Math.sin(r); // positive roll puts the left side down: the ground rises on the left
		n[2] = Math.cos(r);
		w.driver.mode = 1;
		w.driver.n = n;
		return;
	}
	w.ctx.roll = 0;
	n[0] = 0;
	n[1] = 0;
	n[2] = 1;
	w.driver.mode = 0;
	w.driver.targetZ = m.wheelCentreZ0 + (w.sweep === SWEEP_HEAVE ? w.at : 0);
}

/** Solve the position w.at from the walker's state; on success the state moves there. */
function step(m: CornerModel, w: Walker): number {
	drive(m, w);
	predict(m, w);
	const code = solvePosition(m, w.ref, w.driver, w.pose);
	if (code !== OK) return code;
	if (m.chain === CHAIN_RODS) {
		setBranch(w.ref, w.pose.branch);
		copy12(w.prev3Q, w.prev2Q);
		copy12(w.prev2Q, w.prevQ);
		copy12(w.prevQ, w.pose.branch.q);
	} else setAngles(w.ref, w.pose.branch);
	w.prev4P = w.prev3P;
	w.prev4Theta = w.prev3Theta;
	w.prev3P = w.prev2P;
	w.prev3Theta = w.prev2Theta;
	w.prev2P = w.prevP;
	w.prev2Theta = w.prevTheta;
	w.prevP = w.at;
	w.prevTheta = w.pose.branch.theta;
	w.nHist++;
	return OK;
}

/** Move from w.at to w.target in steps no longer than maxStep; OK or a FAIL code (w.at where it stopped). */
function travelTo(m: CornerModel, w: Walker): number {
	const from = w.at;
	const to = w.target;
	const h = w.sweep === SWEEP_ROLL ? MAX_STEP_ROLL_RAD / RAD : MAX_STEP_MM; // grid units
	const n = Math.ceil(Math.abs(to - from) / h - GRID_TOL);
	for (let i = 1; i < n; i++) {
		w.at = from + ((to - from) * i) / n;
		const code = step(m, w);
		if (code !== OK) return code;
	}
	w.at = to;
	return step(m, w);
}

/** Reset the walker to the start state at position 0; `exact` when that state satisfies the driver. */
function restart(w: Walker, exact: boolean): void {
	setBranch(w.ref, w.start);
	copy12(w.prevQ, w.start.q);
	w.nHist = exact ? 1 : 0;
	w.at = 0;
	w.prevP = 0;
	w.prevTheta = w.start.theta;
}

/** Bring the rack from 0 to `rack` (mm) at design wheel-centre height; OK or a FAIL code. */
function approachRack(m: CornerModel, w: Walker, rack: number): number {
	setBranch(w.ref, DESIGN);
	w.ref.tau = m.strutTau0;
	copy12(w.prevQ, DESIGN.q);
	w.nHist = 1;
	w.prevP = 0;
	w.prevTheta = 0;
	w.sweep = SWEEP_STEER;
	w.at = 0;
	w.target = rack;
	const code = rack === 0 ? OK : travelTo(m, w);
	setBranch(w.start, w.ref);
	return code;
}

const armR = mat3();
const armCS = new Float64Array(2);
const tmpP = vec3();

/** out = `design` turned about the axis of `arm` (through arm.pivot) by the angle [armCS]. */
function onArm(out: Float64Array, arm: CornerModel['lower'], design: Float64Array): void {
	axisCosSin(armR, arm.e, armCS);
	for (let i = 0; i < 3; i++) tmpP[i] = design[i] - arm.pivot[i];
	rotate(out, armR, tmpP);
	for (let i = 0; i < 3; i++) out[i] += arm.pivot[i];
}

const onePoint = vec3();

/** Write the solved pose's points into row `row` of buf.points: each point moved with its body. */
function writePoints(m: CornerModel, solved: Pose, buf: SweepBuffer, row: number): void {
	const p = solved.exact ?? solved;
	const o = row * buf.nPoints * 3;
	const pts = buf.points;
	for (let k = 0; k < m.outPoints.length; k++) {
		const { body, design } = m.outPoints[k];
		const q = onePoint;
		if (body === B_CHASSIS) q.set(design);
		else if (body === B_RACK) {
			q.set(design);
			q[1] += p.rack;
		} else if (body === B_LOWER) {
			armCS[0] = p.csTheta[0];
			armCS[1] = p.csTheta[1];
			onArm(q, m.lower, design);
		} else if (body === B_UPPER) {
			armCS[0] = p.branch.phiC;
			armCS[1] = p.branch.phiS;
			onArm(q, m.upper, design);
		} else if (body === B_ROCKER) {
			armCS[0] = p.branch.rockerC;
			armCS[1] = p.branch.rockerS;
			onArm(q, m.rocker!.rodEnd, design);
		} else {
			for (let i = 0; i < 3; i++) tmpP[i] = design[i] - m.L0[i];
			rotate(q, p.R, tmpP);
			for (let i = 0; i < 3; i++) q[i] += p.L[i];
		}
		pts[o + 3 * k] = q[0];
		pts[o + 3 * k + 1] = q[1];
		pts[o + 3 * k + 2] = q[2];
	}
}

/** Solve and record grid row k from the walker's position; false (failure recorded) when it cannot be assembled. */
function solveRow(m: CornerModel, spec: SweepSpec, buf: SweepBuffer, k: number): boolean {
	const w = walker;
	const target = buf.positions[k];
	w.target = target;
	let code = travelTo(m, w);
	if (code === OK && !computeMeasures(m, w.pose, w.ctx, buf.values, buf.has, k)) code = FAIL_CONTACT;
	if (code !== OK) {
		if (buf.failCode === OK || Math.abs(target) < Math.abs(buf.failPosition)) {
			buf.failCode = code;
			buf.failPosition = target;
		}
		return false;
	}
	if (spec.points) writePoints(m, w.pose, buf, k);
	return true;
}

/** Run sweep `spec` on model m into buf (reused between calls; allocates nothing once sized). */
export function runSweep(m: CornerModel, spec: SweepSpec, buf: SweepBuffer): void {
	const n = Math.min(gridCount(spec.from, spec.to, spec.step), MAX_SAMPLES);
	buf.reserve(n, spec.points, m.outPoints.length);
	buf.count = n;
	buf.failCode = OK;
	buf.failPosition = 0;
	for (let k = 0; k < n; k++) buf.positions[k] = gridValue(spec.from, spec.step, k);
	if (n > 0 && Math.abs(buf.positions[n - 1] - spec.to) <= GRID_TOL * spec.step) buf.positions[n - 1] = spec.to;
	const rack = spec.sweep === SWEEP_STEER ? 0 : spec.rack;
	walker.pose.allPoints = true;
	const code = approachRack(m, walker, rack);
	if (code !== OK) {
		buf.failCode = code;
		buf.failPosition = n > 0 ? buf.positions[0] : 0;
		buf.lo = 0;
		buf.hi = -1;
		return;
	}
	let first = 0; // first grid index at or above design (0)
	while (first < n && buf.positions[first] < 0) first++;
	const exact = spec.sweep !== SWEEP_ROLL;
	walker.sweep = spec.sweep;
	walker.rackHeld = rack;
	walker.pose.allPoints = spec.points;
	restart(walker, exact);
	let hi = first - 1;
	for (let k = first; k < n && solveRow(m, spec, buf, k); k++) hi = k;
	restart(walker, exact);
	let lo = first;
	for (let k = first - 1; k >= 0 && solveRow(m, spec, buf, k); k--) lo = k;
	buf.lo = lo;
	buf.hi = hi;
}
