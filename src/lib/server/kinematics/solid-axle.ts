// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height,
// y = 0 centreline. Lengths in mm; angles in degrees at the edge (radians inside).
//
// The solid (live) rear axle: one rigid body carrying both wheels, located by four links (two
// lower, two upper, each a rod with a ball joint at both ends) and a Panhard rod or a Watt's
// linkage (a centre link turning on the housing about the housing's x direction through
// `watt.pivot`, its two ends tied to the chassis by one rod each).
//
// Unknowns: the axle's displacement t and rotation R from design (6), plus the Watt's centre
// link angle φ. The sweep driver fixes two of them: in heave both wheel-centre heights (each
// moves by `travel`, chassis axes), in roll both contact points on the rolled ground plane.
//
// MODELLING ASSUMPTION: a solid axle is usually over-constrained. A parallel four-link with a
// Panhard rod binds in roll (5 links + 2 driver conditions for 6 freedoms); real cars take the
// bind up in the bushings. We model every link as equally stiff along its length and
// nothing else compliant: the pose is the one that minimises the sum of squared link-length
// errors with the two driver conditions held exactly (Gauss–Newton on the linearised KKT
// system, each sample warm-started from the previous one). A layout that is compatible (not
// binding) is solved exactly by the same route. `bind_rms` reports the RMS link-length error
// (mm) each pose needs; above BIND_LIMIT_MM RMS the axle "cannot be assembled" and the sweep
// stops, naming the most stretched link.
//
// Inner loop: all scratch is allocated once per solve (Float64Array, gl-matrix style).

import { DEG, GRID_DECIMALS, GRID_TOL, MAX_SAMPLES, PARALLEL_TOL_RAD, RAD } from './constants';
import { axisCosSin } from './pose';

/** Scratch for one Gauss–Newton step's rotation (axis, [cos, sin]). */
const stepAxis = new Float64Array(3);
const stepCs = new Float64Array(2);

/** A point [x, y, z] (mm). */
export type SolidPoint = [number, number, number];

/** The `solid` object of an axle file, validated by `solidAxleSchema` ($lib/schemas/solid-axle). */
export interface SolidAxleInput {
	kind: 'solid_axle';
	lateral: 'panhard' | 'watt';
	points: Record<string, SolidPoint>;
	tyre: { loaded_radius: number };
}

/** The car data anti-squat needs (contract `vehicle` block). */
export interface SolidVehicle {
	wheelbase: number;
	cg_height: number;
	axle: 'front' | 'rear';
	rear_drive_fraction?: number;
}

export type SolidSweepKind = 'heave' | 'roll';

export interface SolidSweepOptions {
	sweep: SolidSweepKind;
	from: number;
	to: number;
	step: number;
	/** add every named point's position at each sample */
	points?: boolean;
}

/** One wheel's measures (contract definitions, chassis axes). */
export interface SolidSide {
	camber: number;
	toe: number;
	half_track_change: number;
	wheelbase_change: number;
	wheel_centre: SolidPoint;
	contact_patch: SolidPoint;
	/** -d(spring length)/d(axle heave travel); null without this side's spring */
	motion_ratio: number | null;
}

export interface SolidSample {
	travel?: number;
	roll?: number;
	left: SolidSide;
	right: SolidSide;
	/** deg: the axle's right-handed rotation about x in chassis axes = the chassis's left side down over the axle */
	axle_roll: number;
	/** deg: the axle's rotation about +z in chassis axes, + = the axle steers left */
	axle_yaw: number;
	/** deg/deg: d(axle_yaw)/d(roll), roll sweeps; null in heave */
	roll_steer: number | null;
	/** mm, chassis z: Panhard rod's front-view line at y = 0; Watt's: the centre link pivot's z (common practice) */
	rc_height: number | null;
	/** mm: y of the wheel centres' midpoint against design (+ = left) */
	lateral_shift: number;
	/** deg: change of the pinion axis (or the housing's pitch) in the side view, + = nose up */
	pinion_angle: number;
	/** [x, z] side-view instant centre of the left lower and upper links; null when parallel */
	svic: [number, number] | null;
	/** percent (live axle, torque reacted by the housing); null without a rear-axle vehicle or svic */
	anti_squat: number | null;
	/** mm: RMS link-length error the pose needs (0 for a layout that does not bind) */
	bind_rms: number;
	points?: Record<string, SolidPoint>;
}

export interface SolidSweepError {
	link: string;
	position: number;
	sweep: SolidSweepKind;
	message: string;
}

export interface SolidSweepResult {
	samples: SolidSample[];
	error: SolidSweepError | null;
}

/** Geometry the solver cannot model (the zod schema catches these first). */
export class SolidAxleGeometryError extends Error {
	constructor(
		readonly field: string,
		message: string
	) {
		super(`${field}: ${message}`);
	}
}

/** Bad sweep options (`field: message`). */
export class SolidSweepOptionsError extends Error {}

