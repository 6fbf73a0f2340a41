// Car inputs, shared by the forms and API v1. Lengths in mm.
import { z } from 'zod';

/** A number field that may be left empty (null); form strings are converted. */
function optionalNumber(label: string, min: number, max: number, unit: string, minExclusive = false) {
	const range = `${label} must be ${minExclusive ? 'above' : 'from'} ${min}${unit} ${minExclusive ? 'and at most' : 'to'} ${max}${unit}`;
	return z.preprocess(
		(v) => (v === '' || v === undefined || v === null ? null : typeof v === 'string' ? Number(v.replace(',', '.')) : v),
		z
			.number({ message: `${label} must be a number` })
			.refine((n) => Number.isFinite(n), `${label} must be a number`)
			.refine((n) => (minExclusive ? n > min : n >= min) && n <= max, range)
			.nullable()
	);
}

const fields = {
	name: z.string({ message: 'Name is required' }).trim().min(1, 'Name is required').max(120, 'Name is at most 120 characters'),
	series: z.string().trim().max(120, 'Class or series is at most 120 characters'),
	wheelbaseMm: optionalNumber('Wheelbase', 0, 10000, ' mm', true),
	cgHeightMm: optionalNumber('CG height', 0, 3000, ' mm', true),
	frontBrakeFraction: optionalNumber('Front brake fraction', 0, 1, ''),
	driveLayout: z.preprocess(
		(v) => (v === '' ? null : v),
		z.enum(['fwd', 'rwd', 'awd'], { message: 'Drive layout must be fwd, rwd or awd' }).nullable()
	),
	notes: z.string().max(5000, 'Notes are at most 5000 characters')
};

export const carInput = z.object({
	...fields,
	series: fields.series.default(''),
	wheelbaseMm: fields.wheelbaseMm.default(null),
	cgHeightMm: fields.cgHeightMm.default(null),
	frontBrakeFraction: fields.frontBrakeFraction.default(null),
	driveLayout: fields.driveLayout.default(null),
	notes: fields.notes.default('')
});

/** A partial update: only the fields sent are changed. */
export const carPatch = z
	.object(fields)
	.partial()
	.strict()
	.refine((p) => Object.keys(p).length > 0, 'Send at least one field to change');

export type CarInput = z.infer<typeof carInput>;
export type CarPatch = z.infer<typeof carPatch>;
export const DRIVE_LAYOUT_LABELS = { fwd: 'Front-wheel drive', rwd: 'Rear-wheel drive', awd: 'All-wheel drive' } as const;
