// Checks e-mail and password with a rate limit per account and per client address.
import { signInInput } from '$lib/schemas/auth';
import { db } from '$lib/server/db';
import { findUserByEmail } from '$lib/server/db/queries/users';
import { recentFailures, recordLoginAttempt } from '$lib/server/db/queries/login-attempts';
import { checkPassword } from './passwords';

export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;
export const MAX_FAILURES_PER_ACCOUNT = 8;
export const MAX_FAILURES_PER_ADDRESS = 30;

/** The user for valid credentials, null for wrong ones, or 'rate_limited' after too many failures. */
export async function verifyCredentials(raw: Partial<Record<string, unknown>>, address: string) {
	const parsed = signInInput.safeParse(raw);
	if (!parsed.success) return null;
	const { email, password } = parsed.data;
	const failures = await recentFailures(db, email, address, new Date(Date.now() - SIGN_IN_WINDOW_MS));
	if (failures.byEmail >= MAX_FAILURES_PER_ACCOUNT || failures.byAddress >= MAX_FAILURES_PER_ADDRESS) {
		return 'rate_limited' as const;
	}
	const user = await findUserByEmail(db, email);
	const ok = await checkPassword(user?.passwordHash ?? null, password);
	await recordLoginAttempt(db, email, address, ok);
	return ok && user ? { id: user.id, email: user.email, name: user.name } : null;
}
