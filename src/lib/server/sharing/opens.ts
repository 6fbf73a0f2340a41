// Share-link openings counted in memory and written in batches: a busy link costs one row update per flush
// instead of one locked update (and an audit insert) per reader. Flushed every FLUSH_MS and on shutdown
// (`flushShareOpens`, registered with the graceful shutdown, which runs it before the pool closes); a failed flush
// keeps its openings for the next one.
import { building } from '$app/environment';
import { db } from '$lib/server/db';
import { addShareOpens, type ShareOpenBatch } from '$lib/server/db/queries/shares';
import { sweepLocal } from '$lib/server/rate-limit';
import { onShutdown } from '$lib/server/lifecycle';

/** An "opened" audit event at most once per link in this period, so refreshing the page does not flood the log. */
export const OPENED_AUDIT_GAP_MS = 30 * 60 * 1000;
/** How often pending openings are written (common practice for batched counters; no source). */
export const FLUSH_MS = 3000;

let pending = new Map<string, ShareOpenBatch>();
let flushing: Promise<void> | null = null;

/** Counts one opening of a link (written at the next flush). */
export function recordShareOpen(shareId: string, teamId: string, detail: Record<string, unknown>) {
	const now = new Date();
	const b = pending.get(shareId);
	if (b) {
		b.count += 1;
		b.last = now;
	} else pending.set(shareId, { shareId, teamId, count: 1, first: now, last: now, detail });
}

/** Openings not yet written, for a link (so lists read right after an opening are exact in this process). */
export function pendingOpens(shareId: string): { count: number; last: Date } | null {
	const b = pending.get(shareId);
	return b ? { count: b.count, last: b.last } : null;
}

/** Merges a batch that could not be written back into the pending openings. */
function putBack(batches: ShareOpenBatch[]) {
	for (const b of batches) {
		const now = pending.get(b.shareId);
		if (!now) pending.set(b.shareId, b);
		else pending.set(b.shareId, { ...b, count: b.count + now.count, last: now.last });
	}
}

/** Writes every pending opening now; resolves when written (or put back after a database error, which it throws). */
export async function flushShareOpens(): Promise<void> {
	while (flushing) await flushing.catch(() => {});
	if (pending.size === 0) return;
	const batches = [...pending.values()];
	pending = new Map();
	flushing = addShareOpens(db, batches, OPENED_AUDIT_GAP_MS).catch((e) => {
		putBack(batches);
		throw e;
	});
	try {
		await flushing;
	} finally {
		flushing = null;
	}
}

let sweeps = 0;
// registered after the database pool (imported above), so it runs before the pool closes (newest step first)
onShutdown('share openings', flushShareOpens);
if (!building) {
	setInterval(() => {
		flushShareOpens().catch((e) => console.error(`share openings kept for the next flush: ${(e as Error).message}`));
		// The in-memory share-open limit keeps a log per reader: drop the finished ones about once a minute.
		if (++sweeps % 20 === 0) sweepLocal();
	}, FLUSH_MS).unref();
}
