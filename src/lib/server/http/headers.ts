// Security headers on every answer of the app. The pages' Content-Security-Policy comes from kit.csp in
// svelte.config.js (hashes of the inline scripts); answers without one (API, CSV, redirects) get a deny-all policy.
import type { RequestEvent } from '@sveltejs/kit';
import { withStorageConnect } from '$lib/server/scans/origin';

/** Powerful browser features the app never uses, switched off (W3C Permissions Policy). */
export const PERMISSIONS_POLICY =
	'accelerometer=(), autoplay=(), camera=(), display-capture=(), geolocation=(), gyroscope=(), magnetometer=(), microphone=(), midi=(), payment=(), usb=(), xr-spatial-tracking=()';

/** CSP for answers that are not pages: nothing may load or frame them (OWASP REST Security Cheat Sheet). */
export const NON_PAGE_CSP = "default-src 'none'; frame-ancestors 'none'";

/** Share links carry their token in the path: never send it on in a Referer (OWASP, "Referrer-Policy"). */
function referrerPolicy(event: RequestEvent) {
	return event.url.pathname.startsWith('/s/') ? 'no-referrer' : 'same-origin';
}

/** Sets the headers on a response (a copy when its headers are immutable); a route's own choice is kept. */
export function withSecurityHeaders(event: RequestEvent, response: Response): Response {
	let res = response;
	try {
		res.headers.set('x-content-type-options', 'nosniff');
	} catch {
		res = new Response(response.body, response);
		res.headers.set('x-content-type-options', 'nosniff');
	}
	const h = res.headers;
	if (!h.has('content-security-policy')) h.set('content-security-policy', NON_PAGE_CSP);
	// the corner and car pages upload scans straight to object storage: its origin joins connect-src there only
	else if (/^\/(corners|cars)\/[^/]+\/?$/.test(event.url.pathname)) h.set('content-security-policy', withStorageConnect(h.get('content-security-policy')!));
	h.set('x-frame-options', 'DENY');
	if (event.url.pathname.startsWith('/s/')) h.set('referrer-policy', 'no-referrer');
	else if (!h.has('referrer-policy')) h.set('referrer-policy', referrerPolicy(event));
	h.set('permissions-policy', PERMISSIONS_POLICY);
	h.set('cross-origin-opener-policy', 'same-origin');
	return res;
}
