// Checks e-mail and password, throttled so that an attacker slows only themselves: a progressive delay per
// account and address (or known device), and a budget per address that a known device is not counted against.
// No account is ever locked: its owner signs in from another address, or from a device that signed in before.
import { signInInput } from '$lib/schemas/auth';
import { db } from '$lib/server/db';
import { findUserByEmail } from '$lib/server/db/queries/users';
import { recentFailures, recordLoginAttempt, type FailureCount } from '$lib/server/db/queries/login-attempts';
import { addKnownDevice, isKnownDevice } from '$lib/server/db/queries/sessions';
import { checkPassword } from './passwords';
import { hashToken, newToken } from './tokens';

/** Failures older than this are forgotten (common practice, no source). */
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

/**
 * The throttle (common practice, no source; the shape follows OWASP's Authentication Cheat Sheet, "exponential
 * back-off" rather than lock-out): after `free` failures, each further attempt waits `firstMs` doubled per
 * failure since the last failure, up to `maxMs`.
 */
export const THROTTLE = {
	/** one account from one address (or one known device) */
	pair: { free: 3, firstMs: 1000, maxMs: 60_000 },
	/** one address over every account, browsers that are not known devices of the account */
	address: { free: 30, firstMs: 30_000, maxMs: 5 * 60_000 }
} as const;

/** How long to wait after the last of these failures (ms), 0 when free. */
export function waitAfter(failures: FailureCount, rule: { free: number; firstMs: number; maxMs: number }, now = Date.now()) {
	if (failures.count < rule.free || !failures.last) return 0;
	const wait = Math.min(rule.firstMs * 2 ** (failures.count - rule.free), rule.maxMs);
	return Math.max(0, failures.last.getTime() + wait - now);
}

/**
 * The user for valid credentials, null for wrong ones, or 'rate_limited' while this account and address (or device)
 * must wait, or while the address is over its budget and the browser is not a known device of the account.
 * `deviceToken` is the known-device cookie's value, if the browser sent one.
 */
export async function verifyCredentials(raw: Partial<Record<string, unknown>>, address: string, deviceToken?: string) {
	const parsed = signInInput.safeParse(raw);
	if (!parsed.success) return null;
	const { email, password } = parsed.data;
	const device = deviceToken ? hashToken(deviceToken) : null;
	const known = device ? await isKnownDevice(db, email, device) : false;
	const failures = await recentFailures(db, email, address, known ? device : null, new Date(Date.now() - SIGN_IN_WINDOW_MS));
	if (waitAfter(failures.pair, THROTTLE.pair) > 0) return 'rate_limited' as const;
	if (!known && waitAfter(failures.address, THROTTLE.address) > 0) return 'rate_limited' as const;
	const user = await findUserByEmail(db, email);
	const ok = await checkPassword(user?.passwordHash ?? null, password);
	await recordLoginAttempt(db, email, address, ok, known ? device : null);
	return ok && user ? { id: user.id, email: user.email, name: user.name } : null;
}

/** After a successful sign-in: the browser's device token (kept, or a new one) now known for the account. */
export async function rememberDevice(userId: string, deviceToken?: string) {
	const token = deviceToken && /^[A-Za-z0-9_-]{43}$/.test(deviceToken) ? deviceToken : newToken();
	await addKnownDevice(db, userId, hashToken(token));
	return token;
}
