// Inputs of the analyses of a revision: fix search, sensitivity, tolerance study, adopted tolerances.
// Client-safe: zod only. Lengths in mm, angles in degrees, travel = heave wheel travel (+ bump).
import { z } from 'zod';
import { LINKAGE_POINT_NAMES } from '../kinds';
import { keepOutListSchema } from './keep-out';

/** Points a fix may move or a tolerance may apply to: every kind's linkage and rocker points, not the wheel or the spring ends. */
export const MOVABLE_POINTS = LINKAGE_POINT_NAMES;
export const FIT_MEASURES = ['toe', 'camber', 'caster', 'kpi', 'rc_height', 'half_track_change', 'motion_ratio', 'rocker_angle'] as const;
export type FitMeasureKey = (typeof FIT_MEASURES)[number];
export const AXIS_NAMES = ['x', 'y', 'z'] as const;

/** Analyses refuse grids larger than this (positions). */
export const MAX_ANALYSIS_POSITIONS = 401;

const point = z.string({ message: 'must be a point name' }).refine((p) => MOVABLE_POINTS.includes(p), { message: `must be one of ${MOVABLE_POINTS.join(', ')}` });
const axis = z.enum(AXIS_NAMES, { message: "must be 'x', 'y' or 'z'" });

export const travelSchema = z
	.object({
		from: z.number({ message: 'must be a number (mm)' }).min(-200, 'must be ≥ -200 mm').max(0, 'must be ≤ 0 (the range includes design)'),
		to: z.number({ message: 'must be a number (mm)' }).min(0, 'must be ≥ 0 (the range includes design)').max(200, 'must be ≤ 200 mm'),
		step: z.number({ message: 'must be a number (mm)' }).positive('must be > 0')
	})
	.refine((t) => t.from < t.to, { path: ['from'], message: 'must be < to' })
	.refine((t) => Number.isInteger(Math.round(t.from / t.step * 1e9) / 1e9), { path: ['step'], message: 'must divide from, so travel 0 is on the grid' })
	.refine((t) => (t.to - t.from) / t.step + 1 <= MAX_ANALYSIS_POSITIONS, { path: ['step'], message: `gives more than ${MAX_ANALYSIS_POSITIONS} positions` });

export const freeCoordinateSchema = z
	.object({
		point,
		axis,
		/** the move stays within -bound…+bound mm */
		bound: z.number({ message: 'must be a number (mm)' }).positive('must be > 0 mm').max(100, 'must be ≤ 100 mm')
	});