/** Above this RMS link-length error (mm) a pose cannot be assembled. */
export const BIND_LIMIT_MM = 1;
/** Gauss–Newton iterations per pose before giving up. */
const MAX_ITER = 80;
/** Converged when the step (or the next one, estimated from the contraction) moves no point by more than this (mm, rotations scaled by REF_LEVER). */
const STEP_TOL_MM = 1e-11;
/** Lever (mm) that turns a rotation step into a displacement for the convergence test. */
const REF_LEVER = 1000;
/** Largest rotation step (rad) of one iteration, so a poor start cannot flip the axle. */
const MAX_ROT_STEP = 0.2;
/** Central-difference half steps: heave (mm) for the motion ratio, roll (rad) for roll steer. */
const HEAVE_H = 0.01;
const ROLL_H = 0.01 * RAD;
/** Continuation steps between grid positions: at most this (mm, or rad in roll). */
const MAX_STEP_MM = 5;
const MAX_STEP_ROLL = 0.5 * RAD;

// Failure codes
const OK = 0;
const FAIL_CONVERGE = 1;
const FAIL_BIND = 2;
const FAIL_SINGULAR = 3;

/** The compiled axle: body vectors about the design axle centre, rods, drivers' wheel data. */
interface Model {
	lateral: 'panhard' | 'watt';
	radius: number;
	/** design axle centre O0 (midpoint of the wheel centres) */
	o0: Float64Array;
	/** names and body vectors (p - O0) of the axle-fixed points */
	axleNames: string[];
	axleVec: Float64Array;
	/** chassis points (fixed) */
	chassisNames: string[];
	chassisPos: Float64Array;
	/** Watt's centre link: pivot index among axle points, ends relative to the pivot at design (2 × 3) */
	wattPivot: number;
	wattEnds: Float64Array;
	/** rods: name, chassis end (3 per rod), moving end: >= 0 axle point index, -1 / -2 Watt upper / lower end; design length */
	rodNames: string[];
	rodChassis: Float64Array;
	rodEnd: Int32Array;
	rodLen: Float64Array;
	/** axle-point indices */
	wl: number;
	wr: number;
	/** design outboard spin axes, left then right (unit) */
	spin0: Float64Array;
	/** design contact points, left then right */
	contact0: Float64Array;
	/** spring: [chassis index, axle index] per side or -1 */
	springL: [number, number] | null;
	springR: [number, number] | null;
	pinion: number;
	/** Panhard ends: chassis index, axle index */
	panhardC: number;
	panhardA: number;
	/** left lower / upper link: chassis index, axle index */
	lowerL: [number, number];
	upperL: [number, number];
	pinion0: number;
}

function need(p: Record<string, SolidPoint>, name: string): SolidPoint {
	const v = p[name];
	if (!v || v.length !== 3 || !v.every(Number.isFinite)) throw new SolidAxleGeometryError(`points.${name}`, 'missing');
	return v;
}

const CHASSIS_SUFFIX = /\.chassis$|^watt\.(upper|lower)_chassis$/;

