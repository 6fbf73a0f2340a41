// One-time password-reset tokens (stored hashed).
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { revokeSessionsOfUser } from './sessions';
import { passwordResets, users } from '../schema';

/** Stores a reset token hash for a user. */
export async function createPasswordReset(db: Database, userId: string, tokenHash: string, expiresAt: Date) {
	await db.insert(passwordResets).values({ userId, tokenHash, expiresAt });
}

/** The unused, unexpired reset with this token hash (and its account's e-mail), or null. */
export async function openPasswordReset(db: Database, tokenHash: string) {
	const [row] = await db
		.select({ id: passwordResets.id, userId: passwordResets.userId, email: users.email })
		.from(passwordResets)
		.innerJoin(users, eq(users.id, passwordResets.userId))
		.where(and(eq(passwordResets.tokenHash, tokenHash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, sql`now()`)))
		.limit(1);
	return row ?? null;
}

/** Sets the new password and uses up this and every other open reset of the account; false when it was used meanwhile. */
export function completePasswordReset(db: Database, resetId: string, userId: string, passwordHash: string) {
	return db.transaction(async (tx) => {
		const used = await tx
			.update(passwordResets)
			.set({ usedAt: sql`now()` })
			.where(and(eq(passwordResets.id, resetId), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, sql`now()`)))
			.returning({ id: passwordResets.id });
		if (used.length === 0) return false;
		await tx.update(passwordResets).set({ usedAt: sql`now()` }).where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)));
		await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
		// whoever held a session of the account (perhaps the reason for the reset) holds it no longer
		await revokeSessionsOfUser(tx, userId);
		return true;
	});
}
