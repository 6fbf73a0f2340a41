// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height, y = 0 centreline.
// Lengths in mm, angles in degrees at this edge.
// Both corners of one axle solved together (`axle-solve/1`, ../shared/geometry-format.md "Axle file and axle
// sweeps"): heave and roll apply the corner sweeps to both sides at the same travel or roll; steer moves both
// rack ends together by steering-wheel angle. The axle's own keys: the roll centre from both sides' front-view
// lines, the road-wheel angles, Ackermann, the overall steering ratio and the turning circle; and, with an
// anti-roll bar, the bar's lever angles, twist and installation ratio.

import type { AntiRollBar, Steering } from '$lib/schemas/axle';
import { CornerSolver, SweepOptionsError, type CornerInput, type Sample, type SweepError, type VehicleInput } from './index';
import { gridCount } from './sweep';
import { MAX_SAMPLES } from './constants';

export type AxleSweepKind = 'heave' | 'roll' | 'steer';

/** A validated axle (schemas/axle.ts) as the engine takes it. */
export interface AxleInput {
	left: CornerInput;
	right: CornerInput;
	steering?: Steering | null;
	anti_roll_bar?: AntiRollBar | null;
	vehicle?: VehicleInput | null;
}

/** An axle sweep: heave travel (mm), roll (degrees) or steering-wheel angle (degrees, + = the driver turns left). */
export interface AxleSweepOptions {
	sweep: AxleSweepKind;
	from: number;
	to: number;
	step: number;
	/** steering-wheel angle held through a heave or roll sweep (degrees; needs `steering`), default 0 */
	steering_wheel?: number;
	points?: boolean;
}

/** One axle sample: both sides' corner samples and the axle's own keys (null where they do not apply). */
export interface AxleSample {
	travel?: number;
	roll?: number;
	steering_wheel?: number;
	left: Sample;
	right: Sample;
	rc: [number, number] | null;
	delta_left: number | null;
	delta_right: number | null;
	ackermann: number | null;
	steering_ratio: number | null;
	turning_circle: number | null;
	/** with an anti-roll bar: bar twist (degrees, left lever angle minus right, + = left lever turned further about +y) */
	bar_twist?: number | null;
}

export interface AxleSweepError extends SweepError {
	side: 'left' | 'right';
}

export interface AxleSweepResult {
	samples: AxleSample[];
	error: AxleSweepError | null;
}

/** Contract: the Ackermann figure and the turning circle need the outer wheel steered at least this much (degrees). */
const MIN_OUTER_DEG = 0.1;
/** Lines closer to parallel than this (rad) have no meeting point (contract, as fvic). */
const PARALLEL_RAD = 1e-9;
const RAD = Math.PI / 180;

/** Where the front-view lines from each contact point through its side's fvic meet ([y, z]), or null. */
export function rollCentre(cl: readonly number[], fl: readonly number[] | null, cr: readonly number[], fr: readonly number[] | null): [number, number] | null {
	if (!fl || !fr) return null;
	const ay = fl[0] - cl[1];
	const az = fl[1] - cl[2];
	const by = fr[0] - cr[1];
	const bz = fr[1] - cr[2];
	const cross = ay * bz - az * by;
	const la = Math.hypot(ay, az);
	const lb = Math.hypot(by, bz);
	if (la === 0 || lb === 0 || Math.abs(cross) / (la * lb) < Math.sin(PARALLEL_RAD)) return null;
	// cl + s·a = cr + u·b, in the y–z plane
	const s = ((cr[1] - cl[1]) * bz - (cr[2] - cl[2]) * by) / cross;
	return [cl[1] + s * ay, cl[2] + s * az];
}

/**
 * Ackermann percent of the contract: 100 · (δi − δo) / (δi* − δo), δi* = atan(L / (L / tan δo − t)), the inner wheel
 * the one on the side of the turn; null when |δo| < 0.1°. Angles in degrees, + = steers left.
 */
export function ackermannPercent(deltaLeft: number, deltaRight: number, wheelbase: number, track: number): number | null {
	const left = deltaLeft + deltaRight >= 0; // a left turn: the left wheel is the inner one
	const di = left ? deltaLeft : -deltaRight;
	const dout = left ? deltaRight : -deltaLeft;
	if (Math.abs(dout) < MIN_OUTER_DEG) return null;
	const ideal = Math.atan(wheelbase / (wheelbase / Math.tan(dout * RAD) - track)) / RAD;
	const span = ideal - dout;
	return Math.abs(span) < 1e-12 ? null : (100 * (di - dout)) / span;
}