export const fixSearchInput = z
	.object({
		free: z.array(freeCoordinateSchema).min(1, 'pick at least one coordinate').max(12, 'at most 12 coordinates'),
		target: z.discriminatedUnion('kind', [
			z.object({ kind: z.literal('revision'), revisionId: z.string().uuid('must be a revision id') }),
			z.object({ kind: z.literal('zero') }),
			z.object({ kind: z.literal('band'), min: z.number({ message: 'must be a number' }), max: z.number({ message: 'must be a number' }) })
				.refine((b) => b.min <= 0 && b.max >= 0, { path: ['min'], message: 'the band must contain 0 (no change at design)' })
		], { message: "kind must be 'revision', 'zero' or 'band'" }),
		measures: z
			.array(z.object({ key: z.enum(FIT_MEASURES, { message: `must be one of ${FIT_MEASURES.join(', ')}` }), weight: z.number({ message: 'must be a number' }).positive('must be > 0').max(1000, 'must be ≤ 1000') }))
			.min(1, 'pick at least one measure')
			.max(6, 'at most 6 measures'),
		travel: travelSchema.default({ from: -40, to: 40, step: 2 }),
		starts: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(1, 'must be ≥ 1').max(16, 'must be ≤ 16').default(5),
		/** keep-out volumes (the car model's `keep_out` entries): moved points and the members ending on them stay out */
		keepOut: keepOutListSchema.default([]),
		/** the steering system: the steering range the volumes are checked through, and the steering ratio's band */
		steering: z
			.object({
				rackTravelPerTurn: z.number({ message: 'must be a number (mm of rack travel per steering-wheel turn)' }).gt(0, 'must be > 0 mm per turn (a rack that does not move cannot steer)').max(500, 'must be at most 500 mm per turn'),
				/** steering-wheel degrees each way from straight ahead */
				lock: z.number({ message: 'must be a number (steering-wheel degrees each way)' }).gt(0, 'must be > 0°').max(1080, 'must be at most 1080° (three turns)').default(360),
				/** hold this wheel's overall steering ratio (steering-wheel ° per road-wheel °) inside min…max through the range */
				ratio: z
					.object({
						min: z.number({ message: 'must be a number (:1)' }).positive('must be > 0'),
						max: z.number({ message: 'must be a number (:1)' }).positive('must be > 0'),
						weight: z.number({ message: 'must be a number' }).positive('must be > 0').max(1000, 'must be ≤ 1000').default(1)
					})
					.refine((r) => r.min < r.max, { path: ['max'], message: 'must be greater than min' })
					.optional()
			})
			.optional(),
		/** store the result in this study of the corner (needs edit rights) */
		study: z.string().trim().min(1, 'name is required').max(120, 'at most 120 characters').optional()
	})
	.superRefine((v, ctx) => {
		const seen = new Set<string>();
		v.free.forEach((f, i) => {
			const k = `${f.point}.${f.axis}`;
			if (seen.has(k)) ctx.addIssue({ code: 'custom', path: ['free', i, 'axis'], message: `${k} is listed twice` });
			seen.add(k);
		});
		const keys = new Set<string>();
		v.measures.forEach((m, i) => {
			if (keys.has(m.key)) ctx.addIssue({ code: 'custom', path: ['measures', i, 'key'], message: `${m.key} is listed twice` });
			keys.add(m.key);
		});
	});
export type FixSearchRequest = z.infer<typeof fixSearchInput>;

export const movesInput = z.object({
	moves: z
		.array(z.object({ point, axis, move: z.number({ message: 'must be a number (mm)' }).min(-100, 'must be ≥ -100 mm').max(100, 'must be ≤ 100 mm') }))
		.min(1, 'at least one move')
		.max(30, 'at most 30 moves'),
	label: z.string().trim().max(120, 'at most 120 characters').default('fix search'),
	note: z.string().max(4000, 'at most 4000 characters').default('')
});

export const sensitivityInput = z.object({
	travel: travelSchema.default({ from: -40, to: 40, step: 2 })
});

export const pointToleranceSchema = z.object({
	mm: z.number({ message: 'must be a number (mm)' }).positive('must be > 0 mm').max(20, 'must be ≤ 20 mm'),
	mode: z.enum(['axis', 'sphere'], { message: "must be 'axis' or 'sphere'" }).default('axis')
});

/** A tolerance study of this many samples or more is split into chunks on the job queue (issue 18); fewer run in the request. */
export const QUEUED_TOLERANCE_SAMPLES = 20_000;
/** The most samples a study takes (every sample's curves are kept until the bands are taken: about 1 KB each). */
export const MAX_TOLERANCE_SAMPLES = 100_000;

