// Security headers on every answer of the app. The pages' Content-Security-Policy comes from kit.csp in
// svelte.config.js (hashes of the inline scripts); answers without one (API, CSV, redirects) get a deny-all policy.
import type { RequestEvent } from '@sveltejs/kit';
import { withStorageConnect } from '$lib/server/scans/origin';

/** Powerful browser features the app never uses, switched off (W3C Permissions Policy). */
export const PERMISSIONS_POLICY =
	'accelerometer=(), autoplay=(), camera=(), display-capture=(), geolocation=(), gyroscope=(), magnetometer=(), microphone=(), midi=(), payment=(), usb=(), xr-spatial-tracking=()';

/** CSP for answers that are not pages: nothing may load or frame them (OWASP REST Security Cheat Sheet). */
export const NON_PAGE_CSP = "default-src 'none'; frame-ancestors 'none'";

/**
 * The security headers of an answer to pathname, given which headers it already has (a route's own CSP and
 * Referrer-Policy are kept). Share links carry their token in the path: never sent on in a Referer (OWASP,
 * "Referrer-Policy"). One list for both the SvelteKit path and the share sheet's fast path (sharing/sheet-cache.ts).
 */
export function securityHeaders(pathname: string, has: (name: string) => boolean): [string, string][] {
	const out: [string, string][] = [['x-content-type-options', 'nosniff']];
	if (!has('content-security-policy')) out.push(['content-security-policy', NON_PAGE_CSP]);
	out.push(['x-frame-options', 'DENY']);
	if (pathname.startsWith('/s/')) out.push(['referrer-policy', 'no-referrer']);
	else if (!has('referrer-policy')) out.push(['referrer-policy', 'same-origin']);
	out.push(['permissions-policy', PERMISSIONS_POLICY], ['cross-origin-opener-policy', 'same-origin']);
	return out;
}

/** Sets the headers on a response (a copy when its headers are immutable); a route's own choice is kept. */
export function withSecurityHeaders(event: RequestEvent, response: Response): Response {
	const set = securityHeaders(event.url.pathname, (name) => response.headers.has(name));
	const pageCsp = response.headers.has('content-security-policy');
	let res = response;
	try {
		res.headers.set(set[0][0], set[0][1]);
	} catch {
		res = new Response(response.body, response);
	}
	for (const [name, value] of set) res.headers.set(name, value);
	// the corner and car pages upload scans straight to object storage: its origin joins connect-src there only
	if (pageCsp && /^\/(corners|cars)\/[^/]+\/?$/.test(event.url.pathname)) {
		res.headers.set('content-security-policy', withStorageConnect(res.headers.get('content-security-policy')!));
	}
	return res;
}
