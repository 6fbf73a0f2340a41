// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm; z = 0 ground at design ride height.
// Keep-out volumes of a car (issue 16, packaging): space the suspension's moved points and the rods between them
// must stay out of through the travel and the steering range. Client-safe: imports only zod.
//
// - `box`: fixed to the chassis, its faces square to the vehicle axes (a gearbox, a sump, a frame tube's cage).
// - `cylinder`: fixed to the chassis, a round bar from `from` to `to` of `radius` (a driveshaft, a damper body).
// - `rim`: moves with each wheel of one axle. The space the rim takes: everything at or beyond
//   `barrel_radius − clearance` from the wheel's spin axis, between `inboard` mm inboard and `outboard` mm outboard
//   of the wheel centre along the spin axis (the rim barrel with the brake clearance the fabricator keeps).
import { z } from 'zod';
import { pointSchema } from './geometry';

const name = z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(60, 'at most 60 characters');
const length = (what: string) => z.number({ error: `must be a number (mm, ${what})` }).min(0, `must be ≥ 0 mm (${what})`).max(2000, `must be at most 2000 mm (${what})`);

const boxSchema = z
	.object({
		shape: z.literal('box'),
		name,
		min: pointSchema.describe('the corner with the smallest x, y and z'),
		max: pointSchema.describe('the corner with the largest x, y and z')
	})
	.superRefine((b, ctx) => {
		for (let i = 0; i < 3; i++) {
			if (!(b.max[i] > b.min[i])) ctx.addIssue({ code: 'custom', path: ['max', i], message: `the box has ${b.max[i] === b.min[i] ? 'zero size' : 'a negative size'} along ${'xyz'[i]} (max must be greater than min)` });
		}
	});

const cylinderSchema = z
	.object({
		shape: z.literal('cylinder'),
		name,
		from: pointSchema.describe('the centre of one end face'),
		to: pointSchema.describe('the centre of the other end face'),
		radius: z.number({ error: 'must be a number (mm)' }).gt(0, 'must be > 0 mm (a cylinder of zero radius keeps nothing out)').max(2000, 'must be at most 2000 mm')
	})
	.superRefine((c, ctx) => {
		if (Math.hypot(c.to[0] - c.from[0], c.to[1] - c.from[1], c.to[2] - c.from[2]) < 1e-6) ctx.addIssue({ code: 'custom', path: ['to'], message: 'the cylinder has zero length (to is the same point as from)' });
	});

const rimSchema = z
	.object({
		shape: z.literal('rim'),
		name,
		axle: z.enum(['front', 'rear'], { error: "must be 'front' or 'rear' (the wheels of that axle carry it)" }),
		barrel_radius: z.number({ error: 'must be a number (mm, the rim barrel’s inner radius)' }).gt(0, 'must be > 0 mm (the rim barrel’s inner radius)').max(600, 'must be at most 600 mm'),
		clearance: length('kept clear inside the barrel').default(0),
		inboard: length('from the wheel centre to the barrel’s inboard edge'),
		outboard: length('from the wheel centre to the barrel’s outboard edge')
	})
	.superRefine((r, ctx) => {
		if (r.clearance >= r.barrel_radius) ctx.addIssue({ code: 'custom', path: ['clearance'], message: `must be less than barrel_radius (${r.barrel_radius} mm), or nothing is left inside the rim` });
		if (r.inboard + r.outboard <= 0) ctx.addIssue({ code: 'custom', path: ['outboard'], message: 'the rim has zero width (inboard + outboard must be > 0 mm)' });
	});

export const keepOutSchema = z.discriminatedUnion('shape', [boxSchema, cylinderSchema, rimSchema], { error: "shape must be 'box', 'cylinder' or 'rim'" });
export type KeepOut = z.infer<typeof keepOutSchema>;

/** A car's list of keep-out volumes: at most 30, names unique. */
export const keepOutListSchema = z
	.array(keepOutSchema, { error: 'must be a list of keep-out volumes' })
	.max(30, 'at most 30 keep-out volumes')
	.superRefine((list, ctx) => {
		const seen = new Set<string>();
		list.forEach((v, i) => {
			const k = v.name.toLowerCase();
			if (seen.has(k)) ctx.addIssue({ code: 'custom', path: [i, 'name'], message: `“${v.name}” is named twice` });
			seen.add(k);
		});
	});

/** Labels of the shapes, for lists and pickers. */
export const KEEP_OUT_SHAPES = { box: 'Box (chassis)', cylinder: 'Cylinder (chassis)', rim: 'Rim barrel (moves with each wheel)' } as const;

/** A one-line description of a volume ("box 120 × 300 × 200 mm", "rim barrel r 180 − 10 mm, front"). */
export function describeKeepOut(v: KeepOut): string {
	if (v.shape === 'box') return `box ${v.max.map((m, i) => Math.round(m - v.min[i])).join(' × ')} mm`;
	if (v.shape === 'cylinder') return `cylinder ⌀${Math.round(2 * v.radius)} × ${Math.round(Math.hypot(v.to[0] - v.from[0], v.to[1] - v.from[1], v.to[2] - v.from[2]))} mm`;
	return `rim barrel r ${v.barrel_radius}${v.clearance ? ` − ${v.clearance}` : ''} mm, ${v.axle} wheels, ${v.inboard} in / ${v.outboard} out`;
}
