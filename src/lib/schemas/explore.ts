// Inputs of a design-space exploration (issue 18). Client-safe: zod only. Offsets in mm from the point as it is.
import { z } from 'zod';
import { AXIS_NAMES, MOVABLE_POINTS, travelSchema } from './analysis';

export const EXPLORE_PLANS = ['lhs', 'sobol', 'factorial'] as const;
export const EXPLORE_COLUMNS = ['toe_rms', 'camber_gain', 'rc_height', 'rc_migration', 'motion_ratio'] as const;
export type ExploreColumn = (typeof EXPLORE_COLUMNS)[number];
export const MAX_EXPLORE_VARIANTS = 1_000_000;
export const MAX_EXPLORE_COORDINATES = 10;

const point = z.string({ message: 'must be a point name' }).refine((p) => MOVABLE_POINTS.includes(p), { message: `must be one of ${MOVABLE_POINTS.join(', ')}` });
const mm = z.number({ message: 'must be a number (mm)' }).min(-100, 'must be ≥ -100 mm').max(100, 'must be ≤ 100 mm');

export const exploreInput = z
	.object({
		coordinates: z
			.array(z.object({ point, axis: z.enum(AXIS_NAMES, { message: "must be 'x', 'y' or 'z'" }), from: mm, to: mm }).refine((c) => c.from < c.to, { path: ['to'], message: 'must be greater than from (an empty or inverted range)' }))
			.min(1, 'pick at least one coordinate')
			.max(MAX_EXPLORE_COORDINATES, `at most ${MAX_EXPLORE_COORDINATES} coordinates`),
		plan: z.enum(EXPLORE_PLANS, { message: "must be 'lhs', 'sobol' or 'factorial'" }).default('lhs'),
		/** variants of a Latin hypercube or Sobol plan */
		variants: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(2, 'must be ≥ 2').max(MAX_EXPLORE_VARIANTS, `must be ≤ ${MAX_EXPLORE_VARIANTS.toLocaleString('en')}`).default(2000),
		/** levels per coordinate of a full factorial plan */
		levels: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(2, 'must be ≥ 2').max(1000, 'must be ≤ 1000').default(5),
		seed: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0').max(2 ** 31 - 1, 'must be < 2^31').default(1),
		travel: travelSchema.default({ from: -40, to: 40, step: 2 })
	})
	.superRefine((v, ctx) => {
		const seen = new Set<string>();
		v.coordinates.forEach((c, i) => {
			const k = `${c.point}.${c.axis}`;
			if (seen.has(k)) ctx.addIssue({ code: 'custom', path: ['coordinates', i, 'axis'], message: `${k} is listed twice` });
			seen.add(k);
		});
		if (v.plan === 'factorial' && Math.pow(v.levels, v.coordinates.length) > MAX_EXPLORE_VARIANTS)
			ctx.addIssue({ code: 'custom', path: ['levels'], message: `${v.levels} levels over ${v.coordinates.length} coordinates give ${Math.pow(v.levels, v.coordinates.length).toExponential(2)} variants, more than ${MAX_EXPLORE_VARIANTS.toLocaleString('en')}` });
	});
export type ExploreRequest = z.infer<typeof exploreInput>;

const column = z.enum(EXPLORE_COLUMNS, { message: `must be one of ${EXPLORE_COLUMNS.join(', ')}` });
const num = z.coerce.number({ message: 'must be a number' }).refine(Number.isFinite, 'must be a number');

export const variantsQuery = z.object({
	sort: z.enum(['idx', ...EXPLORE_COLUMNS], { message: `must be idx or one of ${EXPLORE_COLUMNS.join(', ')}` }).default('idx'),
	dir: z.enum(['asc', 'desc'], { message: "must be 'asc' or 'desc'" }).default('asc'),
	offset: z.coerce.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0').max(MAX_EXPLORE_VARIANTS, 'too far').default(0),
	limit: z.coerce.number({ message: 'must be a whole number' }).int('must be a whole number').min(1, 'must be ≥ 1').max(500, 'must be ≤ 500').default(50),
	ok: z.enum(['all', 'assembles'], { message: "must be 'all' or 'assembles'" }).default('assembles'),
	filter: column.optional(),
	min: num.optional(),
	max: num.optional()
});

export const paretoQuery = z.object({
	x: column.default('toe_rms'),
	y: column.default('rc_migration'),
	/** 'min' or 'max' per objective */
	xSense: z.enum(['min', 'max'], { message: "must be 'min' or 'max'" }).default('min'),
	ySense: z.enum(['min', 'max'], { message: "must be 'min' or 'max'" }).default('min'),
	/** at most this many other points sent for the scatter (spread evenly over the variants) */
	cloud: z.coerce.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0').max(20000, 'must be ≤ 20000').default(2000)
});

export const saveVariantInput = z.object({
	label: z.string().trim().max(120, 'at most 120 characters').default('exploration'),
	note: z.string().max(4000, 'at most 4000 characters').default('')
});
