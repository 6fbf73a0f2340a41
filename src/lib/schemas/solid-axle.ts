// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height,
// y = 0 centreline; lengths in mm, angles in degrees.
// The schema of a solid (live) axle: the object under the key `solid` of an `axle-geometry/1`
// file, in place of `left`/`right` (DEVELOPERS.md, "Solid axle"). Client-safe: imports only zod
// and the corner schema's shared pieces.

import { z } from 'zod';
import { formatIssue, GEOMETRY_LIMITS, POINT_NAME, pointSchema, vehicleSchema } from './geometry';

/** Lateral locators of a solid axle. */
export const SOLID_LATERAL = ['panhard', 'watt'] as const;
export type SolidLateral = (typeof SOLID_LATERAL)[number];

/** The four locating links: chassis end `<link>.chassis`, axle end `<link>.axle`. */
export const SOLID_LINKS = ['lower_left', 'lower_right', 'upper_left', 'upper_right'] as const;

/** Points every solid axle needs. */
export const SOLID_COMMON_POINTS = [
	...SOLID_LINKS.flatMap((l) => [`${l}.chassis`, `${l}.axle`]),
	'wheel_left.centre',
	'wheel_left.axis_inner',
	'wheel_right.centre',
	'wheel_right.axis_inner'
] as const;

/** Points each lateral locator needs. */
export const SOLID_LATERAL_POINTS: Record<SolidLateral, readonly string[]> = {
	panhard: ['panhard.chassis', 'panhard.axle'],
	watt: ['watt.pivot', 'watt.upper_end', 'watt.lower_end', 'watt.upper_chassis', 'watt.lower_chassis']
};

/** Optional points: the pinion axis and the springs (both ends of a side or neither). */
export const SOLID_OPTIONAL_POINTS = [
	'pinion.front',
	'spring_left.chassis',
	'spring_left.axle',
	'spring_right.chassis',
	'spring_right.axle'
] as const;

/** Shortest link the schema accepts (mm): below this a link has "zero length". */
export const SOLID_MIN_LINK_MM = 1;

/** Every rod of the layout as [name, chassis end, moving end], for the zero-length check and the solver's error names. */
export function solidRods(lateral: SolidLateral): [string, string, string][] {
	const rods: [string, string, string][] = SOLID_LINKS.map((l) => [l, `${l}.chassis`, `${l}.axle`]);
	if (lateral === 'panhard') rods.push(['panhard', 'panhard.chassis', 'panhard.axle']);
	else rods.push(['watt_upper', 'watt.upper_chassis', 'watt.upper_end'], ['watt_lower', 'watt.lower_chassis', 'watt.lower_end']);
	return rods;
}

const baseSchema = z.object({
	kind: z.literal('solid_axle', { error: "must be 'solid_axle'" }),
	lateral: z.enum(SOLID_LATERAL, { error: "must be 'panhard' or 'watt'" }),
	points: z
		.record(z.string().regex(POINT_NAME), pointSchema, {
			error: (iss) =>
				iss.code === 'invalid_key'
					? 'a point name is 1 to 64 letters, digits, "_", "." or "-", starting with a letter'
					: 'must be an object of named [x, y, z] points'
		})
		.refine((p) => Object.keys(p).length <= 64, 'at most 64 points'),
	tyre: z.object({
		loaded_radius: z
			.number({ error: 'must be a number (mm)' })
			.gt(0, 'must be > 0')
			.max(GEOMETRY_LIMITS.loadedRadiusMaxMm, `must be at most ${GEOMETRY_LIMITS.loadedRadiusMaxMm} mm`)
	})
});

type Pt = [number, number, number];
type Base = z.infer<typeof baseSchema>;
type Ctx = z.RefinementCtx;

const sub = (a: Pt, b: Pt): Pt => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const norm = (a: Pt): number => Math.hypot(a[0], a[1], a[2]);

function issue(ctx: Ctx, path: (string | number)[], message: string): void {
	ctx.addIssue({ code: 'custom', path, message });
}

/** The wheel of one side: on its side of the centreline, spin axis inboard, design contact point on z = 0. */
function checkWheel(a: Base, ctx: Ctx, side: 'left' | 'right'): void {
	const s = side === 'left' ? 1 : -1;
	const w = a.points[`wheel_${side}.centre`];
	const inner = a.points[`wheel_${side}.axis_inner`];
	if (!(s * w[1] > 0)) return issue(ctx, ['points', `wheel_${side}.centre`], `y must be ${s > 0 ? '> 0 (left wheel)' : '< 0 (right wheel)'}`);
	const axis = sub(w, inner);
	const l = norm(axis);
	if (l < GEOMETRY_LIMITS.zeroLengthMm)
		return issue(ctx, ['points', `wheel_${side}.axis_inner`], `coincides with wheel_${side}.centre (zero-length spin axis)`);
	if (s * axis[1] <= 0) return issue(ctx, ['points', `wheel_${side}.axis_inner`], `must lie inboard of wheel_${side}.centre on the spin axis`);
	const az = axis[2] / l;
	const contactZ = w[2] - a.tyre.loaded_radius * Math.sqrt(Math.max(0, 1 - az * az));
	if (Math.abs(contactZ) > GEOMETRY_LIMITS.contactOffGroundMm)
		issue(
			ctx,
			['points', `wheel_${side}.centre`],
			`design contact point is ${contactZ.toFixed(1)} mm off the ground (z = 0 must be the ground at design ride height)`
		);
}