export const toleranceStudyInput = z.object({
	/** per point; points left out get `default` */
	points: z.partialRecord(point, pointToleranceSchema).default({}),
	default: pointToleranceSchema.default({ mm: 0.5, mode: 'axis' }),
	/** from QUEUED_TOLERANCE_SAMPLES on, the study runs through the job queue's workers */
	samples: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(50, 'must be ≥ 50').max(MAX_TOLERANCE_SAMPLES, `must be ≤ ${MAX_TOLERANCE_SAMPLES}`).default(2000),
	seed: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0').max(2 ** 32 - 1, 'must be < 2^32').default(1),
	distribution: z.enum(['normal', 'uniform'], { message: "must be 'normal' or 'uniform'" }).default('normal'),
	travel: travelSchema.default({ from: -40, to: 40, step: 2 }),
	/** the measure the suggested tolerances keep inside its band (change from design over the travel) */
	target: z
		.object({ measure: z.enum(FIT_MEASURES, { message: `must be one of ${FIT_MEASURES.join(', ')}` }), min: z.number({ message: 'must be a number' }), max: z.number({ message: 'must be a number' }) })
		.refine((t) => t.min < 0 && t.max > 0, { path: ['min'], message: 'the band must contain 0 (no change at design)' })
		.default({ measure: 'toe', min: -0.1, max: 0.1 }),
	threads: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0').max(8, 'must be ≤ 8').default(2),
	study: z.string().trim().min(1, 'name is required').max(120, 'at most 120 characters').optional()
});
export type ToleranceStudyRequest = z.infer<typeof toleranceStudyInput>;

/** The shop-link contract (issue 6 reads it): results.tolerances of a study row. */
export const adoptedTolerancesInput = z.object({
	revisionId: z.string().uuid('must be a revision id'),
	points: z.partialRecord(point, z.object({ mm: pointToleranceSchema.shape.mm, mode: z.enum(['axis', 'sphere'], { message: "must be 'axis' or 'sphere'" }) }))
		.refine((p) => Object.keys(p).length > 0, 'at least one point')
});
export interface AdoptedTolerances {
	revisionId: string;
	points: Record<string, { mm: number; mode: 'axis' | 'sphere' }>;
	updatedAt: string;
}

/** A ride-height change as a new design position: the body lowered (−) or raised (+) by `change` mm. */
export const rideHeightInput = z.object({
	change: z
		.number({ message: 'must be a number (mm, − = lower)' })
		.min(-100, 'must be ≥ -100 mm')
		.max(100, 'must be ≤ 100 mm')
		.refine((v) => v !== 0, 'must not be 0 (no change)'),
	/** save the new design position as a revision (needs edit rights); otherwise only the figures are answered */
	save: z.boolean({ message: 'must be true or false' }).default(false),
	label: z.string().trim().max(120, 'at most 120 characters').optional(),
	note: z.string().max(4000, 'at most 4000 characters').default('')
});

/** Joint names a limit may be set for: every kind's points, the rocker's and the spring's (a joint is at a point). */
const jointPoint = z.string({ message: 'must be a point name' }).regex(/^[a-z_]+\.[a-z_]+$/, 'must be a point name such as steer.outer');

/** One joint's limit (degrees of misalignment) and the axis of its stud or bolt. */
export const jointSettingSchema = z.object({
	limit: z.number({ message: 'must be a number (degrees)' }).gt(0, 'must be > 0°').max(60, 'must be ≤ 60°').optional(),
	axis: z.enum(['auto', 'x', 'y', 'z'], { message: "must be 'auto', 'x', 'y' or 'z'" }).optional()
});

/** The joint settings of a corner: point name → setting. */
export const jointSettingsSchema = z.record(jointPoint, jointSettingSchema).refine((r) => Object.keys(r).length <= 64, 'at most 64 joints');

export const jointSettingsInput = z.object({ joints: jointSettingsSchema });

const jointRange = (lo: number, hi: number, unit: string) =>
	z
		.object({
			from: z.number({ message: `must be a number (${unit})` }).min(lo, `must be ≥ ${lo} ${unit}`).max(0, 'must be ≤ 0 (the range includes design)'),
			to: z.number({ message: `must be a number (${unit})` }).min(0, 'must be ≥ 0 (the range includes design)').max(hi, `must be ≤ ${hi} ${unit}`),
			step: z.number({ message: `must be a number (${unit})` }).positive('must be > 0')
		})
		.refine((t) => t.from < t.to, { path: ['from'], message: 'must be < to' })
		.refine((t) => (t.to - t.from) / t.step + 1 <= MAX_ANALYSIS_POSITIONS, { path: ['step'], message: `gives more than ${MAX_ANALYSIS_POSITIONS} positions` });

