// The app's rate limits (counted in PostgreSQL through queries/rate-limits.ts). Common-practice figures, no source.
import { error } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { takeRate, takeRateUnlocked } from '$lib/server/db/queries/rate-limits';

export const LIMITS = {
	/** opening one share link (page or CSV) from one client address */
	shareOpen: { windowMs: 10 * 60 * 1000, max: 60 },
	/** mails one account sends (share links, invitations) */
	mailByUser: { windowMs: 60 * 60 * 1000, max: 20 },
	/** password-reset mails to one address, and requests from one client address */
	resetByEmail: { windowMs: 60 * 60 * 1000, max: 3 },
	resetByAddress: { windowMs: 60 * 60 * 1000, max: 20 }
} as const;

export type LimitName = keyof typeof LIMITS;

/** True when one more event of this limit is allowed for key (and counts it). */
export function allow(limit: LimitName, key: string): Promise<boolean> {
	const { windowMs, max } = LIMITS[limit];
	return takeRate(db, limit, key, windowMs, max);
}

/** Stops with 429 when the limit is reached. */
export async function requireRate(limit: LimitName, key: string, message: string) {
	if (!(await allow(limit, key))) error(429, { message, code: 'rate_limited' });
}

/** As allow, in one statement without a lock (the share sheet's hot path; see takeRateUnlocked). */
export function allowUnlocked(limit: LimitName, key: string): Promise<boolean> {
	const { windowMs, max } = LIMITS[limit];
	return takeRateUnlocked(db, limit, key, windowMs, max);
}
