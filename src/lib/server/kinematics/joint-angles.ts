// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees at the edge.
// Joint misalignment through heave, roll and steer: for every ball joint and rod end of a corner, how far the joint
// is turned away from how it sits at design, read from the solved point positions of each sweep.
//
// - A ball joint joins an arm (the housing) to the upright (the stud). Its stud axis s is fixed in the upright; the
//   housing holds it as it was at design. The angle is the one between s carried by the upright and s carried by the
//   arm: by Rodrigues' formula, rotation about s itself (the joint's free spin) does not count.
// - A rod end sits at one end of a link (a rod, the tie rod, the pushrod or pullrod, the spring and damper). Its bolt
//   (axis b) is fixed in the bracket's body; the link is free to turn on its own axis, so the angle is how far the
//   link stands off square to the bolt: |asin(b · l)|, l the link's unit direction.
// The bodies' rotations from design come from three points of each body (an orthonormal frame at design and at the
// pose); the chassis and the rack only translate.
import { kindSpec, type BodyName } from '../../kinds';
import { cross, dot, norm, sub, unit } from '../../vec';
import { solveSweep, type CornerInput, type SweepKind } from './index';

export type JointType = 'ball' | 'rod_end';
/** The joint's axis (a ball joint's stud, a rod end's bolt): `auto` as below, or a vehicle axis. */
export type AxisChoice = 'auto' | 'x' | 'y' | 'z';
type V = [number, number, number];

/** Limits when the engineer has set none: common practice, no source (standard rod ends are sold for roughly 10–15°). */
export const DEFAULT_LIMIT_DEG: Record<JointType, number> = { rod_end: 12, ball: 20 };

export interface JointDef {
	/** the point at the joint (its code) */
	point: string;
	type: JointType;
	/** ball joint: the arm holding the housing; rod end: the body the bolt is fixed to */
	bracket: BodyName;
	/** rod end: the link and its other end */
	link?: string;
	other?: string;
	/** what `auto` means for this joint */
	auto: 'steering-axis' | 'heave-swing' | 'steer-swing';
}

export interface JointSetting {
	limit: number;
	axis: AxisChoice;
}

export interface JointSweep {
	sweep: SweepKind;
	positions: number[];
	angles: number[];
	/** where the sweep stopped, when it could not be assembled to its end */
	stoppedAt: number | null;
}

export interface JointAngles {
	point: string;
	type: JointType;
	link: string | null;
	bracket: BodyName;
	axis: AxisChoice;
	/** the joint's axis at design (unit, vehicle axes) */
	axisVector: V;
	limit: number;
	/** the engineer's limit (true) or the default (false) */
	limitSet: boolean;
	atDesign: number;
	sweeps: JointSweep[];
	max: number;
	maxAt: { sweep: SweepKind; position: number };
	pass: boolean;
}

const DEG = 180 / Math.PI;
const AXES: Record<'x' | 'y' | 'z', V> = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] };

/** The ball joints and rod ends of a corner, read from its kind's joints, its rocker and its spring. */
export function jointsOf(corner: CornerInput): JointDef[] {
	const spec = kindSpec(corner.kind);
	const bodyOf = new Map(spec.points.map((p) => [p.name, p.body]));
	const out: JointDef[] = [];
	const rodEnds = (link: string, a: string, aBody: BodyName, b: string, bBody: BodyName, auto: JointDef['auto']) => {
		out.push({ point: a, type: 'rod_end', bracket: aBody, link, other: b, auto });
		out.push({ point: b, type: 'rod_end', bracket: bBody, link, other: a, auto });
	};
	for (const j of spec.joints) {
		if (j.type === 'ball') out.push({ point: j.at, type: 'ball', bracket: j.body, auto: 'steering-axis' });
		else if (j.type === 'rod') {
			const inner = bodyOf.get(j.inner) ?? 'chassis';
			rodEnds(j.link, j.inner, inner, j.outer, bodyOf.get(j.outer) ?? 'upright', inner === 'rack' ? 'steer-swing' : 'heave-swing');
		}
	}
	const rocker = corner.rocker;
	if (rocker) {
		rodEnds('pushrod or pullrod', 'rocker.rod_end', 'rocker', 'rocker.rod_outer', rocker.rod_on as BodyName, 'heave-swing');
		rodEnds('spring', 'spring.chassis', 'chassis', 'rocker.spring_end', 'rocker', 'heave-swing');
	} else if (corner.spring_on && corner.points['spring.chassis'] && corner.points['spring.body']) {
		rodEnds('spring', 'spring.chassis', 'chassis', 'spring.body', corner.spring_on as BodyName, 'heave-swing');
	}
	return out;
}