/** Compile the axle into the solver's arrays; throws SolidAxleGeometryError. */
function compile(axle: SolidAxleInput): Model {
	const P = axle.points;
	const lateral = axle.lateral;
	if (lateral !== 'panhard' && lateral !== 'watt') throw new SolidAxleGeometryError('lateral', "must be 'panhard' or 'watt'");
	const radius = axle.tyre?.loaded_radius;
	if (!(radius > 0)) throw new SolidAxleGeometryError('tyre.loaded_radius', 'must be > 0');
	const links = ['lower_left', 'lower_right', 'upper_left', 'upper_right'];
	const required = [...links.flatMap((l) => [`${l}.chassis`, `${l}.axle`]), 'wheel_left.centre', 'wheel_left.axis_inner', 'wheel_right.centre', 'wheel_right.axis_inner'];
	if (lateral === 'panhard') required.push('panhard.chassis', 'panhard.axle');
	else required.push('watt.pivot', 'watt.upper_end', 'watt.lower_end', 'watt.upper_chassis', 'watt.lower_chassis');
	for (const n of required) need(P, n);
	const wl = need(P, 'wheel_left.centre');
	const wr = need(P, 'wheel_right.centre');
	const o0 = new Float64Array([(wl[0] + wr[0]) / 2, (wl[1] + wr[1]) / 2, (wl[2] + wr[2]) / 2]);

	const chassisNames: string[] = [];
	const axleNames: string[] = [];
	for (const name of Object.keys(P)) {
		if (lateral === 'watt' && (name === 'watt.upper_end' || name === 'watt.lower_end')) continue;
		if (lateral === 'panhard' && name.startsWith('watt.')) continue;
		if (lateral === 'watt' && name.startsWith('panhard.')) continue;
		need(P, name);
		(CHASSIS_SUFFIX.test(name) ? chassisNames : axleNames).push(name);
	}
	const axleVec = new Float64Array(axleNames.length * 3);
	axleNames.forEach((n, i) => {
		for (let j = 0; j < 3; j++) axleVec[3 * i + j] = P[n][j] - o0[j];
	});
	const chassisPos = new Float64Array(chassisNames.length * 3);
	chassisNames.forEach((n, i) => chassisPos.set(P[n], 3 * i));
	const ai = (n: string) => axleNames.indexOf(n);
	const ci = (n: string) => chassisNames.indexOf(n);

	const wattPivot = lateral === 'watt' ? ai('watt.pivot') : -1;
	const wattEnds = new Float64Array(6);
	if (lateral === 'watt') {
		const pv = P['watt.pivot'];
		const u = P['watt.upper_end'];
		const l = P['watt.lower_end'];
		for (let j = 0; j < 3; j++) {
			wattEnds[j] = u[j] - pv[j];
			wattEnds[3 + j] = l[j] - pv[j];
		}
	}

	const rods: [string, string, string][] = links.map((l) => [l, `${l}.chassis`, `${l}.axle`]);
	if (lateral === 'panhard') rods.push(['panhard', 'panhard.chassis', 'panhard.axle']);
	else rods.push(['watt_upper', 'watt.upper_chassis', 'watt.upper_end'], ['watt_lower', 'watt.lower_chassis', 'watt.lower_end']);
	const rodChassis = new Float64Array(rods.length * 3);
	const rodEnd = new Int32Array(rods.length);
	const rodLen = new Float64Array(rods.length);
	rods.forEach(([name, c, e], i) => {
		rodChassis.set(P[c], 3 * i);
		rodEnd[i] = e === 'watt.upper_end' ? -1 : e === 'watt.lower_end' ? -2 : ai(e);
		const d = Math.hypot(P[e][0] - P[c][0], P[e][1] - P[c][1], P[e][2] - P[c][2]);
		if (!(d >= 1)) throw new SolidAxleGeometryError(`points.${e}`, `link ${name} has zero length`);
		rodLen[i] = d;
	});

	const spin0 = new Float64Array(6);
	const contact0 = new Float64Array(6);
	for (const [k, side] of [[0, 'left'], [1, 'right']] as const) {
		const w = P[`wheel_${side}.centre`];
		const inner = P[`wheel_${side}.axis_inner`];
		const a = [w[0] - inner[0], w[1] - inner[1], w[2] - inner[2]];
		const l = Math.hypot(a[0], a[1], a[2]);
		if (!(l > 0)) throw new SolidAxleGeometryError(`points.wheel_${side}.axis_inner`, `coincides with wheel_${side}.centre`);
		for (let j = 0; j < 3; j++) spin0[3 * k + j] = a[j] / l;
		// design contact point against z = 0 (contract: lowest point of the tyre circle)
		const ax = spin0[3 * k];
		const ay = spin0[3 * k + 1];
		const az = spin0[3 * k + 2];
		const q = [-az * ax, -az * ay, 1 - az * az];
		const ql = Math.hypot(q[0], q[1], q[2]);
		for (let j = 0; j < 3; j++) contact0[3 * k + j] = w[j] - (radius * q[j]) / ql;
	}

	const spring = (side: string): [number, number] | null => {
		const c = ci(`spring_${side}.chassis`);
		const a = ai(`spring_${side}.axle`);
		return c >= 0 && a >= 0 ? [c, a] : null;
	};
	const pinion = ai('pinion.front');
	let pinion0 = 0;
	if (pinion >= 0) {
		const pf = P['pinion.front'];
		pinion0 = Math.atan2(pf[2] - o0[2], pf[0] - o0[0]);
	}
	return {
		lateral,
		radius,
		o0,
		axleNames,
		axleVec,
		chassisNames,
		chassisPos,
		wattPivot,
		wattEnds,
		rodNames: rods.map((r) => r[0]),
		rodChassis,
		rodEnd,
		rodLen,
		wl: ai('wheel_left.centre'),
		wr: ai('wheel_right.centre'),
		spin0,
		contact0,
		springL: spring('left'),
		springR: spring('right'),
		pinion,
		panhardC: ci('panhard.chassis'),
		panhardA: ai('panhard.axle'),
		lowerL: [ci('lower_left.chassis'), ai('lower_left.axle')],
		upperL: [ci('upper_left.chassis'), ai('upper_left.axle')],
		pinion0
	};
}

const DRIVE_HEAVE = 0;
const DRIVE_ROLL = 1;

/** The pose and all scratch of one solve (allocated once). */
class Solver {
	readonly m: Model;
	readonly n: number;
	readonly k: number;
	/** pose: translation, rotation (row-major), Watt's angle */
	readonly t = new Float64Array(3);
	readonly R = new Float64Array(9);
	phi = 0;
	/** saved pose */
	readonly t0 = new Float64Array(3);
	readonly R0 = new Float64Array(9);
	phi0 = 0;
	/** current positions of the axle points, the Watt's ends */
	readonly pos: Float64Array;
	readonly ends = new Float64Array(6);
	/** residuals, Jacobian rows (k × n), driver values and rows (2 × n) */
	readonly r: Float64Array;
	readonly J: Float64Array;
	readonly g = new Float64Array(2);
	readonly G: Float64Array;
	/** augmented KKT system */
	readonly M: Float64Array;
	readonly x: Float64Array;
	readonly E = new Float64Array(9);
	readonly T = new Float64Array(9);
	readonly spin = new Float64Array(6);
	readonly contact = new Float64Array(6);
	/** driver: kind, targets (heave: wheel-centre z left/right) and ground normal (roll) */
	drive = DRIVE_HEAVE;
	readonly target = new Float64Array(2);
	readonly normal = new Float64Array([0, 0, 1]);
	worst = 0;
	rms = 0;