/** Turning circle (m) of the outer front contact point, 2 · L / sin δo (rear wheels unsteered, no slip: common practice). */
export function turningCircle(deltaLeft: number, deltaRight: number, wheelbase: number): number | null {
	const left = deltaLeft + deltaRight >= 0;
	const dout = left ? deltaRight : -deltaLeft;
	if (Math.abs(dout) < MIN_OUTER_DEG) return null;
	return (2 * wheelbase) / Math.sin(Math.abs(dout) * RAD) / 1000;
}

/** The bar's lever angle (rad, about +y through the bar axis) that keeps the drop link at its length; NaN when it cannot reach. */
export function leverAngle(pivot: readonly number[], arm: readonly number[], linkLength: number, link: readonly number[], near: number): number {
	// the lever end turns on a circle in the plane y = arm_y about (pivot_x, pivot_z)
	const rx = arm[0] - pivot[0];
	const rz = arm[2] - pivot[2];
	const r = Math.hypot(rx, rz);
	const dy = link[1] - arm[1];
	const rho2 = linkLength * linkLength - dy * dy;
	if (rho2 < 0) return NaN;
	const rho = Math.sqrt(rho2);
	const cx = link[0] - pivot[0];
	const cz = link[2] - pivot[2];
	const d = Math.hypot(cx, cz);
	if (d > r + rho || d < Math.abs(r - rho) || d === 0) return NaN;
	// the two circle intersections, as angles of the lever measured like θ0 (rotation about +y turns x toward −z)
	const a = (r * r - rho * rho + d * d) / (2 * d);
	const h = Math.sqrt(Math.max(0, r * r - a * a));
	const ux = cx / d;
	const uz = cz / d;
	const base = Math.atan2(-rz, rx);
	let best = NaN;
	for (const sgn of [1, -1]) {
		const px = a * ux - sgn * h * uz;
		const pz = a * uz + sgn * h * ux;
		let th = Math.atan2(-pz, px) - base;
		th = Math.atan2(Math.sin(th - near), Math.cos(th - near)) + near;
		if (Number.isNaN(best) || Math.abs(th - near) < Math.abs(best - near)) best = th;
	}
	return best;
}

/** A side's anti-roll bar points (the left ones as given, the right ones mirrored) and its drop link's length at design. */
function barSide(bar: AntiRollBar, side: 'left' | 'right') {
	const f = (p: readonly number[]): [number, number, number] => (side === 'left' ? [p[0], p[1], p[2]] : [p[0], -p[1], p[2]]);
	const arm = f(bar.arm_end);
	const link = f(bar.link_end);
	return { pivot: f(bar.pivot), arm, link, length: Math.hypot(link[0] - arm[0], link[1] - arm[1], link[2] - arm[2]) };
}

/** The name under which a side's drop-link end is carried through the corner solve. */
const LINK_POINT = 'arb.link_end';

/** Both corners of an axle, compiled once, with the steering system and the anti-roll bar. */
export class AxleSolver {
	readonly left: CornerSolver;
	readonly right: CornerSolver;
	readonly steering: Steering | null;
	readonly bar: AntiRollBar | null;
	readonly wheelbase: number | null;
	/** design contact points and toe of each side */
	readonly design: { left: Sample; right: Sample };
	/** y distance between the two design contact points (mm) */
	readonly track: number;

	constructor(axle: AxleInput) {
		this.bar = axle.anti_roll_bar ?? null;
		const attach = (side: 'left' | 'right'): CornerInput => {
			const corner = side === 'left' ? axle.left : axle.right;
			const withVehicle = axle.vehicle ? { ...corner, vehicle: axle.vehicle } : corner;
			if (!this.bar) return withVehicle;
			if (this.bar.link_on === 'rocker' && !corner.rocker) throw new SweepOptionsError(`anti_roll_bar.link_on: the ${side} corner has no rocker to carry the drop link`);
			return { ...withVehicle, attached: [...(corner.attached ?? []), { name: LINK_POINT, body: this.bar.link_on, at: barSide(this.bar, side).link }] };
		};
		this.left = new CornerSolver(attach('left'));
		this.right = new CornerSolver(attach('right'));
		this.steering = axle.steering ?? null;
		this.wheelbase = axle.vehicle?.wheelbase ?? axle.left.vehicle?.wheelbase ?? null;
		const at0 = { sweep: 'heave' as const, from: 0, to: 0, step: 1 };
		const l = this.left.sweep(at0).samples[0];
		const r = this.right.sweep(at0).samples[0];
		if (!l || !r) throw new SweepOptionsError('the axle cannot be assembled at its design position');
		this.design = { left: l, right: r };
		this.track = Math.abs(l.contact_patch[1] - r.contact_patch[1]);
	}

