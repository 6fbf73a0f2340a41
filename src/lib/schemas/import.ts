// Frame: output points are ISO 8855 vehicle axes, x forward, y left, z up, in mm.
// Options of the CSV point import (POST /api/v1/corners/{cornerId}/import, the `options` JSON
// field of the multipart form). Client-safe: imports only zod.

import { z } from 'zod';
import { ALL_POINT_NAMES } from '../kinds';

/** Limits of the import; all lengths in mm. */
export const IMPORT_LIMITS = {
	/** largest file accepted, bytes (issue 4: upload limit 5 MB) */
	maxFileBytes: 5 * 1024 * 1024,
	/** most data rows read (a point list has tens of rows; a scan export with targets a few hundred; common practice, no source) */
	maxRows: 2000,
	/** |coordinate| beyond this after conversion and alignment is refused (mm, issue 4) */
	maxCoordinateMm: 5000,
	/** a corner whose points span less than this (mm) probably has the wrong unit (common practice, no source) */
	minSpanMm: 40,
	/** a corner whose points span more than this (mm) cannot be one corner (issue 4) */
	maxSpanMm: 5000,
	/** default left/right difference worth reporting (mm; common practice, no source) */
	symmetryThresholdMm: 2,
	/** points closer than this to a line (mm) count as collinear for alignment */
	collinearMm: 1e-3
} as const;

/** Every point name of every kind, the spring ends and the rocker's points (`rocker.pivot_a`, ...). */
export const KNOWN_POINTS: readonly string[] = ALL_POINT_NAMES;

export const UNITS = ['mm', 'cm', 'm', 'in'] as const;
export type LengthUnit = (typeof UNITS)[number];

/** A signed source axis: ISO axis = ± this source axis. */
export const SIGNED_AXES = ['+x', '-x', '+y', '-y', '+z', '-z'] as const;
export type SignedAxis = (typeof SIGNED_AXES)[number];

const signedAxis = z.enum(SIGNED_AXES, { error: "must be one of '+x', '-x', '+y', '-y', '+z', '-z'" });

/** `{ x: '-y', y: '+x', z: '+z' }` means ISO x = −(source y), ISO y = +(source x), ISO z = +(source z). */
export const axisMapSchema = z
	.object({ x: signedAxis, y: signedAxis, z: signedAxis })
	.refine((m) => new Set([m.x[1], m.y[1], m.z[1]]).size === 3, {
		message: 'each source axis (x, y, z) must be used exactly once'
	});
export type AxisMap = z.infer<typeof axisMapSchema>;

export const axesSchema = z.union([z.literal('iso8855'), z.literal('sae_j670'), axisMapSchema], {
	error: "must be 'iso8855', 'sae_j670' or { x, y, z } of signed source axes"
});
export type AxesOption = z.infer<typeof axesSchema>;

/** A column: its header name, or its 0-based index. */
const columnRef = z.union([z.string().trim().min(1, 'must not be empty'), z.number().int().min(0, 'must be >= 0')], {
	error: 'must be a header name or a 0-based column index'
});
export type ColumnRef = z.infer<typeof columnRef>;

export const columnsSchema = z.object({
	name: columnRef,
	x: columnRef,
	y: columnRef,
	z: columnRef,
	side: columnRef.optional()
});
export type ColumnsOption = z.infer<typeof columnsSchema>;

const pointName = z.string().trim().min(1, 'must not be empty');
const mm = z.number({ error: 'must be a number (mm)' }).refine(Number.isFinite, 'must be finite (mm)');
const point = z.tuple([mm, mm, mm], { error: 'must be [x, y, z] in mm' });

/**
 * Three datum points A, B, C (file names or our names). Convention: A is the origin, A→B the +x
 * direction, C lies in the x–y plane on the +y side; z = x × y. With `targets` (vehicle mm, or
 * 'current' for the current revision's points of the same names) the measured A, B, C frame is
 * mapped onto the same frame built from the targets (frame-to-frame rigid transform).
 */
export const datumAlignmentSchema = z.object({
	method: z.literal('datum'),
	points: z.tuple([pointName, pointName, pointName], { error: 'must be three point names [A, B, C]' }),
	targets: z.union([z.literal('current'), z.tuple([point, point, point])]).optional()
});

/** Best-fit rigid transform (no scale) onto the current revision's points of the same names. */
export const bestFitAlignmentSchema = z.object({
	method: z.literal('best_fit'),
	names: z.array(pointName).min(3, 'needs at least 3 point names').optional()
});

export const alignmentSchema = z.discriminatedUnion(
	'method',
	[z.object({ method: z.literal('none') }), datumAlignmentSchema, bestFitAlignmentSchema],
	{ error: "method must be 'none', 'datum' or 'best_fit'" }
);
export type AlignmentOption = z.infer<typeof alignmentSchema>;

export const importOptionsSchema = z.object({
	columns: columnsSchema.optional(),
	header: z.union([z.boolean(), z.literal('auto')]).default('auto'),
	delimiter: z.enum(['auto', ',', ';', '\t'], { error: "must be 'auto', ',', ';' or a tab" }).default('auto'),
	decimal: z.enum(['auto', '.', ','], { error: "must be 'auto', '.' or ','" }).default('auto'),
	unit: z.enum(UNITS, { error: "must be 'mm', 'cm', 'm' or 'in'" }),
	axes: axesSchema.default('iso8855'),
	/** file name → our point name, for this import (over the team aliases) */
	names: z.record(z.string(), pointName).default({}),
	/** which side's rows to keep when a side column is mapped */
	side: z.enum(['left', 'right'], { error: "must be 'left' or 'right'" }).optional(),
	/** mirror y → −y in the vehicle frame (make the other side) */
	mirror: z.boolean().default(false),
	alignment: alignmentSchema.default({ method: 'none' }),
	symmetryThresholdMm: z.number().positive('must be > 0').default(IMPORT_LIMITS.symmetryThresholdMm)
});

/** Options as given (JSON); defaults not yet applied. */
export type ImportOptionsInput = z.input<typeof importOptionsSchema>;
/** Options after parsing, defaults applied. */
export type ImportOptions = z.output<typeof importOptionsSchema>;
