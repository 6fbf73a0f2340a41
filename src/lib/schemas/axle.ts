// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height, y = 0 centreline.
// The `axle-geometry/1` file (../shared/geometry-format.md, "Axle file and axle sweeps"): two corners of one axle,
// the right one measured or "mirror", the steering system and the vehicle figures. Client-safe: imports only zod.
import { z } from 'zod';
import { cornerGeometrySchema, formatIssue, pointSchema, vehicleSchema, type CornerGeometry } from './geometry';
import { parseSolidAxle, type SolidAxle } from './solid-axle';
import { num } from './corner';

/** The steering system: mm of rack travel per steering-wheel revolution and which way the rack goes for a left turn. */
export const steeringSchema = z.object({
	rack_travel_per_turn: z.number({ error: 'must be a number (mm of rack travel per steering-wheel turn)' }).gt(0, 'must be > 0 (mm of rack travel per steering-wheel turn)'),
	rack_left_turn: z.enum(['+y', '-y'], { error: "must be '+y' or '-y' (which way the rack moves when the driver turns left)" })
});
export type Steering = z.infer<typeof steeringSchema>;

/**
 * An anti-roll bar (our addition to the axle file): the bar's axis through its two chassis bearings, each side's
 * lever end (the drop link's top) and the drop link's lower end on a body of that corner, and the bar's torsional
 * stiffness. Right-side points mirror the left ones unless given.
 */
export const antiRollBarSchema = z.object({
	pivot: pointSchema.describe('a point on the bar axis at the left bearing (y > 0); the right bearing mirrors it'),
	arm_end: pointSchema,
	link_end: pointSchema,
	link_on: z.enum(['lower', 'upper', 'upright', 'rocker'], { error: "must be 'lower', 'upper', 'upright' or 'rocker'" }),
	torsional_stiffness: z.number({ error: 'must be a number (N·m per degree of twist)' }).gt(0, 'must be > 0 (N·m per degree of twist)')
});
export type AntiRollBar = z.infer<typeof antiRollBarSchema>;

const axleBase = z.object({
	format: z.literal('axle-geometry/1', { error: "must be 'axle-geometry/1'" }),
	name: z.string().max(200).optional(),
	left: z.unknown(),
	right: z.unknown(),
	steering: steeringSchema.nullable().optional(),
	anti_roll_bar: antiRollBarSchema.nullable().optional(),
	vehicle: vehicleSchema.nullable().optional()
});

/** A validated axle: both corners as corner-geometry/1 objects (the right one mirrored when the file said so). */
export interface AxleGeometry {
	format: 'axle-geometry/1';
	name?: string;
	left: CornerGeometry;
	right: CornerGeometry;
	/** true when the file gave `right: "mirror"` */
	mirrored: boolean;
	steering: Steering | null;
	anti_roll_bar: AntiRollBar | null;
	vehicle: CornerGeometry['vehicle'] | null;
}

type Pt = [number, number, number];
const flip = (p: Pt): Pt => [p[0], -p[1], p[2]];

/** A corner's mirror image across y = 0: every point (the rocker's too) with y negated; kind, tyre and spring_on kept. */
export function mirrorCorner(c: CornerGeometry): CornerGeometry {
	const points = Object.fromEntries(Object.entries(c.points).map(([n, p]) => [n, flip(p as Pt)]));
	const rocker = c.rocker
		? { ...c.rocker, pivot_a: flip(c.rocker.pivot_a), pivot_b: flip(c.rocker.pivot_b), rod_end: flip(c.rocker.rod_end), spring_end: flip(c.rocker.spring_end), rod_outer: flip(c.rocker.rod_outer) }
		: c.rocker;
	return { ...c, name: c.name ? `${c.name} (mirrored)` : c.name, points, rocker } as CornerGeometry;
}

/** Parse one side: a corner object on its own side of the car; the message is prefixed with the side. */
function side(input: unknown, which: 'left' | 'right', vehicle: AxleGeometry['vehicle']): { ok: true; corner: CornerGeometry } | { ok: false; message: string } {
	if (input === undefined || input === null) return { ok: false, message: `${which}: missing (a corner-geometry/1 object${which === 'right' ? ' or "mirror"' : ''})` };
	const withVehicle = vehicle && typeof input === 'object' ? { ...(input as object), vehicle } : input;
	const r = cornerGeometrySchema.safeParse(withVehicle);
	if (!r.success) return { ok: false, message: `${which}.${formatIssue(r.error)}` };
	const y = r.data.points['wheel.centre'][1];
	if (which === 'left' ? y <= 0 : y >= 0)
		return { ok: false, message: `${which}.points.wheel.centre: the ${which} corner needs y ${which === 'left' ? '> 0' : '< 0'} (got ${y})` };
	return { ok: true, corner: r.data };
}

