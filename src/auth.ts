// Auth.js for SvelteKit: e-mail and password sign-in, sessions as signed JWT cookies.
import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import type { RequestEvent } from '@sveltejs/kit';
import type { SvelteKitAuthConfig } from '@auth/sveltekit';
import { verifyCredentials } from '$lib/server/auth/sign-in';
import { serverEnv } from '$lib/server/env';

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
		session: { strategy: 'jwt', maxAge: 30 * 24 * 3600 },
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
					const outcome = await verifyCredentials(credentials, event.getClientAddress());
					if (outcome === 'rate_limited') throw new RateLimited();
					return outcome;
				}
			})
		],
		callbacks: {
			jwt({ token, user }) {
				if (user?.id) token.sub = user.id;
				return token;
			},
			session({ session, token }) {
				if (session.user && token.sub) session.user.id = token.sub;
				return session;
			}
		}
	};
}

export const { handle, signIn, signOut } = SvelteKitAuth(async (event) => config(event));
