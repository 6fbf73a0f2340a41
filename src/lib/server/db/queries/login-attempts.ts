// Sign-in attempts, kept in the database so every app instance sees the same limits.
import { and, eq, gt, or, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { loginAttempts } from '../schema';

/** Records one attempt by e-mail and client address. */
export async function recordLoginAttempt(db: Database, email: string, address: string, succeeded: boolean) {
	await db.insert(loginAttempts).values({ email, address, succeeded });
}

/** Failed attempts since a moment, for the account and for the address. */
export async function recentFailures(db: Database, email: string, address: string, since: Date) {
	const [row] = await db
		.select({
			byEmail: sql<number>`count(*) filter (where ${loginAttempts.email} = ${email})::int`,
			byAddress: sql<number>`count(*) filter (where ${loginAttempts.address} = ${address})::int`
		})
		.from(loginAttempts)
		.where(
			and(
				eq(loginAttempts.succeeded, false),
				gt(loginAttempts.createdAt, since),
				or(eq(loginAttempts.email, email), eq(loginAttempts.address, address))
			)
		);
	return row;
}
