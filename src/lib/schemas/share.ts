// Share links (read-only links to one revision for the fabricator).
import { z } from 'zod';
import { email } from './auth';

export const SHARE_DEFAULT_DAYS = 30;
export const SHARE_MAX_DAYS = 365;

/** An empty form field counts as not given. */
const blankToUndefined = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

/** POST /api/v1/revisions/{id}/shares and the revision page's form. */
export const createShareInput = z.object({
	expiresInDays: z.preprocess(
		blankToUndefined,
		z.coerce
			.number({ message: 'expiresInDays must be a number of days' })
			.int('expiresInDays must be a whole number of days')
			.min(1, 'expiresInDays must be at least 1')
			.max(SHARE_MAX_DAYS, `expiresInDays must be at most ${SHARE_MAX_DAYS}`)
			.default(SHARE_DEFAULT_DAYS)
	),
	note: z.preprocess((v) => v ?? '', z.string({ message: 'note must be text' }).trim().max(1000, 'note is at most 1000 characters')),
	email: z.preprocess(blankToUndefined, email.optional()),
	/** show the revision's internal note on the sheet (a ticked checkbox sends "on"); off unless asked for */
	showRevisionNote: z.preprocess(
		(v) => (v === undefined || v === null || v === '' ? false : v === 'on' || v === 'true' ? true : v === 'false' ? false : v),
		z.boolean({ message: 'showRevisionNote must be true or false' })
	)
});

export type CreateShareInput = z.infer<typeof createShareInput>;

/** The token of a link as it appears in /s/{token}: URL-safe base64 of 32 random bytes. */
export const SHARE_TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

/** A link to one axle of a car revision: the axle, then the same expiry and note as a revision's link. */
export const createAxleShareInput = createShareInput.omit({ email: true, showRevisionNote: true }).extend({
	axle: z.enum(['front', 'rear'], { message: "axle must be 'front' or 'rear'" })
});
export type CreateAxleShareInput = z.infer<typeof createAxleShareInput>;
