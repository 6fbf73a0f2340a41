// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height; lengths in mm.
// Plausibility checks of a corner's points: warnings, never refusals, for the slips a typing error or a wrong
// export makes (a point on the wrong side of the car, a joint outside the wheel, an arm of a few millimetres, a
// steering axis leaning outboard at the top, a spring that lengthens in bump, a wheel centre at the wrong height).
// Each names the point by its label, with the internal name as a code. Client-safe: used beside the point table,
// in the import preview and in the API's answers. The limits are common practice for road and race cars, no
// source; each is stated in its message so the engineer can judge it.

import { joinRocker, kindMembers, kindSpec, ROCKER_MEMBERS, ROCKER_POINTS, SPRING_POINTS, CORNER_KINDS } from './kinds';

type P = readonly [number, number, number];

export interface PlausibilityWarning {
	/** a stable code of the rule */
	rule: 'side' | 'outside_wheel' | 'short_member' | 'axis_leans_out' | 'spring_lengthens' | 'wheel_height';
	/** the point(s) concerned (internal names) */
	points: string[];
	/** plain words, with the points' labels */
	message: string;
}

/** A point's label from its kind (or the spring's, the rocker's); the internal name when unknown. */
function labelOf(kind: string, name: string): string {
	const spec = kindSpec(kind);
	return [...spec.points, ...SPRING_POINTS, ...ROCKER_POINTS].find((p) => p.name === name)?.label ?? name;
}

/** How far a point may lie across the centreline before it is taken as on the wrong side (mm). */
const ACROSS_MM = 150;
/** How far outboard of the wheel centre plane a joint of the upright may sit (mm). */
const OUTBOARD_MM = 50;
/** A member shorter than this (mm) is taken as a slip. */
const SHORT_MM = 30;
/** A wheel centre this far (mm) from the loaded radius above the ground is taken as a slip. */
const HEIGHT_MM = 15;

/**
 * The warnings of a corner file's fields (kind, points, rocker, tyre). `motionRatio` is the solved motion ratio at
 * design when known (negative: the spring lengthens in bump, contract sign).
 */
