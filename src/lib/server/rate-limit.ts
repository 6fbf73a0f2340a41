// The app's rate limits (counted in PostgreSQL through queries/rate-limits.ts). Common-practice figures, no source.
import { error } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { takeRate } from '$lib/server/db/queries/rate-limits';

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

/** Per-process sliding logs of the limits counted in memory: key → times of the allowed events, oldest first. */
const logs = new Map<string, number[]>();

/**
 * As allow, counted in this process's memory (the share sheet's hot path: no database write per opening, and no
 * shared row or lock, so readers of one busy link never wait on each other). With several app instances each counts
 * its own share, so a client may get up to the limit once per instance.
 */
export function allowLocal(limit: LimitName, key: string, now = Date.now()): boolean {
	const { windowMs, max } = LIMITS[limit];
	const id = `${limit}\u0000${key}`;
	const log = logs.get(id) ?? [];
	while (log.length && log[0] <= now - windowMs) log.shift();
	if (log.length >= max) return false;
	log.push(now);
	logs.set(id, log);
	return true;
}

/** Drops the logs whose events have all left their window (called by the share openings' flush timer). */
export function sweepLocal(now = Date.now()) {
	for (const [id, log] of logs) {
		const limit = id.slice(0, id.indexOf('\u0000')) as LimitName;
		if (!log.length || log[log.length - 1] <= now - LIMITS[limit].windowMs) logs.delete(id);
	}
}
