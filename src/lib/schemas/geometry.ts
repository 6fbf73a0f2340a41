// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height,
// y = 0 centreline; lengths in mm, angles in degrees.
// The one schema of a `corner-geometry/1` file (../shared/geometry-format.md), shared by the
// app, the API and the solve command. Client-safe: imports only zod.

import { z } from 'zod';
import { CORNER_KINDS, kindSpec, REQUIRED_POINTS, type KindSpec } from '../kinds';
import { cross, norm, sub } from '../vec';

/** Limits of a plausible corner; kept here because this module must stay client-safe. */
export const GEOMETRY_LIMITS = {
	/** two points closer than this (mm) coincide */
	zeroLengthMm: 1e-6,
	/** loaded tyre radius range (mm): a kart tyre to a large SUV tyre */
	loadedRadiusMinMm: 100,
	loadedRadiusMaxMm: 800,
	/** largest allowed distance of the design contact point from z = 0 (mm, contract) */
	contactOffGroundMm: 5,
	/** coordinates beyond this (mm) are taken as a unit or frame error */
	maxCoordinateMm: 100_000
} as const;

export { CORNER_KINDS, REQUIRED_POINTS } from '../kinds';

/** A point's name: a letter, then letters, digits, "_", "." or "-" (never a spreadsheet formula's first character). */
export const POINT_NAME = /^[A-Za-z][A-Za-z0-9_.-]{0,63}$/;

const coordinate = z
	.number({ error: 'must be a finite number (mm)' })
	.refine((v) => Math.abs(v) <= GEOMETRY_LIMITS.maxCoordinateMm, 'is implausibly large (mm expected)');

/** A point [x, y, z] in mm. */
export const pointSchema = z.tuple([coordinate, coordinate, coordinate], { error: 'must be [x, y, z] in mm' });

const fraction = (what: string) =>
	z.number({ error: `must be a number in [0, 1] (${what})` }).min(0, 'must be in [0, 1]').max(1, 'must be in [0, 1]');

export const vehicleSchema = z.object({
	axle: z.enum(['front', 'rear'], { error: "must be 'front' or 'rear'" }),
	wheelbase: z.number({ error: 'must be a number (mm)' }).gt(0, 'must be > 0'),
	cg_height: z.number({ error: 'must be a number (mm)' }).gt(0, 'must be > 0'),
	front_brake_fraction: fraction('front brake share').optional(),
	rear_drive_fraction: fraction('rear drive share').optional()
});

/** The `rocker` block: a pushrod or pullrod working the spring through a rocker (contract: "Rocker"). */
export const rockerSchema = z.object({
	pivot_a: pointSchema,
	pivot_b: pointSchema,
	rod_end: pointSchema,
	spring_end: pointSchema,
	rod_outer: pointSchema,
	rod_on: z.enum(['lower', 'upper', 'upright', 'arm'], { error: "must be 'lower', 'upper', 'upright' or 'arm'" })
});

const baseSchema = z.object({
	format: z.literal('corner-geometry/1', { error: "must be 'corner-geometry/1'" }),
	name: z.string().optional(),
	kind: z.enum(CORNER_KINDS, {
		error: (iss) => `unknown kind ${JSON.stringify(iss.input)} (expected ${CORNER_KINDS.join(', ')})`
	}),
	points: z
		.record(z.string().regex(POINT_NAME), pointSchema, {
			error: (iss) => (iss.code === 'invalid_key' ? 'a point name is 1 to 64 letters, digits, "_", "." or "-", starting with a letter' : 'must be an object of named [x, y, z] points')
		})
		.refine((p) => Object.keys(p).length <= 64, 'at most 64 points (the required ones and up to about 50 of your own)'),
	spring_on: z.enum(['lower', 'upper', 'upright', 'arm'], { error: "must be 'lower', 'upper', 'upright' or 'arm'" }).optional(),
	rocker: rockerSchema.nullable().optional(),
	tyre: z.object({
		loaded_radius: z
			.number({ error: 'must be a number (mm)' })
			.min(GEOMETRY_LIMITS.loadedRadiusMinMm, `must be at least ${GEOMETRY_LIMITS.loadedRadiusMinMm} mm`)
			.max(GEOMETRY_LIMITS.loadedRadiusMaxMm, `must be at most ${GEOMETRY_LIMITS.loadedRadiusMaxMm} mm`)
	}),
	vehicle: vehicleSchema.nullable().optional()
});

type Pt = [number, number, number];
type Base = z.infer<typeof baseSchema>;
type Ctx = z.RefinementCtx;

const crossLen = (a: Pt, b: Pt): number => norm(cross(a, b));

