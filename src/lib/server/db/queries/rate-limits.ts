// Rate-limit counters in the database, so every app instance agrees on how many events a key had.
import { and, eq, gt, lt, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { rateEvents } from '../schema';

/**
 * Counts the events of (bucket, key) within the last windowMs and records one more when fewer than max;
 * true when this event was allowed. A transaction-scoped advisory lock on the pair makes it race-free.
 */
export async function takeRate(db: Database, bucket: string, key: string, windowMs: number, max: number) {
	return db.transaction(async (tx) => {
		await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${bucket}), hashtext(${key}))`);
		const since = new Date(Date.now() - windowMs);
		await tx.delete(rateEvents).where(and(eq(rateEvents.bucket, bucket), eq(rateEvents.key, key), lt(rateEvents.createdAt, since)));
		const [row] = await tx
			.select({ n: sql<number>`count(*)::int` })
			.from(rateEvents)
			.where(and(eq(rateEvents.bucket, bucket), eq(rateEvents.key, key), gt(rateEvents.createdAt, since)));
		if (row.n >= max) return false;
		await tx.insert(rateEvents).values({ bucket, key });
		return true;
	});
}