	constructor(m: Model) {
		this.m = m;
		this.n = m.lateral === 'watt' ? 7 : 6;
		this.k = m.rodLen.length;
		this.pos = new Float64Array(m.axleVec.length);
		this.r = new Float64Array(this.k);
		this.J = new Float64Array(this.k * this.n);
		this.G = new Float64Array(2 * this.n);
		const s = this.n + 2;
		this.M = new Float64Array(s * (s + 1));
		this.x = new Float64Array(s);
		this.reset();
	}

	reset(): void {
		this.t.fill(0);
		this.R.fill(0);
		this.R[0] = this.R[4] = this.R[8] = 1;
		this.phi = 0;
		this.place();
	}

	save(): void {
		this.t0.set(this.t);
		this.R0.set(this.R);
		this.phi0 = this.phi;
	}

	restore(): void {
		this.t.set(this.t0);
		this.R.set(this.R0);
		this.phi = this.phi0;
		this.place();
	}

	/** Heave driver: wheel-centre heights zl, zr (mm, chassis). */
	heave(zl: number, zr: number): void {
		this.drive = DRIVE_HEAVE;
		this.target[0] = zl;
		this.target[1] = zr;
		this.normal[0] = 0;
		this.normal[1] = 0;
		this.normal[2] = 1;
	}

	/** Roll driver: both contact points on the ground rolled by `roll` rad (+ = left side down: the ground rises on the left). */
	roll(roll: number): void {
		this.drive = DRIVE_ROLL;
		this.normal[0] = 0;
		this.normal[1] = -Math.sin(roll);
		this.normal[2] = Math.cos(roll);
	}

	/** Positions of every moving point from the pose; spin axes and contact points. */
	place(): void {
		const { m, R, t, pos } = this;
		const o = m.o0;
		const v = m.axleVec;
		for (let i = 0; i < v.length; i += 3) {
			const x = v[i];
			const y = v[i + 1];
			const z = v[i + 2];
			pos[i] = o[0] + t[0] + R[0] * x + R[1] * y + R[2] * z;
			pos[i + 1] = o[1] + t[1] + R[3] * x + R[4] * y + R[5] * z;
			pos[i + 2] = o[2] + t[2] + R[6] * x + R[7] * y + R[8] * z;
		}
		if (m.wattPivot >= 0) {
			const c = Math.cos(this.phi);
			const s = Math.sin(this.phi);
			const p = 3 * m.wattPivot;
			for (let e = 0; e < 6; e += 3) {
				// rotate the end about the body x axis by φ, then with the axle
				const x = m.wattEnds[e];
				const y = c * m.wattEnds[e + 1] - s * m.wattEnds[e + 2];
				const z = s * m.wattEnds[e + 1] + c * m.wattEnds[e + 2];
				this.ends[e] = pos[p] + R[0] * x + R[1] * y + R[2] * z;
				this.ends[e + 1] = pos[p + 1] + R[3] * x + R[4] * y + R[5] * z;
				this.ends[e + 2] = pos[p + 2] + R[6] * x + R[7] * y + R[8] * z;
			}
		}
		const n = this.normal;
		for (let k = 0; k < 6; k += 3) {
			const a0 = m.spin0;
			const ax = R[0] * a0[k] + R[1] * a0[k + 1] + R[2] * a0[k + 2];
			const ay = R[3] * a0[k] + R[4] * a0[k + 1] + R[5] * a0[k + 2];
			const az = R[6] * a0[k] + R[7] * a0[k + 1] + R[8] * a0[k + 2];
			this.spin[k] = ax;
			this.spin[k + 1] = ay;
			this.spin[k + 2] = az;
			const na = n[0] * ax + n[1] * ay + n[2] * az;
			const qx = n[0] - na * ax;
			const qy = n[1] - na * ay;
			const qz = n[2] - na * az;
			const ql = Math.sqrt(qx * qx + qy * qy + qz * qz);
			const w = 3 * (k === 0 ? m.wl : m.wr);
			this.contact[k] = pos[w] - (m.radius * qx) / ql;
			this.contact[k + 1] = pos[w + 1] - (m.radius * qy) / ql;
			this.contact[k + 2] = pos[w + 2] - (m.radius * qz) / ql;
		}
	}

