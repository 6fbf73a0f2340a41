// Sign-in attempts, kept in the database so every app instance sees the same limits.
import { and, eq, gt, isNull, or, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { loginAttempts } from '../schema';

/** Records one attempt by e-mail and client address, and the known device's token hash when it came from one. */
export async function recordLoginAttempt(db: Database, email: string, address: string, succeeded: boolean, device: string | null = null) {
	await db.insert(loginAttempts).values({ email, address, succeeded, device });
}

/** Failures counted and the moment of the last one. */
export interface FailureCount {
	count: number;
	last: Date | null;
}

/**
 * Failed attempts since a moment: of the pair (this account from this address, or from this known device when
 * one is given), and of the address as a whole (attempts from known devices not counted).
 */
export async function recentFailures(db: Database, email: string, address: string, device: string | null, since: Date) {
	const pair = device ? eq(loginAttempts.device, device) : and(eq(loginAttempts.address, address), isNull(loginAttempts.device));
	const fromAddress = and(eq(loginAttempts.address, address), isNull(loginAttempts.device));
	const [row] = await db
		.select({
			pairCount: sql<number>`count(*) filter (where ${loginAttempts.email} = ${email} and ${pair})::int`,
			pairLast: sql<string | null>`max(${loginAttempts.createdAt}) filter (where ${loginAttempts.email} = ${email} and ${pair})`,
			addressCount: sql<number>`count(*) filter (where ${fromAddress})::int`,
			addressLast: sql<string | null>`max(${loginAttempts.createdAt}) filter (where ${fromAddress})`
		})
		.from(loginAttempts)
		.where(and(eq(loginAttempts.succeeded, false), gt(loginAttempts.createdAt, since), or(eq(loginAttempts.email, email), eq(loginAttempts.address, address))));
	const at = (v: string | null) => (v ? new Date(v) : null);
	return {
		pair: { count: row.pairCount, last: at(row.pairLast) } satisfies FailureCount,
		address: { count: row.addressCount, last: at(row.addressLast) } satisfies FailureCount
	};
}
