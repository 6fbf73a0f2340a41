// The known-device cookie of sign-in throttling (OWASP, "Slow Down Online Guessing Attacks with Device Cookies",
// https://owasp.org/www-community/Slow_Down_Online_Guessing_Attacks_with_Device_Cookies): a browser that signed in
// to an account before carries a random token (stored hashed, per account), and is not held back by failures of
// others at its address.
import { serverEnv } from '$lib/server/env';

export const DEVICE_COOKIE = 'lw_device';
/** A year (common practice, no source). */
const DEVICE_MAX_AGE_S = 365 * 24 * 3600;

/** The Set-Cookie value for a device token: HttpOnly, SameSite=Lax, Secure when the app is served over https. */
export function deviceCookieHeader(token: string) {
	const secure = serverEnv().ORIGIN?.startsWith('https:') ? '; Secure' : '';
	return `${DEVICE_COOKIE}=${token}; Path=/; Max-Age=${DEVICE_MAX_AGE_S}; HttpOnly; SameSite=Lax${secure}`;
}