	/** Residuals, their Jacobian, the drivers and theirs at the current pose. */
	linearise(): void {
		const { m, n, pos, J, r, G, g, t } = this;
		const ox = m.o0[0] + t[0];
		const oy = m.o0[1] + t[1];
		const oz = m.o0[2] + t[2];
		let ss = 0;
		let worst = 0;
		for (let i = 0; i < this.k; i++) {
			const e = m.rodEnd[i];
			let px: number, py: number, pz: number;
			if (e >= 0) {
				px = pos[3 * e];
				py = pos[3 * e + 1];
				pz = pos[3 * e + 2];
			} else {
				const b = e === -1 ? 0 : 3;
				px = this.ends[b];
				py = this.ends[b + 1];
				pz = this.ends[b + 2];
			}
			const dx = px - m.rodChassis[3 * i];
			const dy = py - m.rodChassis[3 * i + 1];
			const dz = pz - m.rodChassis[3 * i + 2];
			const l = Math.sqrt(dx * dx + dy * dy + dz * dz);
			const ri = l - m.rodLen[i];
			r[i] = ri;
			ss += ri * ri;
			if (Math.abs(ri) > Math.abs(r[worst])) worst = i;
			const ux = dx / l;
			const uy = dy / l;
			const uz = dz / l;
			const rx = px - ox;
			const ry = py - oy;
			const rz = pz - oz;
			const row = i * n;
			J[row] = ux;
			J[row + 1] = uy;
			J[row + 2] = uz;
			// d r / d ω = (p - O) × u
			J[row + 3] = ry * uz - rz * uy;
			J[row + 4] = rz * ux - rx * uz;
			J[row + 5] = rx * uy - ry * ux;
			if (n === 7) {
				if (e >= 0) J[row + 6] = 0;
				else {
					// d p / d φ = a × (p - pivot), a = R e_x
					const R = this.R;
					const p = 3 * m.wattPivot;
					const vx = px - pos[p];
					const vy = py - pos[p + 1];
					const vz = pz - pos[p + 2];
					const cx = R[3] * vz - R[6] * vy;
					const cy = R[6] * vx - R[0] * vz;
					const cz = R[0] * vy - R[3] * vx;
					J[row + 6] = ux * cx + uy * cy + uz * cz;
				}
			}
		}
		this.worst = worst;
		this.rms = Math.sqrt(ss / this.k);
		const nn = this.normal;
		for (let s = 0; s < 2; s++) {
			const w = 3 * (s === 0 ? m.wl : m.wr);
			const rx = pos[w] - ox;
			const ry = pos[w + 1] - oy;
			const rz = pos[w + 2] - oz;
			const row = s * n;
			if (n === 7) G[row + 6] = 0;
			if (this.drive === DRIVE_HEAVE) {
				g[s] = pos[w + 2] - this.target[s];
				G[row] = 0;
				G[row + 1] = 0;
				G[row + 2] = 1;
				G[row + 3] = ry;
				G[row + 4] = -rx;
				G[row + 5] = 0;
			} else {
				const ax = this.spin[3 * s];
				const ay = this.spin[3 * s + 1];
				const az = this.spin[3 * s + 2];
				const na = nn[0] * ax + nn[1] * ay + nn[2] * az;
				const root = Math.sqrt(Math.max(1e-300, 1 - na * na));
				g[s] = nn[0] * pos[w] + nn[1] * pos[w + 1] + nn[2] * pos[w + 2] - m.radius * root;
				const f = (m.radius * na) / root;
				G[row] = nn[0];
				G[row + 1] = nn[1];
				G[row + 2] = nn[2];
				G[row + 3] = ry * nn[2] - rz * nn[1] + f * (ay * nn[2] - az * nn[1]);
				G[row + 4] = rz * nn[0] - rx * nn[2] + f * (az * nn[0] - ax * nn[2]);
				G[row + 5] = rx * nn[1] - ry * nn[0] + f * (ax * nn[1] - ay * nn[0]);
			}
		}
	}

	/** One Gauss–Newton step of the KKT system into this.x; false when singular. */
	step(): boolean {
		const { n, k, J, r, G, g, M, x } = this;
		const s = n + 2;
		const w = s + 1;
		for (let i = 0; i < n; i++) {
			for (let j = i; j < n; j++) {
				let h = 0;
				for (let q = 0; q < k; q++) h += J[q * n + i] * J[q * n + j];
				M[i * w + j] = h;
				M[j * w + i] = h;
			}
			let b = 0;
			for (let q = 0; q < k; q++) b -= J[q * n + i] * r[q];
			M[i * w + s] = b;
			M[i * w + n] = G[i];
			M[i * w + n + 1] = G[n + i];
			M[n * w + i] = G[i];
			M[(n + 1) * w + i] = G[n + i];
		}
		M[n * w + n] = M[n * w + n + 1] = M[(n + 1) * w + n] = M[(n + 1) * w + n + 1] = 0;
		M[n * w + s] = -g[0];
		M[(n + 1) * w + s] = -g[1];
		return gauss(M, s, x);
	}

	/** Apply step x: t += dt, R = exp(dω) R, φ += dφ (rotation step capped). Returns the step size (mm). */
	apply(): number {
		const { x, t, R, E, T } = this;
		t[0] += x[0];
		t[1] += x[1];
		t[2] += x[2];
		let wx = x[3];
		let wy = x[4];
		let wz = x[5];
		let th = Math.sqrt(wx * wx + wy * wy + wz * wz);
		if (th > MAX_ROT_STEP) {
			const f = MAX_ROT_STEP / th;
			wx *= f;
			wy *= f;
			wz *= f;
			th = MAX_ROT_STEP;
		}
		if (th > 0) {
			// the step's rotation by Rodrigues' formula (pose.ts, the corner solver's)
			stepAxis[0] = wx / th;
			stepAxis[1] = wy / th;
			stepAxis[2] = wz / th;
			stepCs[0] = Math.cos(th);
			stepCs[1] = Math.sin(th);
			axisCosSin(E, stepAxis, stepCs);
			for (let i = 0; i < 3; i++) {
				for (let j = 0; j < 3; j++) T[3 * i + j] = E[3 * i] * R[j] + E[3 * i + 1] * R[3 + j] + E[3 * i + 2] * R[6 + j];
			}
			R.set(T);
		}
		let size = Math.max(Math.abs(x[0]), Math.abs(x[1]), Math.abs(x[2]), th * REF_LEVER);
		if (this.n === 7) {
			this.phi += x[6];
			size = Math.max(size, Math.abs(x[6]) * REF_LEVER);
		}
		this.place();
		return size;
	}

