// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height,
// y = 0 centreline; lengths in mm, angles in radians.
// The model of each corner kind, precomputed once from a contract-format geometry file.

import { TINY, ZERO_LENGTH_MM } from './constants';
import { copy, cross, dot, len, normalize, sub, vec3, type Vec3 } from './vec3';

/** A point as it appears in the geometry file: [x, y, z] in mm. */
export type PointTuple = [number, number, number];

/** The vehicle block of a geometry file (lengths mm, fractions 0..1). */
export interface VehicleInput {
	axle: 'front' | 'rear';
	wheelbase: number;
	cg_height: number;
	front_brake_fraction?: number;
	rear_drive_fraction?: number;
}

/** A corner as in a `corner-geometry/1` file (already validated by the shared schema). */
export interface CornerInput {
	kind: 'double_wishbone' | 'strut';
	points: Record<string, PointTuple>;
	spring_on?: 'lower' | 'upper' | 'upright';
	tyre: { loaded_radius: number };
	vehicle?: VehicleInput | null;
	name?: string;
}

/** Corner kinds as numbers for the hot loop. */
export const KIND_DOUBLE_WISHBONE = 0;
export const KIND_STRUT = 1;

/** Which body carries spring.body. */
export const SPRING_NONE = 0;
export const SPRING_LOWER = 1;
export const SPRING_UPPER = 2;
export const SPRING_UPRIGHT = 3;

/** An arm turning about its chassis pivot axis: a point p(θ) = c + cos θ r + sin θ (e × r). */
export interface ArmCircle {
	/** unit pivot axis, front pivot to rear pivot */
	e: Vec3;
	/** a point on the pivot axis (the front pivot), mm */
	pivot: Vec3;
	/** centre of the ball joint's circle, mm */
	c: Vec3;
	/** design radius vector from c to the ball joint, mm */
	r: Vec3;
	/** e × r, mm */
	s: Vec3;
}

/** The precomputed model a solve works on. Body vectors are relative to design lower.outer. */
export interface CornerModel {
	kind: number;
	/** +1 left corner, -1 right */
	side: number;
	tyreRadius: number;
	lower: ArmCircle;
	/** double wishbone only (zero-filled for a strut) */
	upper: ArmCircle;
	/** design lower.outer, mm */
	L0: Vec3;
	/** double wishbone: design upper.outer − lower.outer, mm, and as a unit vector */
	bodyU: Vec3;
	bodyUnitU: Vec3;
	/** squared radius of the upper ball joint's circle, mm² */
	upperRadius2: number;
	/** strut: strut.top (chassis), mm */
	strutTop: Vec3;
	/** strut: body vector strut.lower − lower.outer, mm */
	bodySL: Vec3;
	/** strut: unit strut axis in the upright, strut.lower toward strut.top */
	strutAxis0: Vec3;
	/** strut: design distance strut.lower to strut.top, mm */
	strutTau0: number;
	/** steer.outer body vector, mm */
	bodyT: Vec3;
	/** wheel.centre body vector, mm */
	bodyW: Vec3;
	/** unit spin axis pointing outboard, in the upright */
	spinAxis0: Vec3;
	/** wheel.centre to wheel.axis_inner distance, mm */
	spinAxisLength: number;
	/** design steer.inner, mm */
	steerInner0: Vec3;
	tieRodLength: number;
	/** upright length lower.outer to upper.outer (double wishbone), mm */
	kingpinLength: number;
	springOn: number;
	springChassis: Vec3;
	/** spring.body: arm circle (lower/upper) or body vector (upright) */
	springBody: ArmCircle;
	bodySpring: Vec3;
	/** design wheel centre z, mm */
	wheelCentreZ0: number;
	/** design contact point, mm */
	contact0: Vec3;
	vehicle: { front: boolean; wheelbase: number; cgHeight: number; fraction: number } | null;
	/** design points as given, for the optional per-sample point list */
	points: Record<string, PointTuple>;
}

/** A corner that cannot be modelled: the field at fault and why. */
export interface CornerFault {
	field: string;
	message: string;
}

/** Point `name` of the file as a vector, or null when absent. */
function pt(input: CornerInput, name: string): Vec3 | null {
	const p = input.points[name];
	return p ? vec3(p[0], p[1], p[2]) : null;
}