/** Report `message` at `path` (dotted field path under the file root). */
function issue(ctx: Ctx, path: (string | number)[], message: string): void {
	ctx.addIssue({ code: 'custom', path, message });
}

/** Required points present for the kind; false when some are missing. */
function checkRequired(c: Base, ctx: Ctx): boolean {
	let ok = true;
	for (const name of REQUIRED_POINTS[c.kind]) {
		if (!c.points[name]) {
			issue(ctx, ['points', name], 'missing');
			ok = false;
		}
	}
	return ok;
}

/** A pivot axis's two points apart, and the body's ball joint (if any) off the axis (mm). */
function checkPivot(c: Base, ctx: Ctx, spec: KindSpec, axis: readonly [string, string], body: string): void {
	const f = c.points[axis[0]];
	const r = c.points[axis[1]];
	const line = sub(r, f);
	const l = norm(line);
	if (l < GEOMETRY_LIMITS.zeroLengthMm) return issue(ctx, ['points', axis[1]], `coincides with ${axis[0]} (no pivot axis)`);
	for (const j of spec.joints) {
		if (j.type !== 'ball' || j.body !== body) continue;
		const o = c.points[j.at];
		if (crossLen(line, sub(o, f)) / l < GEOMETRY_LIMITS.zeroLengthMm)
			issue(ctx, ['points', j.at], `lies on the ${body} arm pivot axis (zero-length arm)`);
	}
}

/** Two points `a`, `b` must not coincide; the message names b. */
function apart(c: Base, ctx: Ctx, a: string, b: string, what: string): void {
	const p = c.points[a];
	const q = c.points[b];
	if (p && q && norm(sub(p, q)) < GEOMETRY_LIMITS.zeroLengthMm) issue(ctx, ['points', b], `coincides with ${a} (${what})`);
}

/** Every joint of the kind: pivot axes, rods of non-zero length, the strut axis, ball joints apart. */
function checkJoints(c: Base, ctx: Ctx, spec: KindSpec): void {
	const balls: string[] = [];
	for (const j of spec.joints) {
		if (j.type === 'pivot') checkPivot(c, ctx, spec, j.axis, j.body);
		else if (j.type === 'rod') apart(c, ctx, j.inner, j.outer, `zero-length ${j.link}`);
		else if (j.type === 'slider') apart(c, ctx, j.top, j.lower, 'zero-length strut axis');
		else if (j.type === 'ball') balls.push(j.at);
	}
	for (let i = 1; i < balls.length; i++) apart(c, ctx, balls[0], balls[i], 'zero-length upright');
	const axis = spec.steeringAxis;
	if (axis.type === 'points' && !balls.includes(axis.upper)) apart(c, ctx, axis.lower, axis.upper, 'zero-length steering axis');
}

/** Spin axis, side of the car and the design contact point on the ground. */
function checkWheel(c: Base, ctx: Ctx): void {
	const w = c.points['wheel.centre'];
	const a = c.points['wheel.axis_inner'];
	if (w[1] === 0) return issue(ctx, ['points', 'wheel.centre'], 'y must not be 0 (y > 0 left corner, y < 0 right)');
	const axis = sub(w, a);
	const l = norm(axis);
	if (l < GEOMETRY_LIMITS.zeroLengthMm)
		return issue(ctx, ['points', 'wheel.axis_inner'], 'coincides with wheel.centre (zero-length spin axis)');
	if (Math.sign(w[1]) * axis[1] <= 0)
		return issue(ctx, ['points', 'wheel.axis_inner'], 'must lie inboard of wheel.centre on the spin axis');
	const az = axis[2] / l;
	const contactZ = w[2] - c.tyre.loaded_radius * Math.sqrt(Math.max(0, 1 - az * az));
	if (Math.abs(contactZ) > GEOMETRY_LIMITS.contactOffGroundMm)
		issue(
			ctx,
			['points', 'wheel.centre'],
			`design contact point is ${contactZ.toFixed(1)} mm off the ground (z = 0 must be the ground at design ride height)`
		);
}

/** Spring ends: both or neither, apart, and a body that exists for this kind (the rocker's spring has its own rules). */
function checkSpring(c: Base, ctx: Ctx, spec: KindSpec): void {
	const sc = c.points['spring.chassis'];
	const sb = c.points['spring.body'];
	if (c.rocker) return;
	if (!sc && !sb) return;
	if (!sc) return issue(ctx, ['points', 'spring.chassis'], 'missing (spring.body is given)');
	if (!sb) return issue(ctx, ['points', 'spring.body'], 'missing (spring.chassis is given)');
	apart(c, ctx, 'spring.chassis', 'spring.body', 'zero-length spring');
	if (!c.spring_on) return issue(ctx, ['spring_on'], 'required when spring points are given');
	if (!spec.springOn.includes(c.spring_on))
		issue(ctx, ['spring_on'], `a ${spec.label.toLowerCase()} has no body '${c.spring_on}': use ${spec.springOn.map((b) => `'${b}'`).join(' or ')}`);
}