	/** Solve the pose for the current driver from the current pose; a failure code. */
	solve(): number {
		let prev = Infinity;
		for (let it = 0; it < MAX_ITER; it++) {
			this.linearise();
			if (!this.step()) return FAIL_SINGULAR;
			const size = this.apply();
			if (!Number.isFinite(size)) return FAIL_CONVERGE;
			// converged when the step is below STEP_TOL_MM, or when the next step, estimated from the
			// observed contraction (size / prev), would be: saves the iteration that only confirms it
			const next = (size * size) / prev;
			prev = size;
			if (size < STEP_TOL_MM || (size < 1e-5 && next < STEP_TOL_MM)) {
				this.linearise();
				if (Math.abs(this.g[0]) > 1e-6 || Math.abs(this.g[1]) > 1e-6) return FAIL_CONVERGE;
				return this.rms > BIND_LIMIT_MM ? FAIL_BIND : OK;
			}
		}
		this.linearise();
		return FAIL_CONVERGE;
	}

	/** Wheel-centre z, left (0) or right (1). */
	wheelZ(s: number): number {
		return this.pos[3 * (s === 0 ? this.m.wl : this.m.wr) + 2];
	}

	/** Axle yaw (rad) of the current pose: the body's y axis turned about +z. */
	yaw(): number {
		return Math.atan2(-this.R[1], this.R[4]);
	}

	/** Spring length (mm) of a side's spring. */
	springLength(sp: [number, number]): number {
		const c = 3 * sp[0];
		const a = 3 * sp[1];
		const ch = this.m.chassisPos;
		return Math.hypot(this.pos[a] - ch[c], this.pos[a + 1] - ch[c + 1], this.pos[a + 2] - ch[c + 2]);
	}
}

/** Solve the s × s system in the augmented row-major matrix M (s × (s + 1)) into x by Gaussian elimination with partial pivoting. */
function gauss(M: Float64Array, s: number, x: Float64Array): boolean {
	const w = s + 1;
	let scale = 0;
	for (let i = 0; i < s * w; i++) scale = Math.max(scale, Math.abs(M[i]));
	const tiny = 1e-14 * (scale || 1);
	for (let c = 0; c < s; c++) {
		let p = c;
		for (let i = c + 1; i < s; i++) if (Math.abs(M[i * w + c]) > Math.abs(M[p * w + c])) p = i;
		if (!(Math.abs(M[p * w + c]) > tiny)) return false;
		if (p !== c) {
			for (let j = c; j < w; j++) {
				const tmp = M[c * w + j];
				M[c * w + j] = M[p * w + j];
				M[p * w + j] = tmp;
			}
		}
		const d = M[c * w + c];
		for (let i = c + 1; i < s; i++) {
			const f = M[i * w + c] / d;
			if (f === 0) continue;
			for (let j = c; j < w; j++) M[i * w + j] -= f * M[c * w + j];
		}
	}
	for (let i = s - 1; i >= 0; i--) {
		let v = M[i * w + s];
		for (let j = i + 1; j < s; j++) v -= M[i * w + j] * x[j];
		x[i] = v / M[i * w + i];
	}
	return true;
}

/** Grid positions from..to by step (`to` included within GRID_TOL of a step), rounded as the corner sweeps. */
function grid(from: number, to: number, step: number): number[] {
	const count = Math.floor((to - from) / step + GRID_TOL) + 1;
	const scale = 10 ** GRID_DECIMALS;
	const out: number[] = [];
	for (let k = 0; k < count; k++) out.push(Math.round((from + k * step) * scale) / scale);
	return out;
}

function checkOptions(o: SolidSweepOptions): void {
	if (o.sweep !== 'heave' && o.sweep !== 'roll') throw new SolidSweepOptionsError(`sweep: must be 'heave' or 'roll' for a solid axle`);
	for (const f of ['from', 'to', 'step'] as const) {
		if (typeof o[f] !== 'number' || !Number.isFinite(o[f])) throw new SolidSweepOptionsError(`${f}: must be a finite number`);
	}
	if (!(o.step > 0)) throw new SolidSweepOptionsError('step: must be > 0');
	if (!(o.from <= o.to)) throw new SolidSweepOptionsError('from: must be <= to');
	if (Math.floor((o.to - o.from) / o.step + GRID_TOL) + 1 > MAX_SAMPLES) throw new SolidSweepOptionsError(`step: more than ${MAX_SAMPLES} positions`);
}