/** The circle `point` sweeps about the axis front→rear (mm); null when the arm has zero length. */
export function armCircle(front: Vec3, rear: Vec3, point: Vec3): ArmCircle | null {
	const e = vec3();
	if (!normalize(e, sub(vec3(), rear, front), ZERO_LENGTH_MM)) return null;
	const fp = sub(vec3(), point, front);
	const k = dot(fp, e);
	const c = vec3(front[0] + k * e[0], front[1] + k * e[1], front[2] + k * e[2]);
	const r = sub(vec3(), point, c);
	if (len(r) <= ZERO_LENGTH_MM) return null;
	return { e, pivot: copy(vec3(), front), c, r, s: cross(vec3(), e, r) };
}

/** A zero circle, for arms a kind does not have. */
function noCircle(): ArmCircle {
	return { e: vec3(), pivot: vec3(), c: vec3(), r: vec3(), s: vec3() };
}

/** Lowest point of the wheel (centre w, unit axis a, radius of m's tyre) against a ground of unit normal n. */
export function contactPoint(out: Vec3, w: Vec3, a: Vec3, n: Vec3, m: { tyreRadius: number }): boolean {
	const radius = m.tyreRadius;
	const na = n[0] * a[0] + n[1] * a[1] + n[2] * a[2];
	const px = n[0] - na * a[0];
	const py = n[1] - na * a[1];
	const pz = n[2] - na * a[2];
	const l = Math.sqrt(px * px + py * py + pz * pz);
	if (!(l > TINY)) return false;
	out[0] = w[0] - (radius * px) / l;
	out[1] = w[1] - (radius * py) / l;
	out[2] = w[2] - (radius * pz) / l;
	return true;
}

/** Build the model of `input`; a CornerFault names the field when the geometry is degenerate. */
export function compileCorner(input: CornerInput): CornerModel | CornerFault {
	const need = (n: string): Vec3 => {
		const p = pt(input, n);
		if (!p) throw { field: `points.${n}`, message: 'missing' } satisfies CornerFault;
		return p;
	};
	try {
		return build(input, need);
	} catch (e) {
		if (e && typeof e === 'object' && 'field' in e) return e as CornerFault;
		throw e;
	}
}

/** Throw a CornerFault for `field`. */
function fault(field: string, message: string): never {
	throw { field, message } satisfies CornerFault;
}

/** The model proper; `need` fetches a required point. */
function build(input: CornerInput, need: (n: string) => Vec3): CornerModel {
	const strut = input.kind === 'strut';
	const L0 = need('lower.outer');
	const lower = armCircle(need('lower.front'), need('lower.rear'), L0);
	if (!lower) fault('points.lower.outer', 'lower arm has zero length or coincident pivots');
	const W0 = need('wheel.centre');
	const A0 = need('wheel.axis_inner');
	const side = W0[1] > 0 ? 1 : W0[1] < 0 ? -1 : fault('points.wheel.centre', 'y must not be 0');
	const spinAxis0 = vec3();
	if (!normalize(spinAxis0, sub(vec3(), W0, A0), ZERO_LENGTH_MM))
		fault('points.wheel.axis_inner', 'spin axis has zero length');
	if (side * spinAxis0[1] <= 0) fault('points.wheel.axis_inner', 'must lie inboard of the wheel centre');
	const T0 = need('steer.outer');
	const S0 = need('steer.inner');
	const tieRodLength = len(sub(vec3(), T0, S0));
	if (tieRodLength <= ZERO_LENGTH_MM) fault('points.steer.outer', 'tie rod has zero length');
	const m: CornerModel = {
		kind: strut ? KIND_STRUT : KIND_DOUBLE_WISHBONE,
		side,
		tyreRadius: input.tyre.loaded_radius,
		lower: lower!,
		upper: noCircle(),
		L0,
		bodyU: vec3(),
		bodyUnitU: vec3(),
		upperRadius2: 0,
		strutTop: vec3(),
		bodySL: vec3(),
		strutAxis0: vec3(),
		strutTau0: 0,
		bodyT: sub(vec3(), T0, L0),
		bodyW: sub(vec3(), W0, L0),
		spinAxis0,
		spinAxisLength: len(sub(vec3(), W0, A0)),
		steerInner0: S0,
		tieRodLength,
		kingpinLength: 0,
		springOn: 0,
		springChassis: vec3(),
		springBody: noCircle(),
		bodySpring: vec3(),
		wheelCentreZ0: W0[2],
		contact0: vec3(),
		vehicle: vehicleOf(input),
		points: input.points
	};
	if (strut) buildStrut(m, need);
	else buildWishbone(m, need);
	buildSpring(m, input);
	if (!contactPoint(m.contact0, W0, spinAxis0, vec3(0, 0, 1), m))
		fault('points.wheel.axis_inner', 'wheel lies flat');
	return m;
}

