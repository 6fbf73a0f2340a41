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

/**
 * One-statement variant for hot paths (share-link openings): counts and records in one round trip without a
 * transaction or lock, so concurrent openings of one busy link by different readers never wait on each other
 * (each reader's key is its own). Two requests of the same key at the same instant may both pass: the limit can be
 * exceeded by the number of that one client's requests in flight, which for a per-reader limit is acceptable.
 */
export async function takeRateUnlocked(db: Database, bucket: string, key: string, windowMs: number, max: number) {
	const since = new Date(Date.now() - windowMs);
	const rows = await db.execute<{ n: number }>(sql`
		with recent as (
			select count(*)::int as n from ${rateEvents}
			where ${rateEvents.bucket} = ${bucket} and ${rateEvents.key} = ${key} and ${rateEvents.createdAt} > ${since}
		), counted as (
			insert into ${rateEvents} (bucket, key) select ${bucket}, ${key} from recent where recent.n < ${max} returning 1
		)
		select n from recent`);
	return rows[0].n < max;
}

/** Deletes a bucket's events older than windowMs (the unlocked variant leaves them for this sweep). */
export async function sweepRate(db: Database, bucket: string, windowMs: number) {
	await db.delete(rateEvents).where(and(eq(rateEvents.bucket, bucket), lt(rateEvents.createdAt, new Date(Date.now() - windowMs))));
}