/** Side-view instant centre [x, z] of two links (chassis → axle, current positions); null when parallel. */
function sideViewIc(ax: number, az: number, bx: number, bz: number, cx: number, cz: number, dx: number, dz: number): [number, number] | null {
	// line 1 through A with direction u = B - A; line 2 through C with direction v = D - C
	const ux = bx - ax;
	const uz = bz - az;
	const vx = dx - cx;
	const vz = dz - cz;
	const den = ux * vz - uz * vx;
	const lu = Math.hypot(ux, uz);
	const lv = Math.hypot(vx, vz);
	if (!(lu > 0) || !(lv > 0) || Math.abs(Math.asin(Math.max(-1, Math.min(1, den / (lu * lv))))) < PARALLEL_TOL_RAD) return null;
	const s = ((cx - ax) * vz - (cz - az) * vx) / den;
	return [ax + s * ux, az + s * uz];
}

/** Measures of one wheel at the solver's current pose. */
function sideOf(sv: Solver, s: number, mr: number | null): SolidSide {
	const m = sv.m;
	const sign = s === 0 ? 1 : -1;
	const a = sv.spin;
	const k = 3 * s;
	const w = 3 * (s === 0 ? m.wl : m.wr);
	const az = Math.max(-1, Math.min(1, a[k + 2]));
	const C = sv.contact;
	return {
		camber: -Math.asin(az) * DEG,
		toe: Math.atan2(a[k], Math.abs(a[k + 1])) * DEG,
		half_track_change: sign * (C[k + 1] - m.contact0[k + 1]),
		wheelbase_change: C[k] - m.contact0[k],
		wheel_centre: [sv.pos[w], sv.pos[w + 1], sv.pos[w + 2]],
		contact_patch: [C[k], C[k + 1], C[k + 2]],
		motion_ratio: mr
	};
}

/** Every named point at the solver's current pose. */
function pointsOf(sv: Solver): Record<string, SolidPoint> {
	const m = sv.m;
	const out: Record<string, SolidPoint> = {};
	m.chassisNames.forEach((n, i) => (out[n] = [m.chassisPos[3 * i], m.chassisPos[3 * i + 1], m.chassisPos[3 * i + 2]]));
	m.axleNames.forEach((n, i) => (out[n] = [sv.pos[3 * i], sv.pos[3 * i + 1], sv.pos[3 * i + 2]]));
	if (m.lateral === 'watt') {
		out['watt.upper_end'] = [sv.ends[0], sv.ends[1], sv.ends[2]];
		out['watt.lower_end'] = [sv.ends[3], sv.ends[4], sv.ends[5]];
	}
	return out;
}

/** Set the solver's driver for sweep position v (mm of travel or rad of roll). */
function drive(sv: Solver, roll: boolean, v: number): void {
	if (roll) sv.roll(v);
	else sv.heave(sv.m.o0[2] + sv.m.axleVec[3 * sv.m.wl + 2] + v, sv.m.o0[2] + sv.m.axleVec[3 * sv.m.wr + 2] + v);
}

/** The sample at the solver's (just solved, saved) pose; runs the central differences, then restores the pose. */
function sampleOf(sv: Solver, vehicle: SolidVehicle | null, roll: boolean, v: number, position: number, points: boolean): SolidSample {
	const m = sv.m;
	// motion ratios: heave both wheel centres by ±h from this pose
	let mrL: number | null = null;
	let mrR: number | null = null;
	const zl = sv.wheelZ(0);
	const zr = sv.wheelZ(1);
	if (m.springL || m.springR) {
		sv.heave(zl + HEAVE_H, zr + HEAVE_H);
		const okUp = sv.solve() === OK;
		const lUp = m.springL ? sv.springLength(m.springL) : 0;
		const rUp = m.springR ? sv.springLength(m.springR) : 0;
		sv.restore();
		sv.heave(zl - HEAVE_H, zr - HEAVE_H);
		const okDown = sv.solve() === OK;
		const lDown = m.springL ? sv.springLength(m.springL) : 0;
		const rDown = m.springR ? sv.springLength(m.springR) : 0;
		sv.restore();
		if (okUp && okDown) {
			if (m.springL) mrL = -(lUp - lDown) / (2 * HEAVE_H);
			if (m.springR) mrR = -(rUp - rDown) / (2 * HEAVE_H);
		}
	}
	let rollSteer: number | null = null;
	if (roll) {
		sv.roll(v + ROLL_H);
		const okUp = sv.solve() === OK;
		const yUp = sv.yaw();
		sv.restore();
		sv.roll(v - ROLL_H);
		const okDown = sv.solve() === OK;
		const yDown = sv.yaw();
		sv.restore();
		if (okUp && okDown) rollSteer = (yUp - yDown) / (2 * ROLL_H);
	}
	drive(sv, roll, v);
	sv.place();
	sv.linearise();

	const R = sv.R;
	const pos = sv.pos;
	const axleRoll = Math.atan2(R[7], R[4]) * DEG;
	const axleYaw = sv.yaw() * DEG;
	let rc: number | null = null;
	if (m.lateral === 'panhard') {
		const c = 3 * m.panhardC;
		const a = 3 * m.panhardA;
		const cy = m.chassisPos[c + 1];
		const cz = m.chassisPos[c + 2];
		const dy = pos[a + 1] - cy;
		if (Math.abs(dy) > 1e-9) rc = cz + ((0 - cy) * (pos[a + 2] - cz)) / dy;
	} else rc = pos[3 * m.wattPivot + 2];
	const wl = 3 * m.wl;
	const wr = 3 * m.wr;
	const lateral = (pos[wl + 1] + pos[wr + 1]) / 2 - m.o0[1];
	let pinion: number;
	if (m.pinion >= 0) {
		const p = 3 * m.pinion;
		const mx = (pos[wl] + pos[wr]) / 2;
		const mz = (pos[wl + 2] + pos[wr + 2]) / 2;
		pinion = (Math.atan2(pos[p + 2] - mz, pos[p] - mx) - m.pinion0) * DEG;
	} else pinion = Math.atan2(R[6], R[0]) * DEG; // the body's x axis in the side view, + = nose up
	const ch = m.chassisPos;
	const lc = 3 * m.lowerL[0];
	const la = 3 * m.lowerL[1];
	const uc = 3 * m.upperL[0];
	const ua = 3 * m.upperL[1];
	const svic = sideViewIc(ch[lc], ch[lc + 2], pos[la], pos[la + 2], ch[uc], ch[uc + 2], pos[ua], pos[ua + 2]);
	let antiSquat: number | null = null;
	if (vehicle && vehicle.axle === 'rear' && svic) {
		const C = sv.contact;
		const dx = svic[0] - C[0];
		if (dx !== 0) antiSquat = (100 * (vehicle.rear_drive_fraction ?? 1) * (vehicle.wheelbase / vehicle.cg_height) * (svic[1] - C[2])) / dx;
	}
	const sample: SolidSample = {
		[roll ? 'roll' : 'travel']: position,
		left: sideOf(sv, 0, mrL),
		right: sideOf(sv, 1, mrR),
		axle_roll: axleRoll,
		axle_yaw: axleYaw,
		roll_steer: rollSteer,
		rc_height: rc,
		lateral_shift: lateral,
		pinion_angle: pinion,
		svic,
		anti_squat: antiSquat,
		bind_rms: sv.rms
	} as SolidSample;
	if (points) sample.points = pointsOf(sv);
	return sample;
}