/** Parse an axle file; `{ ok: true, axle }` or `{ ok: false, message }` naming the field (e.g. `right.points.lower.outer: missing`). */
export function parseAxleGeometry(input: unknown): { ok: true; axle: AxleGeometry } | { ok: false; message: string } {
	const base = axleBase.safeParse(input);
	if (!base.success) return { ok: false, message: formatIssue(base.error) };
	const b = base.data;
	const vehicle = b.vehicle ?? null;
	const left = side(b.left, 'left', vehicle);
	if (!left.ok) return left;
	const mirrored = b.right === 'mirror';
	const right = mirrored ? side(mirrorCorner(left.corner), 'right', vehicle) : side(b.right, 'right', vehicle);
	if (!right.ok) return right;
	const bar = b.anti_roll_bar ?? null;
	if (bar) {
		if (bar.pivot[1] <= 0) return { ok: false, message: 'anti_roll_bar.pivot: give the left bearing (y > 0); the right one mirrors it' };
		const lever = Math.hypot(bar.arm_end[0] - bar.pivot[0], bar.arm_end[2] - bar.pivot[2]);
		if (lever < 1) return { ok: false, message: 'anti_roll_bar.arm_end: lies on the bar axis (no lever arm)' };
		if (Math.hypot(bar.link_end[0] - bar.arm_end[0], bar.link_end[1] - bar.arm_end[1], bar.link_end[2] - bar.arm_end[2]) < 1)
			return { ok: false, message: 'anti_roll_bar.link_end: coincides with arm_end (zero-length drop link)' };
	}
	return {
		ok: true,
		axle: { format: 'axle-geometry/1', name: b.name, left: left.corner, right: right.corner, mirrored, steering: b.steering ?? null, anti_roll_bar: bar, vehicle }
	};
}

/** A solid axle file: `solid` in place of `left` and `right` (our addition to axle-geometry/1; DEVELOPERS.md "Solid axle"). */
export interface SolidAxleGeometry {
	format: 'axle-geometry/1';
	name?: string;
	solid: SolidAxle;
	vehicle: CornerGeometry['vehicle'] | null;
}

/** Parse an axle file of either shape: two corners (`left`, `right`) or a solid axle (`solid`). */
export function parseAxleFile(input: unknown): { ok: true; type: 'independent'; axle: AxleGeometry } | { ok: true; type: 'solid'; axle: SolidAxleGeometry } | { ok: false; message: string } {
	if (input && typeof input === 'object' && 'solid' in input) {
		const { solid, left, right, ...rest } = input as Record<string, unknown>;
		if (left !== undefined || right !== undefined) return { ok: false, message: `${left !== undefined ? 'left' : 'right'}: a solid axle file has no corners (give either solid or left and right)` };
		const base = axleBase.omit({ left: true, right: true, steering: true, anti_roll_bar: true }).strict().safeParse(rest);
		if (!base.success) {
			const msg = formatIssue(base.error);
			return { ok: false, message: msg.includes('Unrecognized key') ? `${msg} (steering and anti_roll_bar are not read for a solid axle)` : msg };
		}
		const parsed = parseSolidAxle(solid);
		if (!parsed.ok) return parsed;
		return { ok: true, type: 'solid', axle: { format: 'axle-geometry/1', name: base.data.name, solid: parsed.axle, vehicle: base.data.vehicle ?? null } };
	}
	const r = parseAxleGeometry(input);
	return r.ok ? { ok: true, type: 'independent', axle: r.axle } : r;
}

/** Default axle sweep ranges (contract): heave mm, roll degrees, steer by steering-wheel degrees. */
export const AXLE_SWEEP_DEFAULTS = {
	heave: { from: -50, to: 50, step: 5 },
	roll: { from: -3, to: 3, step: 0.5 },
	steer: { from: -360, to: 360, step: 30 }
} as const;

/** The query of an axle sweep: ?sweep=steer&from=-360&to=360&step=30 (defaults as the solve command's), steering_wheel held in heave/roll. */
export const axleSweepQuery = z
	.object({
		sweep: z.enum(['heave', 'roll', 'steer'], { message: "sweep must be 'heave', 'roll' or 'steer'" }).default('heave'),
		from: num('from'),
		to: num('to'),
		step: num('step'),
		steering_wheel: num('steering_wheel'),
		points: z.preprocess((v) => v === true || v === 'true' || v === '1', z.boolean()).optional()
	})
	.transform((q) => {
		const d = AXLE_SWEEP_DEFAULTS[q.sweep];
		return { sweep: q.sweep, from: q.from ?? d.from, to: q.to ?? d.to, step: q.step ?? d.step, steering_wheel: q.steering_wheel, points: q.points };
	})
	.refine((q) => q.step > 0, { path: ['step'], message: 'step must be > 0' })
	.refine((q) => q.from <= q.to, { path: ['from'], message: 'from must be <= to' })
	.refine((q) => q.steering_wheel === undefined || q.sweep !== 'steer', { path: ['steering_wheel'], message: 'steering_wheel is held only in a heave or roll sweep' });

/** The query of a car's pitch sweep: ?from=-3&to=3&step=0.25, body pitch in degrees (+ = nose down), at most 10° each way. */
export const pitchSweepQuery = z
	.object({ from: num('from'), to: num('to'), step: num('step') })
	.transform((q) => ({ from: q.from ?? -3, to: q.to ?? 3, step: q.step ?? 0.25 }))
	.refine((q) => q.step > 0, { path: ['step'], message: 'step must be > 0' })
	.refine((q) => q.from <= 0 && q.to >= 0, { path: ['from'], message: 'the range must include 0 (design)' })
	.refine((q) => q.from >= -10 && q.to <= 10, { path: ['from'], message: 'pitch must stay within ±10°' })
	.refine((q) => (q.to - q.from) / q.step <= 400, { path: ['step'], message: 'gives more than 401 positions' });
