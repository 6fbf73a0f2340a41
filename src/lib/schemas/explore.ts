// Inputs of a design-space exploration (issue 18). Client-safe: zod only. Offsets in mm from the point as it is.
import { z } from 'zod';
import { AXIS_NAMES, MOVABLE_POINTS, travelSchema } from './analysis';

export const EXPLORE_PLANS = ['lhs', 'sobol', 'factorial'] as const;
export const EXPLORE_COLUMNS = ['toe_rms', 'camber_gain', 'rc_height', 'rc_migration', 'motion_ratio', 'steer_ratio'] as const;
export type ExploreColumn = (typeof EXPLORE_COLUMNS)[number];
/** What a study keeps when the request does not say: every measure but the steering ratio (which needs the car model's steering). */
export const DEFAULT_EXPLORE_COLUMNS: ExploreColumn[] = ['toe_rms', 'camber_gain', 'rc_height', 'rc_migration', 'motion_ratio'];
/** Labels and units of the measures, for the page and its charts. */
export const EXPLORE_COLUMN_INFO: Record<ExploreColumn, { short: string; label: string; unit: string }> = {
	toe_rms: { short: 'toe RMS', label: 'Toe change RMS over the travel', unit: '°' },
	camber_gain: { short: 'camber gain', label: 'Camber gain at design', unit: '°/mm' },
	rc_height: { short: 'RC height', label: 'Roll-centre height at design', unit: 'mm' },
	rc_migration: { short: 'RC migration', label: 'Roll-centre migration over the travel (max − min)', unit: 'mm' },
	motion_ratio: { short: 'motion ratio', label: 'Motion ratio at design', unit: '' },
	steer_ratio: { short: 'steering ratio', label: 'Steering ratio at straight ahead (steering-wheel ° per road-wheel °)', unit: '' }
};
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
		travel: travelSchema.default({ from: -40, to: 40, step: 2 }),
		/** the measures kept per variant (only these are solved and stored) */
		measures: z
			.array(z.enum(EXPLORE_COLUMNS, { message: `must be one of ${EXPLORE_COLUMNS.join(', ')}` }))
			.min(1, 'pick at least one measure')
			.max(EXPLORE_COLUMNS.length, `at most ${EXPLORE_COLUMNS.length} measures`)
			.default(DEFAULT_EXPLORE_COLUMNS),
		/** steering-wheel degrees each way through which the keep-out volumes are checked (with the car model's steering) */
		steeringLock: z.number({ message: 'must be a number (steering-wheel degrees each way)' }).gt(0, 'must be > 0°').max(1080, 'must be at most 1080° (three turns)').default(360)
	})
	.superRefine((v, ctx) => {
		const kept = new Set<string>();
		v.measures.forEach((m, i) => {
			if (kept.has(m)) ctx.addIssue({ code: 'custom', path: ['measures', i], message: `${m} is listed twice` });
			kept.add(m);
		});
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
	/** 'clear': assembles and clear of the keep-out volumes; 'blocked': assembles but reaches into one */
	ok: z.enum(['all', 'assembles', 'clear', 'blocked'], { message: "must be 'all', 'assembles', 'clear' or 'blocked'" }).default('assembles'),
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
	/** a third objective (optional): the front is then the non-dominated set of three */
	z: column.optional(),
	zSense: z.enum(['min', 'max'], { message: "must be 'min' or 'max'" }).default('min'),
	/** only variants clear of the keep-out volumes */
	clear: z.enum(['any', 'only'], { message: "must be 'any' or 'only'" }).default('any'),
	/** at most this many other points sent for the scatter (spread evenly over the variants) */
	cloud: z.coerce.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0').max(20000, 'must be ≤ 20000').default(2000)
});

export const saveVariantInput = z.object({
	label: z.string().trim().max(120, 'at most 120 characters').default('exploration'),
	note: z.string().max(4000, 'at most 4000 characters').default('')
});

export const matrixQuery = z.object({
	/** at most this many variants (that assemble), spread evenly over the study, for the scatter-plot matrix */
	sample: z.coerce.number({ message: 'must be a whole number' }).int('must be a whole number').min(10, 'must be ≥ 10').max(5000, 'must be ≤ 5000').default(1500)
});