/** Upper arm and upright of a double wishbone. */
function buildWishbone(m: CornerModel, need: (n: string) => Vec3): void {
	const U0 = need('upper.outer');
	const upper = armCircle(need('upper.front'), need('upper.rear'), U0);
	if (!upper) fault('points.upper.outer', 'upper arm has zero length or coincident pivots');
	m.upper = upper;
	sub(m.bodyU, U0, m.L0);
	m.kingpinLength = len(m.bodyU);
	if (m.kingpinLength <= ZERO_LENGTH_MM) fault('points.upper.outer', 'coincides with lower.outer');
	normalize(m.bodyUnitU, m.bodyU, 0);
	m.upperRadius2 = dot(upper.r, upper.r);
}

/** Strut top mount and the strut axis fixed in the upright. */
function buildStrut(m: CornerModel, need: (n: string) => Vec3): void {
	const top = need('strut.top');
	const lowerPt = need('strut.lower');
	copy(m.strutTop, top);
	sub(m.bodySL, lowerPt, m.L0);
	m.strutTau0 = len(sub(vec3(), top, lowerPt));
	if (!normalize(m.strutAxis0, sub(vec3(), top, lowerPt), ZERO_LENGTH_MM))
		fault('points.strut.lower', 'coincides with strut.top');
	if (len(sub(vec3(), top, m.L0)) <= ZERO_LENGTH_MM) fault('points.strut.top', 'coincides with lower.outer');
}

/** Spring ends and the body that carries spring.body. */
function buildSpring(m: CornerModel, input: CornerInput): void {
	const sc = pt(input, 'spring.chassis');
	const sb = pt(input, 'spring.body');
	if (!sc || !sb) return;
	copy(m.springChassis, sc);
	const on = input.spring_on ?? fault('spring_on', 'required when spring points are given');
	if (on === 'upright') {
		m.springOn = SPRING_UPRIGHT;
		sub(m.bodySpring, sb, m.L0);
		return;
	}
	const arm = on === 'lower' ? m.lower : on === 'upper' && m.kind === KIND_DOUBLE_WISHBONE ? m.upper : null;
	if (!arm) fault('spring_on', `'${on}' is not a body of this corner kind`);
	const circle = armCircle(arm.pivot, addPivot(arm), sb);
	m.springOn = on === 'lower' ? SPRING_LOWER : SPRING_UPPER;
	// A spring end on the pivot axis does not move; keep a zero circle centred on it.
	m.springBody = circle ?? { ...noCircle(), c: copy(vec3(), sb) };
}

/** A second point on an arm's pivot axis (pivot + e), mm. */
function addPivot(arm: ArmCircle): Vec3 {
	return vec3(arm.pivot[0] + arm.e[0], arm.pivot[1] + arm.e[1], arm.pivot[2] + arm.e[2]);
}

/** The vehicle figures anti-dive / anti-squat need, or null. */
function vehicleOf(input: CornerInput): CornerModel['vehicle'] {
	const v = input.vehicle;
	if (!v) return null;
	const front = v.axle === 'front';
	const fraction = front ? (v.front_brake_fraction ?? 0) : (v.rear_drive_fraction ?? 1);
	return { front, wheelbase: v.wheelbase, cgHeight: v.cg_height, fraction };
}

/** True when `m` is a fault rather than a model. */
export function isFault(m: CornerModel | CornerFault): m is CornerFault {
	return 'field' in m;
}
