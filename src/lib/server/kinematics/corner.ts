// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height,
// y = 0 centreline; lengths in mm, angles in radians.
// The plan compiler's second half: a kind's description plus a corner's points → the model the
// solve steps work on (circles, body vectors, rods, the rocker), once per geometry.

import { joinRocker, kindSpec, ROCKER_POINTS, SPRING_POINTS, type BodyName, type KindSpec } from '../../kinds';
import { TINY, ZERO_LENGTH_MM } from './constants';
import { CHAIN_ARMS, CHAIN_REVOLUTE, CHAIN_RODS, CHAIN_SLIDER, planOf, type Plan } from './plan';
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

/** The rocker block of a geometry file (contract: "Rocker (pushrod or pullrod)"). */
export interface RockerInput {
	pivot_a: PointTuple;
	pivot_b: PointTuple;
	rod_end: PointTuple;
	spring_end: PointTuple;
	rod_outer: PointTuple;
	rod_on: 'lower' | 'upper' | 'upright' | 'arm';
}

/** A corner as in a `corner-geometry/1` file (already validated by the shared schema). */
export interface CornerInput {
	kind: string;
	points: Record<string, PointTuple>;
	spring_on?: 'lower' | 'upper' | 'upright' | 'arm';
	rocker?: RockerInput | null;
	tyre: { loaded_radius: number };
	vehicle?: VehicleInput | null;
	name?: string;
	/** extra points carried by a body of this corner (an anti-roll bar's drop-link end), output with `points` */
	attached?: { name: string; body: 'lower' | 'upper' | 'upright' | 'rocker'; at: PointTuple }[];
}

export { CHAIN_ARMS, CHAIN_REVOLUTE, CHAIN_RODS, CHAIN_SLIDER } from './plan';

/** Which body moves a spring end or the rocker's rod: an arm turning by θ or φ, the upright, the rocker. */
export const SPRING_NONE = 0;
export const SPRING_LOWER = 1;
export const SPRING_UPPER = 2;
export const SPRING_UPRIGHT = 3;
export const SPRING_ROCKER = 4;

/** Bodies a point is carried by, for the per-sample point list. */
export const B_CHASSIS = 0;
export const B_RACK = 1;
export const B_LOWER = 2;
export const B_UPPER = 3;
export const B_UPRIGHT = 4;
export const B_ROCKER = 5;

/** Where the steering axis comes from. */
export const AXIS_POINTS = 0;
export const AXIS_VIRTUAL = 1;
export const AXIS_NONE = 2;

/** Instant centres by arm planes (contract for double wishbone and strut) or from the motion. */
export const IC_PLANES = 0;
export const IC_MOTION = 1;

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

/** The rocker: its rod end and spring end on circles about its pivot axis, and where its rod's outer end rides. */
export interface RockerModel {
	rodEnd: ArmCircle;
	springEnd: ArmCircle;
	/** SPRING_LOWER / SPRING_UPPER (a circle about that arm) or SPRING_UPRIGHT (a body vector) */
	rodOn: number;
	rodOuterCircle: ArmCircle;
	rodOuterBody: Vec3;
	rodLength: number;
	/** spring.chassis given: the spring runs from it to spring_end */
	hasSpring: boolean;
}

/** A point of the per-sample point list: its name, the body carrying it, and its design position (mm). */
export interface OutPoint {
	name: string;
	body: number;
	design: Vec3;
}

