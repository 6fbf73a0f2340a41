// A study: saved analysis settings of a corner (sweep and range, overlaid revisions). Client-safe.
import { z } from 'zod';

export const studySettingsSchema = z.object({
	sweep: z.enum(['heave', 'roll', 'steer'], { message: "sweep must be 'heave', 'roll' or 'steer'" }),
	from: z.number({ message: 'from must be a number' }),
	to: z.number({ message: 'to must be a number' }),
	step: z.number({ message: 'step must be a number' }).positive('step must be > 0'),
	rack: z.number({ message: 'rack must be a number (mm)' }).default(0),
	overlays: z.array(z.string().uuid('overlays must be revision ids')).max(10, 'at most 10 overlays').default([])
}).refine((s) => s.from <= s.to, { path: ['from'], message: 'from must be <= to' });

export const studyInput = z.object({
	name: z.string().trim().min(1, 'name is required').max(120, 'name is at most 120 characters'),
	settings: studySettingsSchema
});

export type StudySettings = z.infer<typeof studySettingsSchema>;