/** The rocker block: allowed on this kind, a real pivot axis, rods and lever arms of non-zero length. */
function checkRocker(c: Base, ctx: Ctx, spec: KindSpec): void {
	const r = c.rocker;
	if (!r) return;
	if (!spec.rockerRodOn.length) return issue(ctx, ['rocker'], `a ${spec.label.toLowerCase()} takes no rocker`);
	if (!spec.rockerRodOn.includes(r.rod_on))
		return issue(ctx, ['rocker', 'rod_on'], `must be ${spec.rockerRodOn.map((b) => `'${b}'`).join(' or ')} on a ${spec.label.toLowerCase()}`);
	const axis = sub(r.pivot_b, r.pivot_a);
	const l = norm(axis);
	if (l < GEOMETRY_LIMITS.zeroLengthMm) return issue(ctx, ['rocker', 'pivot_b'], 'coincides with pivot_a (degenerate rocker axis)');
	if (crossLen(axis, sub(r.rod_end, r.pivot_a)) / l < GEOMETRY_LIMITS.zeroLengthMm)
		return issue(ctx, ['rocker', 'rod_end'], 'lies on the rocker pivot axis (zero lever arm)');
	if (norm(sub(r.rod_outer, r.rod_end)) < GEOMETRY_LIMITS.zeroLengthMm)
		return issue(ctx, ['rocker', 'rod_outer'], 'coincides with rod_end (zero-length pushrod)');
	const sc = c.points['spring.chassis'];
	if (sc && norm(sub(sc, r.spring_end)) < GEOMETRY_LIMITS.zeroLengthMm)
		issue(ctx, ['rocker', 'spring_end'], 'coincides with spring.chassis (zero-length spring)');
}

/** The vehicle block rules of the contract. */
function checkVehicle(c: Base, ctx: Ctx): void {
	const v = c.vehicle;
	if (v && v.axle === 'front' && v.front_brake_fraction === undefined)
		issue(ctx, ['vehicle', 'front_brake_fraction'], 'required on a front axle');
}

/** The whole-file rules that need more than one field. */
function checkCorner(c: Base, ctx: Ctx): void {
	checkVehicle(c, ctx);
	if (!checkRequired(c, ctx)) return;
	const spec = kindSpec(c.kind);
	checkJoints(c, ctx, spec);
	checkWheel(c, ctx);
	checkSpring(c, ctx, spec);
	checkRocker(c, ctx, spec);
}

/** The `corner-geometry/1` schema: shape first, then the geometric rules. */
export const cornerGeometrySchema = baseSchema.superRefine(checkCorner);

/** A validated corner geometry file. */
export type CornerGeometry = z.infer<typeof cornerGeometrySchema>;

/** Sweep options as the API and the solve command take them (mm, or degrees for roll). */
export const sweepOptionsSchema = z
	.object({
		sweep: z.enum(['heave', 'roll', 'steer'], { error: "must be 'heave', 'roll' or 'steer'" }),
		from: z.number({ error: 'must be a number' }),
		to: z.number({ error: 'must be a number' }),
		step: z.number({ error: 'must be a number' }).gt(0, 'must be > 0'),
		rack: z.number({ error: 'must be a number (mm)' }).optional()
	})
	.refine((o) => o.from <= o.to, { path: ['from'], message: 'must be <= to' });

/** Validated sweep options. */
export type SweepOptionsInput = z.infer<typeof sweepOptionsSchema>;

/** Default sweep ranges of the contract (mm, or degrees for roll). */
export const SWEEP_DEFAULTS = {
	heave: { from: -50, to: 50, step: 5 },
	roll: { from: -3, to: 3, step: 0.5 },
	steer: { from: -40, to: 40, step: 5 }
} as const;

/** One line naming the field of the first problem, e.g. `points.upper.outer: missing`. */
export function formatIssue(error: z.ZodError): string {
	const first = error.issues[0];
	if (!first) return 'invalid input';
	const path = first.path.map(String).join('.');
	return path ? `${path}: ${first.message}` : first.message;
}

/** Parse a corner file; `{ ok: true, corner }` or `{ ok: false, message }` with the one-line message. */
export function parseCornerGeometry(
	input: unknown
): { ok: true; corner: CornerGeometry } | { ok: false; message: string } {
	const r = cornerGeometrySchema.safeParse(input);
	return r.success ? { ok: true, corner: r.data } : { ok: false, message: formatIssue(r.error) };
}