/** The precomputed model a solve works on. Body vectors are relative to the design origin L0. */
export interface CornerModel {
	kind: string;
	chain: number;
	/** +1 left corner, -1 right */
	side: number;
	tyreRadius: number;
	/** the driving arm (arms, slider, revolute chains) */
	lower: ArmCircle;
	/** the second arm (arms chain; zero-filled otherwise) */
	upper: ArmCircle;
	/** design origin of the upright's body vectors: the driving ball joint, the arm's pivot (revolute), the wheel centre (rods) */
	L0: Vec3;
	/** arms chain: design second ball joint − origin, mm, and as a unit vector */
	bodyU: Vec3;
	bodyUnitU: Vec3;
	/** squared radius of the second ball joint's circle, mm² */
	upperRadius2: number;
	/** slider: the strut's top mount (chassis), mm */
	strutTop: Vec3;
	/** slider: body vector strut.lower − origin, mm */
	bodySL: Vec3;
	/** slider: unit strut axis in the upright, strut.lower toward strut.top */
	strutAxis0: Vec3;
	/** slider: design distance strut.lower to strut.top, mm */
	strutTau0: number;
	/** the closing rod's outer end as a body vector (arms, slider), mm */
	bodyT: Vec3;
	/** wheel.centre body vector, mm */
	bodyW: Vec3;
	/** unit spin axis pointing outboard, in the upright */
	spinAxis0: Vec3;
	/** wheel.centre to wheel.axis_inner distance, mm */
	spinAxisLength: number;
	/** design inner end of the closing rod (arms, slider), mm */
	steerInner0: Vec3;
	tieRodLength: number;
	/** arms chain: distance between the two ball joints, mm */
	kingpinLength: number;
	/** rods chain: 5 rods, inner ends (chassis, design; the rack's moves with the rack), outer body vectors, lengths² */
	rodInner: Float64Array;
	rodBody: Float64Array;
	rodLength2: Float64Array;
	/** rods chain: index of the rod whose inner end is on the rack, or -1 */
	rackRod: number;
	/** a steer sweep applies */
	steers: boolean;
	axis: number;
	/** virtual axis: rod indices of the lower pair and the upper pair */
	axisRods: Int32Array;
	icMode: number;
	springOn: number;
	springChassis: Vec3;
	/** spring.body: arm circle (lower/upper) or body vector (upright) */
	springBody: ArmCircle;
	bodySpring: Vec3;
	rocker: RockerModel | null;
	/** design wheel centre z, mm */
	wheelCentreZ0: number;
	/** design contact point, mm */
	contact0: Vec3;
	vehicle: { front: boolean; wheelbase: number; cgHeight: number; fraction: number } | null;
	/** the link each failure code names (index = FAIL_* code of solve.ts; 7.. the rods chain's rods) */
	failNames: string[];
	/** the points of the per-sample list, in the kind's order */
	outPoints: OutPoint[];
	/** design points as given (rocker points under their table names `rocker.*`) */
	points: Record<string, PointTuple>;
}

/** A corner that cannot be modelled: the field at fault and why. */
export interface CornerFault {
	field: string;
	message: string;
}

