// Around Auth.js's own routes: refuse cross-site posts to /auth/* (its CSRF check is off under the SvelteKit
// binding, so a bodiless cross-site POST /auth/signout would end a session), and hand out the known-device cookie
// that a successful sign-in asked for.
import type { Handle } from '@sveltejs/kit';
import { deviceCookieHeader } from './devices';

/** True when a browser says the request comes from another site (Origin, else Sec-Fetch-Site). */
export function isCrossSite(request: Request, url: URL) {
	const origin = request.headers.get('origin');
	if (origin) return origin !== url.origin;
	const site = request.headers.get('sec-fetch-site');
	return site === 'cross-site' || site === 'same-site';
}

export const authGuard: Handle = async ({ event, resolve }) => {
	if (event.request.method === 'POST' && event.url.pathname.startsWith('/auth/') && isCrossSite(event.request, event.url)) {
		return new Response('Cross-site sign-in and sign-out requests are refused.', { status: 403, headers: { 'content-type': 'text/plain; charset=utf-8' } });
	}
	const response = await resolve(event);
	const token = event.locals.deviceCookie;
	if (!token) return response;
	try {
		response.headers.append('set-cookie', deviceCookieHeader(token));
		return response;
	} catch {
		// a response with immutable headers (Response.redirect): copy it
		const copy = new Response(response.body, response);
		copy.headers.append('set-cookie', deviceCookieHeader(token));
		return copy;
	}
};