/** POST /api/v1/revisions/{id}/joint-angles: the sweeps (default: the solve command's) and settings over the corner's. */
export const jointAnglesInput = z.object({
	heave: jointRange(-200, 200, 'mm').optional(),
	roll: jointRange(-10, 10, '°').optional(),
	steer: jointRange(-200, 200, 'mm').optional(),
	/** leave a sweep out (a rear toe link's rack travel is not a motion the car makes) */
	sweeps: z.array(z.enum(['heave', 'roll', 'steer'], { message: "must be 'heave', 'roll' or 'steer'" })).min(1, 'pick at least one sweep').optional(),
	/** settings tried over the corner's saved ones, without saving them */
	joints: jointSettingsSchema.optional()
});

/** A motion map's ranges until the engineer types others (wheel travel and rack in mm, roll in degrees). */
export const MAP_DEFAULT_RANGES: Readonly<Record<'heave' | 'steer' | 'roll', Readonly<{ from: number; to: number; step: number }>>> = {
	heave: { from: -40, to: 40, step: 5 },
	steer: { from: -40, to: 40, step: 5 },
	roll: { from: -3, to: 3, step: 0.5 }
};

/** Cells per side of a motion map, at most. */
export const MAX_MAP_SIDE = 41;

const mapRange = (lo: number, hi: number, unit: string) =>
	z
		.object({
			from: z.number({ message: `must be a number (${unit})` }).min(lo, `must be ≥ ${lo} ${unit}`).max(hi, `must be ≤ ${hi} ${unit}`),
			to: z.number({ message: `must be a number (${unit})` }).min(lo, `must be ≥ ${lo} ${unit}`).max(hi, `must be ≤ ${hi} ${unit}`),
			step: z.number({ message: `must be a number (${unit})` }).positive('must be > 0')
		})
		.refine((t) => t.from < t.to, { path: ['from'], message: 'must be < to' })
		.refine((t) => Math.abs((t.to - t.from) / t.step - Math.round((t.to - t.from) / t.step)) < 1e-9, { path: ['step'], message: 'must divide to − from' })
		.refine((t) => (t.to - t.from) / t.step + 1 <= MAX_MAP_SIDE, { path: ['step'], message: `gives more than ${MAX_MAP_SIDE} positions` });

/** POST /api/v1/revisions/{id}/map: toe and camber over wheel travel × rack travel, or × body roll. */
export const motionMapInput = z.discriminatedUnion(
	'kind',
	[
		z.object({ kind: z.literal('heave_steer'), heave: mapRange(-150, 150, 'mm'), steer: mapRange(-150, 150, 'mm') }),
		z.object({
			kind: z.literal('heave_roll'),
			heave: mapRange(-150, 150, 'mm'),
			roll: mapRange(-10, 10, '°'),
			rack: z.number({ message: 'must be a number (mm)' }).min(-150, 'must be ≥ -150 mm').max(150, 'must be ≤ 150 mm').default(0)
		})
	],
	{ message: "kind must be 'heave_steer' or 'heave_roll'" }
);

/** POST /api/v1/cars/{id}/ride-height: the front and rear corners lowered (−) or raised (+), mm. */
export const carRideHeightInput = z
	.object({
		front: z.number({ message: 'must be a number (mm, − = lower)' }).min(-100, 'must be ≥ -100 mm').max(100, 'must be ≤ 100 mm'),
		rear: z.number({ message: 'must be a number (mm, − = lower)' }).min(-100, 'must be ≥ -100 mm').max(100, 'must be ≤ 100 mm'),
		save: z.boolean({ message: 'must be true or false' }).default(false),
		note: z.string().max(4000, 'at most 4000 characters').default('')
	})
	.refine((v) => v.front !== 0 || v.rear !== 0, { path: ['front'], message: 'front and rear are both 0 (no change)' });
