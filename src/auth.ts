// Auth.js for SvelteKit: e-mail and password sign-in, sessions as signed JWT cookies.
import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import type { RequestEvent } from '@sveltejs/kit';
import type { SvelteKitAuthConfig } from '@auth/sveltekit';
import { DEVICE_COOKIE } from '$lib/server/auth/devices';
import { rememberDevice, verifyCredentials } from '$lib/server/auth/sign-in';
import { db } from '$lib/server/db';
import { createSession, revokeSession } from '$lib/server/db/queries/sessions';
import { serverEnv } from '$lib/server/env';

/** How long a session lasts without use (s); each reading renews it, within its row's own expiry. */
export const SESSION_MAX_AGE_S = 30 * 24 * 3600;

class RateLimited extends CredentialsSignin {
	code = 'rate_limited';
}

/** Auth.js settings for one request (the client address feeds the sign-in rate limit). */
function config(event: RequestEvent): SvelteKitAuthConfig {
	const env = serverEnv();
	return {
		secret: env.AUTH_SECRET,
		trustHost: env.AUTH_TRUST_HOST,
		basePath: '/auth',
		session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S },
		pages: { signIn: '/signin', error: '/signin' },
		logger: {
			// A wrong password, or a session cookie that is expired or not ours, is an expected outcome, not a
			// server error worth a stack trace.
			error(err: Error) {
				const type = (err as Error & { type?: string }).type;
				if (type !== 'CredentialsSignin' && type !== 'JWTSessionError') console.error(err);
			}
		},
		providers: [
			Credentials({
				credentials: { email: { label: 'E-mail' }, password: { label: 'Password', type: 'password' } },
				authorize: async (credentials) => {
					const outcome = await verifyCredentials(credentials, event.getClientAddress(), event.cookies.get(DEVICE_COOKIE));
					if (outcome === 'rate_limited') throw new RateLimited();
					if (outcome) event.locals.deviceCookie = await rememberDevice(outcome.id, event.cookies.get(DEVICE_COOKIE));
					return outcome;
				}
			})
		],
		callbacks: {
			async jwt({ token, user }) {
				// at sign-in: a session row, whose id the cookie carries from now on (checked on every request)
				if (user?.id) {
					token.sub = user.id;
					token.sid = await createSession(db, user.id, new Date(Date.now() + SESSION_MAX_AGE_S * 1000));
				}
				return token;
			},
			session({ session, token }) {
				if (session.user && token.sub) session.user.id = token.sub;
				return Object.assign(session, { sid: typeof token.sid === 'string' ? token.sid : null });
			}
		},
		events: {
			// sign-out ends this session on the server too, not only the cookie in this browser
			async signOut(message) {
				const sid = 'token' in message ? message.token?.sid : undefined;
				if (typeof sid === 'string') await revokeSession(db, sid);
			}
		}
	};
}

export const { handle, signIn, signOut } = SvelteKitAuth(async (event) => config(event));