/** The corner's points with the rocker block's points under their table names (`rocker.pivot_a`, ...). */
export function flatPoints(input: CornerInput): Record<string, PointTuple> {
	return joinRocker(input.points, input.rocker);
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

/** A circle about `arm`'s axis through `point`; a point on the axis keeps a zero circle centred on it. */
function circleOn(arm: ArmCircle, point: Vec3): ArmCircle {
	const rear = vec3(arm.pivot[0] + arm.e[0], arm.pivot[1] + arm.e[1], arm.pivot[2] + arm.e[2]);
	return armCircle(arm.pivot, rear, point) ?? { ...noCircle(), e: copy(vec3(), arm.e), pivot: copy(vec3(), arm.pivot), c: copy(vec3(), point) };
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
	try {
		const spec = kindSpec(input.kind);
		return build(input, spec, planOf(spec));
	} catch (e) {
		if (e && typeof e === 'object' && 'field' in e) return e as CornerFault;
		if (e instanceof Error && e.message.startsWith('unknown suspension kind')) return { field: 'kind', message: e.message };
		throw e;
	}
}

/** Throw a CornerFault for `field`. */
function fault(field: string, message: string): never {
	throw { field, message } satisfies CornerFault;
}

/** The field path of point `name` (rocker points live in the `rocker` block). */
function fieldOf(name: string): string {
	return name.startsWith('rocker.') ? `rocker.${name.slice(7)}` : `points.${name}`;
}

/** The model proper. */
function build(input: CornerInput, spec: KindSpec, plan: Plan): CornerModel {
	const points = flatPoints(input);
	const need = (n: string): Vec3 => {
		const p = points[n];
		if (!p) fault(fieldOf(n), 'missing');
		return vec3(p[0], p[1], p[2]);
	};
	for (const q of spec.points) need(q.name);
	const W0 = need('wheel.centre');
	const A0 = need('wheel.axis_inner');
	const side = W0[1] > 0 ? 1 : W0[1] < 0 ? -1 : fault('points.wheel.centre', 'y must not be 0');
	const spinAxis0 = vec3();
	if (!normalize(spinAxis0, sub(vec3(), W0, A0), ZERO_LENGTH_MM)) fault('points.wheel.axis_inner', 'spin axis has zero length');
	if (side * spinAxis0[1] <= 0) fault('points.wheel.axis_inner', 'must lie inboard of the wheel centre');
	const m: CornerModel = {
		kind: spec.kind,
		chain: plan.chain,
		side,
		tyreRadius: input.tyre.loaded_radius,
		lower: noCircle(),
		upper: noCircle(),
		L0: vec3(),
		bodyU: vec3(),
		bodyUnitU: vec3(),
		upperRadius2: 0,
		strutTop: vec3(),
		bodySL: vec3(),
		strutAxis0: vec3(),
		strutTau0: 0,
		bodyT: vec3(),
		bodyW: vec3(),
		spinAxis0,
		spinAxisLength: len(sub(vec3(), W0, A0)),
		steerInner0: vec3(),
		tieRodLength: 0,
		kingpinLength: 0,
		rodInner: new Float64Array(15),
		rodBody: new Float64Array(15),
		rodLength2: new Float64Array(5),
		rackRod: -1,
		steers: spec.steers,
		axis: spec.steeringAxis.type === 'points' ? AXIS_POINTS : spec.steeringAxis.type === 'virtual' ? AXIS_VIRTUAL : AXIS_NONE,
		axisRods: new Int32Array(4),
		icMode: spec.instantCentres === 'motion' ? IC_MOTION : IC_PLANES,
		springOn: SPRING_NONE,
		springChassis: vec3(),
		springBody: noCircle(),
		bodySpring: vec3(),
		rocker: null,
		wheelCentreZ0: W0[2],
		contact0: vec3(),
		vehicle: vehicleOf(input),
		failNames: ['', 'upper arm', 'tie rod', 'strut', 'lower arm', 'wheel', 'pushrod'],
		outPoints: [],
		points
	};
	if (plan.chain === CHAIN_RODS) buildRods(m, spec, plan, need);
	else buildArms(m, plan, need);
	sub(m.bodyW, W0, m.L0);
	buildSpring(m, input, need);
	buildRocker(m, input, need);
	buildOutPoints(m, spec, input);
	if (!contactPoint(m.contact0, W0, spinAxis0, vec3(0, 0, 1), m)) fault('points.wheel.axis_inner', 'wheel lies flat');
	return m;
}

/** The driving arm, and the second arm, the strut or the rigid upright of the closed-form chains. */
function buildArms(m: CornerModel, plan: Plan, need: (n: string) => Vec3): void {
	const d = plan.driving!;
	const [front, rear] = d.axis;
	const origin = need(d.ball ?? front);
	const lower = armCircle(need(front), need(rear), d.ball ? origin : need('wheel.centre'));
	if (!lower) fault(`points.${d.ball ?? rear}`, `${d.body} arm has zero length or coincident pivots`);
	m.lower = lower;
	copy(m.L0, origin);
	if (plan.chain === CHAIN_REVOLUTE) {
		m.failNames[4] = plan.driving!.body === 'arm' ? 'trailing arm' : `${plan.driving!.body} arm`;
		return;
	}
	const rod = plan.rods[0];
	const T0 = need(rod.outer);
	const S0 = need(rod.inner);
	copy(m.steerInner0, S0);
	sub(m.bodyT, T0, m.L0);
	m.tieRodLength = len(sub(vec3(), T0, S0));
	if (m.tieRodLength <= ZERO_LENGTH_MM) fault(`points.${rod.outer}`, `${rod.link} has zero length`);
	m.failNames[2] = rod.link;
	if (plan.chain === CHAIN_SLIDER) buildSlider(m, plan.slider!, need);
	else buildSecond(m, plan.second!, need);
}

/** The second arm of the arms chain and the upright between the two ball joints. */
function buildSecond(m: CornerModel, second: NonNullable<Plan['second']>, need: (n: string) => Vec3): void {
	const U0 = need(second.ball);
	const upper = armCircle(need(second.axis[0]), need(second.axis[1]), U0);
	if (!upper) fault(`points.${second.ball}`, `${second.body} arm has zero length or coincident pivots`);
	m.upper = upper;
	sub(m.bodyU, U0, m.L0);
	m.kingpinLength = len(m.bodyU);
	if (m.kingpinLength <= ZERO_LENGTH_MM) fault(`points.${second.ball}`, 'coincides with the other ball joint');
	normalize(m.bodyUnitU, m.bodyU, 0);
	m.upperRadius2 = dot(upper.r, upper.r);
}

/** Strut top mount and the strut axis fixed in the upright. */
function buildSlider(m: CornerModel, slider: NonNullable<Plan['slider']>, need: (n: string) => Vec3): void {
	const top = need(slider.top);
	const lowerPt = need(slider.lower);
	copy(m.strutTop, top);
	sub(m.bodySL, lowerPt, m.L0);
	m.strutTau0 = len(sub(vec3(), top, lowerPt));
	if (!normalize(m.strutAxis0, sub(vec3(), top, lowerPt), ZERO_LENGTH_MM)) fault(`points.${slider.lower}`, `coincides with ${slider.top}`);
	if (len(sub(vec3(), top, m.L0)) <= ZERO_LENGTH_MM) fault(`points.${slider.top}`, 'coincides with the lower ball joint');
}

/** The five rods of the rods chain: inner ends, outer body vectors about the wheel centre, lengths. */
function buildRods(m: CornerModel, spec: KindSpec, plan: Plan, need: (n: string) => Vec3): void {
	copy(m.L0, need('wheel.centre'));
	plan.rods.forEach((rod, i) => {
		const inner = need(rod.inner);
		const outer = need(rod.outer);
		const l = len(sub(vec3(), outer, inner));
		if (l <= ZERO_LENGTH_MM) fault(`points.${rod.outer}`, `${rod.link} has zero length`);
		for (let k = 0; k < 3; k++) {
			m.rodInner[3 * i + k] = inner[k];
			m.rodBody[3 * i + k] = outer[k] - m.L0[k];
		}
		m.rodLength2[i] = l * l;
		m.failNames[7 + i] = rod.link;
		if (spec.points.find((p) => p.name === rod.inner)?.body === 'rack') m.rackRod = i;
	});
	if (spec.steeringAxis.type === 'virtual') {
		const idx = (key: string) => plan.rods.findIndex((r) => r.inner.startsWith(`${key}.`));
		const [a, b] = spec.steeringAxis.lower;
		const [c, d] = spec.steeringAxis.upper;
		m.axisRods.set([idx(a), idx(b), idx(c), idx(d)]);
	}
}

/** The spring code and circle (or body vector) of a spring end or rod carried by `body`. */
function carried(m: CornerModel, body: string, field: string, p: Vec3): { code: number; circle: ArmCircle; vector: Vec3 } {
	if (body === 'upright' || (body === 'arm' && m.chain === CHAIN_REVOLUTE)) {
		return { code: SPRING_UPRIGHT, circle: noCircle(), vector: sub(vec3(), p, m.L0) };
	}
	if (body === 'lower' && m.chain !== CHAIN_RODS && m.chain !== CHAIN_REVOLUTE) return { code: SPRING_LOWER, circle: circleOn(m.lower, p), vector: vec3() };
	if (body === 'upper' && m.chain === CHAIN_ARMS) return { code: SPRING_UPPER, circle: circleOn(m.upper, p), vector: vec3() };
	return fault(field, `'${body}' is not a body of this corner kind`);
}

/** Spring ends and the body that carries spring.body (a rocker's spring is set by buildRocker). */
function buildSpring(m: CornerModel, input: CornerInput, need: (n: string) => Vec3): void {
	const sc = m.points['spring.chassis'];
	if (!sc) return;
	copy(m.springChassis, need('spring.chassis'));
	if (input.rocker) return;
	const sb = m.points['spring.body'];
	if (!sb) return;
	const on = input.spring_on ?? fault('spring_on', 'required when spring points are given');
	const c = carried(m, on, 'spring_on', need('spring.body'));
	m.springOn = c.code;
	m.springBody = c.circle;
	copy(m.bodySpring, c.vector);
}

/** The rocker: circles of its rod and spring ends about its pivot axis, and its rod's outer end. */
function buildRocker(m: CornerModel, input: CornerInput, need: (n: string) => Vec3): void {
	const r = input.rocker;
	if (!r) return;
	if (m.chain === CHAIN_SLIDER) fault('rocker', 'a strut takes no rocker');
	const a = need('rocker.pivot_a');
	const b = need('rocker.pivot_b');
	const rodEnd = armCircle(a, b, need('rocker.rod_end'));
	if (!rodEnd) fault('rocker.rod_end', 'lies on the rocker pivot axis, or the pivots coincide (degenerate rocker axis)');
	const outer = need('rocker.rod_outer');
	const c = carried(m, r.rod_on, 'rocker.rod_on', outer);
	const rodLength = len(sub(vec3(), outer, need('rocker.rod_end')));
	if (rodLength <= ZERO_LENGTH_MM) fault('rocker.rod_outer', 'coincides with rod_end (zero-length pushrod)');
	m.rocker = {
		rodEnd,
		springEnd: circleOn(rodEnd, need('rocker.spring_end')),
		rodOn: c.code,
		rodOuterCircle: c.circle,
		rodOuterBody: c.vector,
		rodLength,
		hasSpring: !!m.points['spring.chassis']
	};
	m.springOn = m.rocker.hasSpring ? SPRING_ROCKER : SPRING_NONE;
}

/** The body code of a point's body name in this model. */
function bodyCode(m: CornerModel, body: BodyName, name: string, input: CornerInput): number {
	if (name === 'spring.body') {
		if (input.rocker || !m.points['spring.chassis']) return -1;
		body = (input.spring_on ?? 'upright') as BodyName;
	}
	if (name === 'rocker.rod_outer') body = (input.rocker?.rod_on ?? 'upright') as BodyName;
	if (body === 'chassis') return B_CHASSIS;
	if (body === 'rack') return B_RACK;
	if (body === 'rocker') return B_ROCKER;
	if (body === 'lower' && (m.chain === CHAIN_ARMS || m.chain === CHAIN_SLIDER)) return B_LOWER;
	if (body === 'upper' && m.chain === CHAIN_ARMS) return B_UPPER;
	return B_UPRIGHT;
}

/** The per-sample point list: the kind's points, the spring's, the rocker's, each with its body. */
function buildOutPoints(m: CornerModel, spec: KindSpec, input: CornerInput): void {
	const names = [...spec.points, ...(m.points['spring.chassis'] ? SPRING_POINTS : []), ...(input.rocker ? ROCKER_POINTS : [])];
	for (const { name, body } of names) {
		const p = m.points[name];
		const code = bodyCode(m, body, name, input);
		if (!p || code < 0) continue;
		m.outPoints.push({ name, body: code, design: vec3(p[0], p[1], p[2]) });
	}
	for (const { name, body, at } of input.attached ?? []) {
		if (body === 'rocker' && !input.rocker) continue;
		m.outPoints.push({ name, body: bodyCode(m, body, name, input), design: vec3(at[0], at[1], at[2]) });
	}
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