/** The Watt's centre link: both ends off its pivot axis (the axle's x direction through watt.pivot). */
function checkWatt(a: Base, ctx: Ctx): void {
	const p = a.points['watt.pivot'];
	for (const end of ['watt.upper_end', 'watt.lower_end']) {
		const d = sub(a.points[end], p);
		if (Math.hypot(d[1], d[2]) < SOLID_MIN_LINK_MM)
			issue(ctx, ['points', end], 'lies on the centre link pivot axis (the x direction through watt.pivot): zero lever arm');
	}
}

/** Spring ends: both or neither per side, and apart. */
function checkSprings(a: Base, ctx: Ctx): void {
	for (const side of ['left', 'right']) {
		const c = a.points[`spring_${side}.chassis`];
		const b = a.points[`spring_${side}.axle`];
		if (!c && !b) continue;
		if (!c) issue(ctx, ['points', `spring_${side}.chassis`], `missing (spring_${side}.axle is given)`);
		else if (!b) issue(ctx, ['points', `spring_${side}.axle`], `missing (spring_${side}.chassis is given)`);
		else if (norm(sub(b, c)) < SOLID_MIN_LINK_MM) issue(ctx, ['points', `spring_${side}.axle`], `spring_${side} has zero length`);
	}
}

function checkAxle(a: Base, ctx: Ctx): void {
	let ok = true;
	for (const name of [...SOLID_COMMON_POINTS, ...SOLID_LATERAL_POINTS[a.lateral]]) {
		if (!a.points[name]) {
			issue(ctx, ['points', name], 'missing');
			ok = false;
		}
	}
	if (!ok) return;
	for (const [link, chassis, moving] of solidRods(a.lateral)) {
		if (norm(sub(a.points[moving], a.points[chassis])) < SOLID_MIN_LINK_MM)
			issue(ctx, ['points', moving], `link ${link} has zero length`);
	}
	checkWheel(a, ctx, 'left');
	checkWheel(a, ctx, 'right');
	if (a.lateral === 'watt') checkWatt(a, ctx);
	checkSprings(a, ctx);
	const pf = a.points['pinion.front'];
	if (pf) {
		const wl = a.points['wheel_left.centre'];
		const wr = a.points['wheel_right.centre'];
		const cx = (wl[0] + wr[0]) / 2;
		if (!(pf[0] - cx >= SOLID_MIN_LINK_MM)) issue(ctx, ['points', 'pinion.front'], 'must lie ahead of the axle centre (x greater than the wheel centres\' mean x)');
	}
}

/** The `solid` object of an axle file: shape first, then the geometric rules. */
export const solidAxleSchema = baseSchema.superRefine(checkAxle);

/** A validated solid axle. */
export type SolidAxle = z.infer<typeof solidAxleSchema>;

/** Parse the `solid` object; messages name the field from the file root, e.g. `solid.points.panhard.axle: missing`. */
export function parseSolidAxle(input: unknown): { ok: true; axle: SolidAxle } | { ok: false; message: string } {
	const r = z.object({ solid: solidAxleSchema }).safeParse({ solid: input });
	return r.success ? { ok: true, axle: r.data.solid } : { ok: false, message: formatIssue(r.error) };
}

/** A whole `axle-geometry/1` file carrying a solid axle (the lead's axle schema may replace this). */
export const solidAxleFileSchema = z.object({
	format: z.literal('axle-geometry/1', { error: "must be 'axle-geometry/1'" }),
	name: z.string().optional(),
	solid: solidAxleSchema,
	vehicle: vehicleSchema.nullable().optional()
});

export type SolidAxleFile = z.infer<typeof solidAxleFileSchema>;

/** Parse a whole solid-axle file; the message names the field, e.g. `vehicle.cg_height: must be > 0`. */
export function parseSolidAxleFile(input: unknown): { ok: true; file: SolidAxleFile } | { ok: false; message: string } {
	const r = solidAxleFileSchema.safeParse(input);
	return r.success ? { ok: true, file: r.data } : { ok: false, message: formatIssue(r.error) };
}