	/** Rack travel (mm along +y) for a steering-wheel angle (degrees); throws without a steering system. */
	rackFor(steeringWheel: number): number {
		if (!this.steering) throw new SweepOptionsError('steering: this axle has no steering system (rack travel per turn)');
		return ((steeringWheel / 360) * this.steering.rack_travel_per_turn) * (this.steering.rack_left_turn === '+y' ? 1 : -1);
	}

	/** Solve an axle sweep; throws SweepOptionsError for a request outside the contract. */
	sweep(o: AxleSweepOptions): AxleSweepResult {
		for (const k of ['from', 'to', 'step'] as const) if (!Number.isFinite(o[k])) throw new SweepOptionsError(`${k}: must be a finite number`);
		if (!(o.step > 0)) throw new SweepOptionsError('step: must be > 0');
		if (!(o.from <= o.to)) throw new SweepOptionsError('from: must be <= to');
		const n = gridCount(o.from, o.to, o.step);
		if (n > MAX_SAMPLES) throw new SweepOptionsError(`step: more than ${MAX_SAMPLES} positions`);
		const points = !!(o.points || this.bar);
		if (o.sweep === 'steer') return this.steer(o, n, points);
		const rack = o.steering_wheel ? this.rackFor(o.steering_wheel) : 0;
		const spec = { sweep: o.sweep, from: o.from, to: o.to, step: o.step, rack, points };
		const l = this.left.sweep(spec);
		const r = this.right.sweep(spec);
		const key = o.sweep === 'heave' ? 'travel' : 'roll';
		const rights = new Map(r.samples.map((s) => [s[key] as number, s]));
		const samples: AxleSample[] = [];
		for (const ls of l.samples) {
			const rs = rights.get(ls[key] as number);
			if (!rs) continue;
			samples.push(this.sampleOf({ [key]: ls[key] }, ls, rs, null, !!o.points));
		}
		return { samples, error: this.errorOf(l.error, r.error) };
	}

	/** A steer sweep by steering-wheel angle: both rack ends together, wheel centres at design height. */
	private steer(o: AxleSweepOptions, n: number, points: boolean): AxleSweepResult {
		const k = this.rackFor(1);
		const last = o.from + (n - 1) * o.step;
		const run = (shift: number) => {
			const a = k * (o.from + shift);
			const b = k * (last + shift);
			const spec = { sweep: 'steer' as const, from: Math.min(a, b), to: Math.max(a, b), step: Math.abs(k) * o.step, points };
			const byWheel = (res: ReturnType<CornerSolver['sweep']>) => new Map(res.samples.map((s) => [Math.round(((s.rack as number) / k - shift) * 1e6) / 1e6, s]));
			const l = this.left.sweep(spec);
			const r = this.right.sweep(spec);
			return { left: byWheel(l), right: byWheel(r), error: this.errorOf(l.error, r.error, k) };
		};
		const mid = run(0);
		const minus = run(-1);
		const plus = run(1);
		const samples: AxleSample[] = [];
		for (let i = 0; i < n; i++) {
			const sw = Math.round((o.from + i * o.step) * 1e6) / 1e6;
			const ls = mid.left.get(sw);
			const rs = mid.right.get(sw);
			if (!ls || !rs) continue;
			// overall steering ratio: d(steering wheel) / d(mean road-wheel angle), central difference over ±1°
			const lm = minus.left.get(sw);
			const rm = minus.right.get(sw);
			const lp = plus.left.get(sw);
			const rp = plus.right.get(sw);
			let ratio: number | null = null;
			if (lm && rm && lp && rp) {
				const dm = (this.deltaLeft(lp) + this.deltaRight(rp) - this.deltaLeft(lm) - this.deltaRight(rm)) / 2;
				ratio = Math.abs(dm) > 1e-12 ? 2 / dm : null;
			}
			samples.push(this.sampleOf({ steering_wheel: sw }, ls, rs, ratio, !!o.points));
		}
		return { samples, error: mid.error };
	}

	/** Road-wheel angle of the left wheel (degrees, + = steers left): −(toe − design toe). */
	private deltaLeft(s: Sample) {
		return -(s.toe - this.design.left.toe);
	}
	/** Road-wheel angle of the right wheel (degrees, + = steers left): +(toe − design toe). */
	private deltaRight(s: Sample) {
		return s.toe - this.design.right.toe;
	}

	private sampleOf(head: Partial<AxleSample>, l: Sample, r: Sample, ratio: number | null, keepPoints: boolean): AxleSample {
		const steer = head.steering_wheel !== undefined;
		const dl = steer ? this.deltaLeft(l) : null;
		const dr = steer ? this.deltaRight(r) : null;
		const L = this.wheelbase;
		// built property by property in one order (an object spread here cost several µs a sample)
		const out = head as AxleSample;
		out.left = l;
		out.right = r;
		out.rc = steer ? null : rollCentre(l.contact_patch, l.fvic, r.contact_patch, r.fvic);
		out.delta_left = dl;
		out.delta_right = dr;
		out.ackermann = steer && L ? ackermannPercent(dl!, dr!, L, this.track) : null;
		out.steering_ratio = ratio;
		out.turning_circle = steer && L ? turningCircle(dl!, dr!, L) : null;
		if (this.bar) out.bar_twist = this.twist(l, r);
		if (!keepPoints) {
			out.left = strip(l);
			out.right = strip(r);
		}
		return out;
	}

