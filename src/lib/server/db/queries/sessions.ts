// Browser sessions (one row per sign-in) and the known devices of sign-in throttling.
import { and, eq, isNull, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { knownDevices, sessions, users } from '../schema';

/** Records a new session of a user, valid until expiresAt; returns its id (carried in the session cookie). */
export async function createSession(db: Database, userId: string, expiresAt: Date) {
	const [row] = await db.insert(sessions).values({ userId, expiresAt }).returning({ id: sessions.id });
	return row.id;
}

/** Ends one session (sign-out). */
export async function revokeSession(db: Database, sessionId: string) {
	await db.update(sessions).set({ revokedAt: sql`now()` }).where(and(eq(sessions.id, sessionId), isNull(sessions.revokedAt)));
}

/** Ends every open session of a user (password reset, removal from a team, "sign out everywhere"); returns how many. */
export async function revokeSessionsOfUser(db: Pick<Database, 'update'>, userId: string) {
	const rows = await db
		.update(sessions)
		.set({ revokedAt: sql`now()` })
		.where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)))
		.returning({ id: sessions.id });
	return rows.length;
}

/** The number of open (unrevoked, unexpired) sessions of a user. */
export async function openSessionCount(db: Database, userId: string) {
	const [row] = await db
		.select({ n: sql<number>`count(*)::int` })
		.from(sessions)
		.where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt), sql`${sessions.expiresAt} > now()`));
	return row.n;
}

/** Remembers a browser that signed in to the account (by its device token's hash). */
export async function addKnownDevice(db: Database, userId: string, tokenHash: string) {
	await db
		.insert(knownDevices)
		.values({ userId, tokenHash })
		.onConflictDoUpdate({ target: [knownDevices.tokenHash, knownDevices.userId], set: { lastUsedAt: sql`now()` } });
}

/** True when the device token (by hash) belongs to a browser that signed in to the account of this e-mail before. */
export async function isKnownDevice(db: Database, email: string, tokenHash: string) {
	const rows = await db
		.select({ id: knownDevices.id })
		.from(knownDevices)
		.innerJoin(users, eq(users.id, knownDevices.userId))
		.where(and(eq(knownDevices.tokenHash, tokenHash), eq(users.email, email.toLowerCase())))
		.limit(1);
	return rows.length > 0;
}