/**
 * Solve a heave (`travel`, mm, + = bump, both wheel centres together) or roll (`roll`, degrees,
 * + = left side down) sweep of a validated solid axle. Samples ascending; `error` names the link
 * and position where the axle cannot be assembled (the sweep stops there on that side of design).
 * Throws SolidAxleGeometryError or SolidSweepOptionsError.
 */
export function solveSolidAxle(axle: SolidAxleInput, vehicle: SolidVehicle | null, options: SolidSweepOptions): SolidSweepResult {
	checkOptions(options);
	const m = compile(axle);
	const sv = new Solver(m);
	const roll = options.sweep === 'roll';
	const unit = roll ? RAD : 1;
	const maxStep = roll ? MAX_STEP_ROLL : MAX_STEP_MM;
	const positions = grid(options.from, options.to, options.step);
	const samples: (SolidSample | null)[] = positions.map(() => null);
	const fails: SolidSweepError[] = [];
	const fail = (code: number, position: number): void => {
		const link = m.rodNames[sv.worst] ?? 'linkage';
		const what = roll ? 'roll' : 'travel';
		const u = roll ? '°' : ' mm';
		const why =
			code === FAIL_BIND
				? `binds: the links would have to stretch ${sv.rms.toFixed(2)} mm RMS (${link} ${sv.r[sv.worst].toFixed(2)} mm)`
				: code === FAIL_SINGULAR
					? 'leaves the axle free (the links do not locate it)'
					: 'does not converge';
		fails.push({ link, position, sweep: options.sweep, message: `${link} cannot be assembled at ${what} ${position}${u}: the axle ${why}` });
	};

	// anchor at the sweep's zero, then walk outward both ways so the solution follows one branch
	drive(sv, roll, 0);
	const code0 = sv.solve();
	if (code0 !== OK) fail(code0, 0);
	else {
		sv.save();
		const anchor = { t: Float64Array.from(sv.t), R: Float64Array.from(sv.R), phi: sv.phi };
		const up = positions.map((_, i) => i).filter((i) => positions[i] >= 0);
		const down = positions
			.map((_, i) => i)
			.filter((i) => positions[i] < 0)
			.reverse();
		for (const order of [up, down]) {
			sv.t.set(anchor.t);
			sv.R.set(anchor.R);
			sv.phi = anchor.phi;
			sv.place();
			let at = 0;
			for (const i of order) {
				const target = positions[i] * unit;
				const pieces = Math.max(1, Math.ceil(Math.abs(target - at) / maxStep - 1e-9));
				let code = OK;
				for (let p = 1; p <= pieces && code === OK; p++) {
					drive(sv, roll, at + ((target - at) * p) / pieces);
					code = sv.solve();
				}
				if (code !== OK) {
					fail(code, positions[i]);
					break;
				}
				at = target;
				sv.save();
				samples[i] = sampleOf(sv, vehicle, roll, target, positions[i], !!options.points);
			}
		}
	}
	const out = samples.filter((s): s is SolidSample => s !== null);
	fails.sort((a, b) => Math.abs(a.position) - Math.abs(b.position));
	return { samples: out, error: fails[0] ?? null };
}

/** The named points of a solid axle at design (the 3-D view's rest pose). */
export function solidAxleDesignPoints(axle: SolidAxleInput): Record<string, SolidPoint> {
	const sv = new Solver(compile(axle));
	return pointsOf(sv);
}
