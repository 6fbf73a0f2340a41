// Forgotten passwords: a one-time link by mail (token stored hashed, valid RESET_MINUTES), rate limited.
import type { RequestEvent } from '@sveltejs/kit';
import { RESET_MINUTES } from '$lib/schemas/password';
import { db } from '$lib/server/db';
import { completePasswordReset, createPasswordReset, openPasswordReset } from '$lib/server/db/queries/password-resets';
import { findUserByEmail } from '$lib/server/db/queries/users';
import { passwordResetMail } from '$lib/server/mail/messages';
import { sendMail } from '$lib/server/mail/transport';
import { allow } from '$lib/server/rate-limit';
import { absoluteUrl } from '$lib/server/urls';
import { hashPassword } from './passwords';
import { hashToken, newToken } from './tokens';

export type ResetRequest = { ok: true } | { ok: false; message: string };

/**
 * Mails a reset link when the address has an account. The answer is the same whether it has one or not, so the
 * form does not reveal which addresses are registered; only the rate limit and a mail failure are reported.
 */
export async function requestPasswordReset(event: Pick<RequestEvent, 'url' | 'getClientAddress'>, email: string): Promise<ResetRequest> {
	const tooMany = 'Too many reset requests. Wait an hour and try again.';
	if (!(await allow('resetByAddress', event.getClientAddress()))) return { ok: false, message: tooMany };
	if (!(await allow('resetByEmail', email))) return { ok: false, message: tooMany };
	const user = await findUserByEmail(db, email);
	if (!user) return { ok: true };
	const token = newToken();
	await createPasswordReset(db, user.id, hashToken(token), new Date(Date.now() + RESET_MINUTES * 60 * 1000));
	const sent = await sendMail(user.email, passwordResetMail({ url: absoluteUrl(event, `/password/reset/${token}`), validMinutes: RESET_MINUTES }));
	return sent.ok ? { ok: true } : { ok: false, message: sent.message };
}

/** The open reset behind a token, or null when unknown, used or expired. */
export function findReset(token: string) {
	return openPasswordReset(db, hashToken(token));
}

/** Sets the new password through an open reset; false when it was used or expired meanwhile. */
export async function resetPassword(token: string, password: string) {
	const reset = await findReset(token);
	if (!reset) return false;
	return completePasswordReset(db, reset.id, reset.userId, await hashPassword(password));
}