/** Each moving body's points (three or more, not in a line, for its frame). */
function bodyPoints(corner: CornerInput): Map<BodyName, string[]> {
	const spec = kindSpec(corner.kind);
	const sets = new Map<BodyName, Set<string>>();
	const add = (body: BodyName, name: string) => {
		if (!sets.has(body)) sets.set(body, new Set());
		sets.get(body)!.add(name);
	};
	for (const p of spec.points) add(p.body, p.name);
	for (const j of spec.joints) {
		// an arm turns about its pivot axis: the axis's points are on it too
		if (j.type === 'pivot') j.axis.forEach((n) => add(j.body, n));
		if (j.type === 'ball') add(j.body, j.at);
	}
	for (const j of spec.joints) if (j.type === 'rigid') for (const n of sets.get('upright') ?? []) add(j.body, n);
	for (const j of spec.joints) if (j.type === 'rigid') for (const n of sets.get(j.body) ?? []) add('upright', n);
	if (corner.rocker) {
		['rocker.pivot_a', 'rocker.pivot_b', 'rocker.rod_end', 'rocker.spring_end'].forEach((n) => add('rocker', n));
		add(corner.rocker.rod_on as BodyName, 'rocker.rod_outer');
	} else if (corner.spring_on && corner.points['spring.body']) add(corner.spring_on as BodyName, 'spring.body');
	const out = new Map<BodyName, string[]>();
	for (const [b, s] of sets) out.set(b, [...s]);
	return out;
}

/** A body's frame: three of its points (the widest triangle at design) and the rotation at a pose from them. */
interface Frame {
	names: [string, string, string] | null;
}

function frameAt(p: Record<string, ArrayLike<number>>, names: [string, string, string]): [V, V, V] {
	const e1 = unit(sub(p[names[1]], p[names[0]]));
	const e3 = unit(cross(e1, sub(p[names[2]], p[names[0]])));
	return [e1, cross(e3, e1), e3];
}

/** Rotation (row-major 3 × 3) taking the design frame to the pose's: R = F_pose · F_designᵀ. */
function rotationOf(frame: Frame, design: Record<string, ArrayLike<number>>, pose: Record<string, ArrayLike<number>>): V[] {
	if (!frame.names) return [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
	const d = frameAt(design, frame.names);
	const q = frameAt(pose, frame.names);
	const R: V[] = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
	for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) R[i][j] = q[0][i] * d[0][j] + q[1][i] * d[1][j] + q[2][i] * d[2][j];
	return R;
}

const apply = (R: V[], v: ArrayLike<number>): V => [dot(R[0], v), dot(R[1], v), dot(R[2], v)];
const applyT = (R: V[], v: ArrayLike<number>): V => [R[0][0] * v[0] + R[1][0] * v[1] + R[2][0] * v[2], R[0][1] * v[0] + R[1][1] * v[1] + R[2][1] * v[2], R[0][2] * v[0] + R[1][2] * v[1] + R[2][2] * v[2]];

function framesOf(corner: CornerInput, design: Record<string, ArrayLike<number>>): Map<BodyName, Frame> {
	const frames = new Map<BodyName, Frame>();
	for (const [body, names] of bodyPoints(corner)) {
		if (body === 'chassis' || body === 'rack') {
			frames.set(body, { names: null });
			continue;
		}
		let best: [string, string, string] | null = null;
		let area = 0;
		const have = names.filter((n) => design[n]);
		for (let a = 0; a < have.length; a++)
			for (let b = a + 1; b < have.length; b++)
				for (let c = b + 1; c < have.length; c++) {
					const s = norm(cross(sub(design[have[b]], design[have[a]]), sub(design[have[c]], design[have[a]])));
					if (s > area) {
						area = s;
						best = [have[a], have[b], have[c]];
					}
				}
		frames.set(body, { names: best });
	}
	frames.set('chassis', { names: null });
	frames.set('rack', { names: null });
	return frames;
}

/** A joint made ready to read at any pose: its axis at design and the frames it needs. */
export interface PreparedJoint extends JointDef {
	axisChoice: AxisChoice;
	axis: V;
}

/** The steering axis at design (unit, lower to upper), or null where the kind has no axis through two points. */
function steeringAxis(corner: CornerInput, design: Record<string, ArrayLike<number>>): V | null {
	const s = kindSpec(corner.kind).steeringAxis;
	if (s.type !== 'points' || !design[s.lower] || !design[s.upper]) return null;
	return unit(sub(design[s.upper], design[s.lower]));
}

/**
 * Each joint's axis at design. `auto`: a ball joint's stud along the steering axis (z where there is none); a rod
 * end's bolt square to its link and along the link's swing relative to the bracket in the first millimetre of heave
 * (of rack travel for a link on the rack), so that the joint's main motion turns it about its bolt.
 */