	/** Left lever angle minus right (degrees) at this pose; null when a drop link cannot reach. */
	private twist(l: Sample, r: Sample): number | null {
		const bar = this.bar!;
		const angle = (side: 'left' | 'right', s: Sample) => {
			const b = barSide(bar, side);
			const link = s.points?.[LINK_POINT];
			return link ? leverAngle(b.pivot, b.arm, b.length, link, 0) : NaN;
		};
		const t = (angle('left', l) - angle('right', r)) / RAD;
		return Number.isFinite(t) ? t : null;
	}

	private errorOf(l: SweepError | null, r: SweepError | null, k = 1): AxleSweepError | null {
		const e = l ? { ...l, side: 'left' as const } : r ? { ...r, side: 'right' as const } : null;
		if (!e) return null;
		if (e.sweep === 'steer') {
			const sw = Math.round((e.position / k) * 1e6) / 1e6;
			return { ...e, position: sw, message: `${e.side} ${e.link} cannot be assembled at steering wheel ${sw}°` };
		}
		return { ...e, message: `${e.side} ${e.message}` };
	}
}

/** A corner sample without the solver-only extras (points, spring length) unless asked for. */
function strip(s: Sample): Sample {
	if (!s.points) return s;
	const { points: _p, spring_length: _s, ...rest } = s;
	return rest as Sample;
}

/**
 * The anti-roll bar's figures at design, from a ±1 mm single-wheel heave of each side: the lever's turn per mm of
 * wheel travel (deg/mm), the installation ratio (lever-end travel per wheel travel), the bar twist per mm of
 * opposite wheel travel (each wheel 1 mm, one up one down) and the bar's roll stiffness for the axle
 * (N·m/deg: by virtual work, K_φ = K_bar · (dθ/dz · t)² with dθ/dz the mean lever rate in rad/mm and t the track).
 */
export function barFigures(axle: AxleSolver): { lever_rate_left: number; lever_rate_right: number; installation_ratio: number; twist_per_mm: number; roll_stiffness: number } | null {
	const bar = axle.bar;
	if (!bar) return null;
	const spec = { sweep: 'heave' as const, from: -1, to: 1, step: 1, points: true };
	const rate = (side: 'left' | 'right') => {
		const res = (side === 'left' ? axle.left : axle.right).sweep(spec);
		if (res.samples.length !== 3) return NaN;
		const b = barSide(bar, side);
		const lo = leverAngle(b.pivot, b.arm, b.length, res.samples[0].points![LINK_POINT], 0);
		const hi = leverAngle(b.pivot, b.arm, b.length, res.samples[2].points![LINK_POINT], 0);
		return (hi - lo) / 2; // rad per mm
	};
	const rl = rate('left');
	const rr = rate('right');
	if (!Number.isFinite(rl) || !Number.isFinite(rr)) return null;
	const lever = Math.hypot(bar.arm_end[0] - bar.pivot[0], bar.arm_end[2] - bar.pivot[2]);
	const mean = (Math.abs(rl) + Math.abs(rr)) / 2;
	const kBarRad = bar.torsional_stiffness / RAD; // N·m per rad
	return {
		lever_rate_left: rl / RAD,
		lever_rate_right: rr / RAD,
		installation_ratio: lever * mean,
		twist_per_mm: (Math.abs(rl) + Math.abs(rr)) / RAD,
		roll_stiffness: kBarRad * (mean * axle.track) ** 2 * RAD
	};
}

/**
 * The first wheel travel (mm) in from…to at which a side's drop link cannot reach the bar lever (the lever end's
 * circle and the link's sphere do not meet), as { side, travel }; null when it reaches throughout.
 */
export function barReach(axle: AxleSolver, from = -50, to = 50, step = 5): { side: 'left' | 'right'; travel: number } | null {
	const bar = axle.bar;
	if (!bar) return null;
	for (const side of ['left', 'right'] as const) {
		const res = (side === 'left' ? axle.left : axle.right).sweep({ sweep: 'heave', from, to, step, points: true });
		const b = barSide(bar, side);
		for (const s of res.samples) if (Number.isNaN(leverAngle(b.pivot, b.arm, b.length, s.points![LINK_POINT], 0))) return { side, travel: s.travel! };
	}
	return null;
}