export function plausibility(corner: { kind: string; points: Record<string, P>; rocker?: object | null; tyre?: { loaded_radius: number } | null }, motionRatio: number | null = null): PlausibilityWarning[] {
	if (!(CORNER_KINDS as readonly string[]).includes(corner.kind)) return [];
	const kind = corner.kind;
	const spec = kindSpec(kind);
	const all = joinRocker(corner.points as Record<string, [number, number, number]>, corner.rocker) as Record<string, P>;
	const label = (n: string) => `${labelOf(kind, n)} (${n})`;
	const out: PlausibilityWarning[] = [];
	const centre = all['wheel.centre'];
	const inner = all['wheel.axis_inner'];
	if (!centre) return out;
	const side = Math.sign(centre[1]) || 1;
	const sideWord = side > 0 ? 'left' : 'right';

	// 1. the corner's side: any point well across the centreline; a joint of the upright on the other side at all
	for (const [name, p] of Object.entries(all)) {
		const body = spec.points.find((q) => q.name === name)?.body;
		const acrossBy = -side * p[1];
		if (acrossBy > ACROSS_MM || ((body === 'upright' || body === 'arm') && acrossBy > 0)) {
			out.push({ rule: 'side', points: [name], message: `${label(name)} is ${Math.round(acrossBy)} mm across the centreline, on the other side from this ${sideWord} wheel (y = ${p[1]} mm). Check the sign of y.` });
		}
	}

	// 2. joints of the upright inside the wheel: not beyond its outer face, not further from the spin axis than the tyre
	if (inner) {
		const a = [centre[0] - inner[0], centre[1] - inner[1], centre[2] - inner[2]];
		const len = Math.hypot(a[0], a[1], a[2]);
		if (len > 0) {
			const u = a.map((v) => v / len);
			const radius = corner.tyre?.loaded_radius ?? null;
			for (const q of spec.points) {
				if ((q.body !== 'upright' && q.body !== 'arm') || q.name.startsWith('wheel.')) continue;
				const p = all[q.name];
				if (!p) continue;
				const d = [p[0] - centre[0], p[1] - centre[1], p[2] - centre[2]];
				const t = d[0] * u[0] + d[1] * u[1] + d[2] * u[2];
				const r = Math.hypot(d[0] - t * u[0], d[1] - t * u[1], d[2] - t * u[2]);
				if (t > OUTBOARD_MM) out.push({ rule: 'outside_wheel', points: [q.name], message: `${label(q.name)} is ${Math.round(t)} mm outboard of the wheel centre plane; a joint of the upright sits inboard of it (over ${OUTBOARD_MM} mm is taken as a slip).` });
				else if (radius !== null && r > radius) out.push({ rule: 'outside_wheel', points: [q.name], message: `${label(q.name)} is ${Math.round(r)} mm from the spin axis, outside the ${radius} mm loaded radius of the tyre.` });
			}
		}
	}

	// 3. members of a few millimetres: arms, rods, the strut, each pivot axis, the rocker's
	const { links, strut } = kindMembers(kind);
	const axes = spec.joints.flatMap((j) => (j.type === 'pivot' ? [[j.axis[0], j.axis[1]] as [string, string]] : []));
	const seen = new Set<string>();
	for (const [a, b] of [...links, ...(strut ? [strut] : []), ...axes, ...(corner.rocker ? ROCKER_MEMBERS : [])]) {
		if (seen.has(`${a}|${b}`)) continue;
		seen.add(`${a}|${b}`);
		const p = all[a];
		const q = all[b];
		if (!p || !q) continue;
		const length = Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
		if (length < SHORT_MM) out.push({ rule: 'short_member', points: [a, b], message: `${label(a)} and ${label(b)} are only ${length.toFixed(1)} mm apart; a member under ${SHORT_MM} mm is usually a typing slip (two points given the same place).` });
	}

	// 4. the steering axis leans outboard at the top (negative kingpin inclination)
	const axis = spec.steeringAxis;
	if (axis.type === 'points') {
		const lo = all[axis.lower];
		const hi = all[axis.upper];
		if (lo && hi && hi[2] > lo[2]) {
			const outward = side * (hi[1] - lo[1]);
			if (outward > 0) {
				const deg = (Math.atan2(outward, hi[2] - lo[2]) * 180) / Math.PI;
				out.push({ rule: 'axis_leans_out', points: [axis.lower, axis.upper], message: `The steering axis leans outboard at the top by ${deg.toFixed(1)}° (${label(axis.upper)} outboard of ${label(axis.lower)}); it normally leans inboard (positive kingpin inclination).` });
			}
		}
	}

	// 5. the spring lengthens in bump (contract: motion_ratio > 0 when the spring shortens in bump)
	if (motionRatio !== null && motionRatio < 0) {
		const ends = corner.rocker ? ['spring.chassis', 'rocker.spring_end'] : ['spring.chassis', 'spring.body'];
		out.push({ rule: 'spring_lengthens', points: ends, message: `The spring lengthens in bump (motion ratio ${motionRatio.toFixed(3)}): check ${label(ends[0])} and ${label(ends[1])}, or the body the spring is on.` });
	}

	// 6. the wheel centre's height against the loaded radius (z = 0 is the ground at design ride height)
	const radius = corner.tyre?.loaded_radius;
	if (radius && Math.abs(centre[2] - radius) > HEIGHT_MM) {
		out.push({ rule: 'wheel_height', points: ['wheel.centre'], message: `${label('wheel.centre')} is ${centre[2]} mm above the ground but the tyre's loaded radius is ${radius} mm; at design ride height they match (z = 0 is the ground). Over ${HEIGHT_MM} mm apart is taken as a slip.` });
	}
	return out;
}
