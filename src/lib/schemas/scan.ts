// Inputs of the scan endpoints (issue 17), shared by the pages and the API. Client-safe: imports only zod.
import { z } from 'zod';
import { POINT_NAME } from './geometry';

export const SCAN_LIMITS = {
	/** largest original accepted (issue 17) */
	maxBytes: 500 * 1024 * 1024,
	/** smallest multipart part (S3's minimum for all parts but the last) and the part size used up to 80 MB */
	partBytes: 8 * 1024 * 1024,
	/** S3's most parts in one upload */
	maxParts: 10_000,
	/** datum picks and captured points: coordinates beyond this (mm, after the unit) are refused */
	maxCoordinateMm: 100_000,
	/** points one fit may report using, at most (a patch of the preview) */
	maxFitPoints: 10_000_000
} as const;

export const SCAN_EXTENSIONS = { stl: 'stl', ply: 'ply', obj: 'obj' } as const;

/** The format of a file name's extension, or null. */
export function formatOfName(name: string): 'stl' | 'ply' | 'obj' | null {
	const ext = /\.([A-Za-z0-9]+)$/.exec(name)?.[1]?.toLowerCase() ?? '';
	return (SCAN_EXTENSIONS as Record<string, 'stl' | 'ply' | 'obj'>)[ext] ?? null;
}

/** The part size of an upload of `size` bytes: 8 MB, larger when 10 000 parts would not hold it. */
export function partSizeOf(size: number): number {
	return Math.max(SCAN_LIMITS.partBytes, Math.ceil(size / SCAN_LIMITS.maxParts));
}

export const newScanSchema = z.object({
	name: z
		.string({ error: 'must be the file name' })
		.trim()
		.min(1, 'must not be empty')
		.max(200, 'must be at most 200 characters')
		.refine((n) => formatOfName(n) !== null, 'must end in .stl, .ply or .obj (other formats are not read)'),
	size: z
		.number({ error: 'must be the file size in bytes' })
		.int('must be a whole number of bytes')
		.min(1, 'the file is empty')
		.max(SCAN_LIMITS.maxBytes, `the file is over the limit of ${SCAN_LIMITS.maxBytes / 1024 / 1024} MB`),
	cornerId: z.string().uuid('must be a corner id').optional()
});
export type NewScanInput = z.infer<typeof newScanSchema>;

export const completeScanSchema = z.object({
	parts: z
		.array(
			z.object({
				partNumber: z.number().int().min(1).max(SCAN_LIMITS.maxParts),
				etag: z.string().min(1, 'must be the ETag the part upload answered').max(200)
			}),
			{ error: 'must be the list of uploaded parts' }
		)
		.min(1, 'must list at least one part')
		.max(SCAN_LIMITS.maxParts)
});

const coordinate = z.number({ error: 'must be a number' }).finite('must be a finite number');
export const vec3Schema = z.tuple([coordinate, coordinate, coordinate], { error: 'must be [x, y, z]' });

/** A point picked on the scan, in the scan's file coordinates (its own units and axes). */
const pick = z.object({ name: z.string().regex(POINT_NAME, 'must be a point name'), at: vec3Schema });

export const alignmentSchema = z.discriminatedUnion(
	'method',
	[
		z.object({
			method: z.literal('datum'),
			unit: z.enum(['mm', 'm', 'in'], { error: "must be 'mm', 'm' or 'in'" }),
			picks: z.array(pick).length(3, 'must be exactly three datum picks (A, B, C)')
		}),
		z.object({
			method: z.literal('best_fit'),
			unit: z.enum(['mm', 'm', 'in'], { error: "must be 'mm', 'm' or 'in'" }),
			picks: z.array(pick).min(3, 'must be at least three picks on points the revision has').max(100)
		}),
		z.object({ method: z.literal('none'), unit: z.enum(['mm', 'm', 'in'], { error: "must be 'mm', 'm' or 'in'" }) })
	],
	{ error: "method must be 'datum', 'best_fit' or 'none'" }
);
export type AlignmentInput = z.infer<typeof alignmentSchema>;

export const FIT_KINDS = ['point', 'sphere', 'cylinder', 'plane_circle'] as const;

export const captureSchema = z.object({
	cornerId: z.string().uuid('must be a corner id'),
	label: z.string().trim().max(200, 'must be at most 200 characters').default(''),
	note: z.string().trim().max(2000, 'must be at most 2000 characters').default(''),
	points: z
		.record(
			z.string().regex(POINT_NAME, 'must be a point name'),
			z.object({
				/** vehicle axes, mm (after the scan's unit and alignment) */
				at: vec3Schema,
				fit: z.enum(FIT_KINDS, { error: "must be 'point', 'sphere', 'cylinder' or 'plane_circle'" }),
				residualMm: z.number().finite().min(0, 'must be >= 0').nullable().default(null),
				pointsUsed: z.number().int().min(1).max(SCAN_LIMITS.maxFitPoints).nullable().default(null)
			})
		)
		.refine((p) => Object.keys(p).length > 0, 'must assign at least one point')
});
export type CaptureInput = z.infer<typeof captureSchema>;

const queryNumber = (field: string) =>
	z.coerce.number({ error: `${field} must be a number` }).refine(Number.isFinite, { error: `${field} must be a finite number` });

/** GET /api/v1/scans/{id}/patch: a ball in the scan file's own coordinates and unit. */
export const patchQuerySchema = z.object({
	x: queryNumber('x'),
	y: queryNumber('y'),
	z: queryNumber('z'),
	r: queryNumber('r').refine((v) => v > 0, { error: 'r must be greater than 0' })
});
