// Corner and revision inputs, shared by forms, API v1 and the client.
import { z } from 'zod';
import { CORNER_KINDS, KIND_LABELS } from '../kinds';
import { cornerGeometrySchema, SWEEP_DEFAULTS } from './geometry';

export { KIND_LABELS };

export const CORNER_POSITIONS = ['front_left', 'front_right', 'rear_left', 'rear_right'] as const;
export type CornerPosition = (typeof CORNER_POSITIONS)[number];

export const POSITION_LABELS: Record<CornerPosition, string> = {
	front_left: 'Front left',
	front_right: 'Front right',
	rear_left: 'Rear left',
	rear_right: 'Rear right'
};


export const cornerInput = z.object({
	position: z.enum(CORNER_POSITIONS, { message: 'position must be front_left, front_right, rear_left or rear_right' }),
	kind: z.enum(CORNER_KINDS, { message: `kind must be one of ${CORNER_KINDS.join(', ')}` })
});

export const revisionInput = z.object({
	label: z.string().trim().max(120, 'label is at most 120 characters').default(''),
	note: z.string().max(5000, 'note is at most 5000 characters').default(''),
	parentId: z.string().uuid('parentId must be a revision id').nullable().optional(),
	geometry: cornerGeometrySchema
});

/** An optional number from a query string ("" = absent), the message naming the parameter. */
export const num = (name: string) =>
	z.preprocess(
		(v) => (v === undefined || v === '' ? undefined : typeof v === 'string' ? Number(v) : v),
		z.number({ message: `${name} must be a number` }).refine(Number.isFinite, `${name} must be a number`).optional()
	);

/** The per-sample quantities of corner-solve/1 (shared/geometry-format.md) that a caller can ask for alone. */
export const SAMPLE_FIELDS = [
	'camber',
	'toe',
	'caster',
	'kpi',
	'scrub_radius',
	'trail',
	'half_track_change',
	'wheelbase_change',
	'fvic',
	'fvsa',
	'rc_height',
	'svic',
	'anti_dive',
	'anti_squat',
	'camber_ground',
	'motion_ratio',
	'rocker_angle',
	'wheel_centre',
	'contact_patch'
] as const;
export type SampleField = (typeof SAMPLE_FIELDS)[number];

/** A list from a query string ("toe,camber") or a body (["toe", "camber"]). */
const list = (v: unknown) => (typeof v === 'string' ? v.split(',').map((s) => s.trim()).filter(Boolean) : v);

/** Sweep settings from a query string or a body; missing values take the contract's defaults. */
export const sweepQuery = z
	.object({
		sweep: z.enum(['heave', 'roll', 'steer'], { message: "sweep must be 'heave', 'roll' or 'steer'" }).default('heave'),
		from: num('from'),
		to: num('to'),
		step: num('step'),
		rack: num('rack'),
		points: z.preprocess((v) => v === true || v === 'true' || v === '1', z.boolean()).optional(),
		/** only these quantities in each sample (the sweep variable always comes); all when absent */
		fields: z
			.preprocess(
				list,
				z.array(z.enum(SAMPLE_FIELDS, { message: `fields: each must be one of ${SAMPLE_FIELDS.join(', ')}` }), { message: 'fields must be a list of sample quantities' })
			)
			.optional(),
		/** every number of the samples rounded to this many decimals; full precision when absent */
		decimals: num('decimals').refine((v) => v === undefined || (Number.isInteger(v) && v >= 0 && v <= 12), 'decimals must be a whole number from 0 to 12')
	})
	.transform((q) => {
		const d = SWEEP_DEFAULTS[q.sweep];
		return { sweep: q.sweep, from: q.from ?? d.from, to: q.to ?? d.to, step: q.step ?? d.step, rack: q.rack, points: q.points, fields: q.fields, decimals: q.decimals };
	})
	.refine((q) => q.step > 0, { path: ['step'], message: 'step must be > 0' })
	.refine((q) => q.from <= q.to, { path: ['from'], message: 'from must be <= to' })
	.refine((q) => (q.to - q.from) / q.step <= 2000, { path: ['step'], message: 'at most 2000 positions per sweep' });

export type SweepQuery = z.infer<typeof sweepQuery>;

/** The body of POST /api/v1/solve: a corner file and sweep settings. */
export const solveBody = z
	.object({ geometry: cornerGeometrySchema })
	.passthrough()
	.transform((b, ctx) => {
		const { geometry, ...rest } = b;
		const q = sweepQuery.safeParse(rest);
		if (!q.success) {
			for (const issue of q.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
			return z.NEVER;
		}
		return { geometry, options: q.data };
	});

/** How many revisions one page of a list holds at most (the corner page shows REVISION_PAGE). */
export const REVISION_PAGE_MAX = 200;
export const REVISION_PAGE = 20;

const whole = (name: string, min: number, max: number, words: string) =>
	z.coerce.number({ message: `${name} must be ${words}` }).int(`${name} must be ${words}`).min(min, `${name} must be ${words}`).max(max, `${name} must be ${words}`);

/**
 * The query of a revision list: `q` (words matched in label, note, author, `r12` and the date `2026-12-03` /
 * `3 Dec 2026`), `limit` (1…200) and `offset`. Without `limit` the API answers the whole list, as before paging.
 */
export const revisionListQuery = z.object({
	q: z.string().max(200, 'q is at most 200 characters').optional(),
	limit: whole('limit', 1, REVISION_PAGE_MAX, `a whole number from 1 to ${REVISION_PAGE_MAX}`).optional(),
	offset: whole('offset', 0, 1_000_000, 'a whole number from 0 to 1000000').default(0)
});