export function prepareJoints(
	corner: CornerInput,
	design: Record<string, ArrayLike<number>>,
	settings: Record<string, Partial<JointSetting>>,
	nudged: { heave: Record<string, ArrayLike<number>> | null; steer: Record<string, ArrayLike<number>> | null },
	frames = framesOf(corner, design)
): PreparedJoint[] {
	const kingpin = steeringAxis(corner, design);
	return jointsOf(corner).map((j) => {
		const choice = settings[j.point]?.axis ?? 'auto';
		let axis: V;
		if (choice !== 'auto') axis = AXES[choice];
		else if (j.type === 'ball') axis = kingpin ?? AXES.z;
		else {
			const l0 = unit(sub(design[j.other!], design[j.point]));
			const moved = j.auto === 'steer-swing' ? nudged.steer : nudged.heave;
			let b: V | null = null;
			if (moved) {
				// the link's direction after the nudge, seen from the bracket
				const R = rotationOf(frames.get(j.bracket) ?? { names: null }, design, moved);
				const l1 = applyT(R, unit(sub(moved[j.other!], moved[j.point])));
				const c = cross(l0, l1);
				if (norm(c) > 1e-9) b = unit(c);
			}
			// no swing to read: square to the link, nearest to z (to x for a link within 45° of upright)
			if (!b) {
				const ref = Math.abs(l0[2]) > Math.SQRT1_2 ? AXES.x : AXES.z;
				b = unit(sub(ref, l0.map((v) => v * dot(ref, l0)) as V));
			}
			axis = b;
		}
		return { ...j, axisChoice: choice, axis };
	});
}

/** The joints' angles (degrees) at a pose, in the order of `joints`. */
export function anglesAt(corner: CornerInput, joints: PreparedJoint[], design: Record<string, ArrayLike<number>>, pose: Record<string, ArrayLike<number>>, frames = framesOf(corner, design)): number[] {
	const rotations = new Map<BodyName, V[]>();
	const R = (b: BodyName) => {
		if (!rotations.has(b)) rotations.set(b, rotationOf(frames.get(b) ?? { names: null }, design, pose));
		return rotations.get(b)!;
	};
	return joints.map((j) => {
		if (j.type === 'ball') {
			const inUpright = apply(R('upright'), j.axis);
			const inArm = apply(R(j.bracket), j.axis);
			return Math.acos(Math.min(1, Math.max(-1, dot(inUpright, inArm)))) * DEG;
		}
		const bolt = apply(R(j.bracket), j.axis);
		const l = unit(sub(pose[j.other!], pose[j.point]));
		return Math.abs(Math.asin(Math.min(1, Math.max(-1, dot(bolt, l))))) * DEG;
	});
}

export interface JointSweepRange {
	from: number;
	to: number;
	step: number;
}

/** Default ranges: the solve command's (heave ±50 mm, roll ±3°, rack ±40 mm). */
export const JOINT_SWEEPS: Record<SweepKind, JointSweepRange> = {
	heave: { from: -50, to: 50, step: 5 },
	roll: { from: -3, to: 3, step: 0.5 },
	steer: { from: -40, to: 40, step: 5 }
};

/** Every joint's angle through heave, roll and (where the corner steers) steer, judged against its limit. */
export function jointAngles(
	corner: CornerInput,
	settings: Record<string, Partial<JointSetting>> = {},
	ranges: Partial<Record<SweepKind, JointSweepRange | undefined>> = {},
	only?: SweepKind[]
): JointAngles[] {
	const spec = kindSpec(corner.kind);
	const at = (sweep: SweepKind, x: number) => solveSweep(corner, { sweep, from: x, to: x, step: 1, points: true }).samples[0]?.points ?? null;
	const designPose = at('heave', 0);
	if (!designPose) return [];
	const frames = framesOf(corner, designPose);
	const joints = prepareJoints(corner, designPose, settings, { heave: at('heave', 1), steer: spec.steers ? at('steer', 1) : null }, frames);
	const sweeps: SweepKind[] = (only ?? ['heave', 'roll', 'steer']).filter((s) => s !== 'steer' || spec.steers);
	const atDesign = anglesAt(corner, joints, designPose, designPose, frames);
	const series = joints.map(() => [] as JointSweep[]);
	for (const sweep of sweeps) {
		const r = { ...JOINT_SWEEPS[sweep], ...ranges[sweep] };
		const result = solveSweep(corner, { sweep, ...r, points: true });
		const per = joints.map((): JointSweep => ({ sweep, positions: [], angles: [], stoppedAt: result.error?.position ?? null }));
		for (const s of result.samples) {
			const x = (s as unknown as Record<string, number>)[sweep === 'heave' ? 'travel' : sweep === 'roll' ? 'roll' : 'rack'];
			const angles = anglesAt(corner, joints, designPose, s.points!, frames);
			angles.forEach((a, i) => {
				per[i].positions.push(x);
				per[i].angles.push(a);
			});
		}
		per.forEach((p, i) => series[i].push(p));
	}
	return joints.map((j, i) => {
		let max = atDesign[i];
		let maxAt: JointAngles['maxAt'] = { sweep: 'heave', position: 0 };
		for (const s of series[i])
			s.angles.forEach((a, k) => {
				if (a > max) {
					max = a;
					maxAt = { sweep: s.sweep, position: s.positions[k] };
				}
			});
		const set = settings[j.point]?.limit;
		const limit = set ?? DEFAULT_LIMIT_DEG[j.type];
		return {
			point: j.point,
			type: j.type,
			link: j.link ?? null,
			bracket: j.bracket,
			axis: j.axisChoice,
			axisVector: j.axis,
			limit,
			limitSet: set !== undefined,
			atDesign: atDesign[i],
			sweeps: series[i],
			max,
			maxAt,
			pass: max <= limit
		};
	});
}
