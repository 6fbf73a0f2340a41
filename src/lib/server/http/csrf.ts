// Cross-site form posts refused (OWASP CSRF Prevention Cheat Sheet: verify the Origin header), in place of
// SvelteKit's own check (csrf.checkOrigin is off in svelte.config.js) so that an API client that sends a valid
// bearer token and no cookie (curl -F) is not taken for a browser form: a browser cannot add that header to a
// cross-site form, and without a cookie the request carries no ambient authority to abuse.
import type { RequestEvent } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { userByApiToken } from '$lib/server/db/queries/users';
import { hashToken } from '$lib/server/auth/tokens';

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
/** The content types an HTML form can send (WHATWG HTML, form submission), as SvelteKit checks them. */
const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];

function isFormContentType(request: Request) {
	const type = request.headers.get('content-type')?.split(';', 1)[0].trim().toLowerCase() ?? '';
	return FORM_TYPES.includes(type);
}

/** A bearer token of an existing account, on a request that sends no cookie. */
async function isTokenClient(request: Request) {
	const header = request.headers.get('authorization');
	if (!header?.startsWith('Bearer ') || request.headers.has('cookie')) return false;
	return (await userByApiToken(db, hashToken(header.slice(7).trim()))) !== null;
}

/** True when the request is a form post from another origin (or without an Origin) that must be refused. */
export async function isCrossSiteForm(event: RequestEvent): Promise<boolean> {
	const { request, url } = event;
	if (!UNSAFE.has(request.method) || !isFormContentType(request)) return false;
	if (request.headers.get('origin') === url.origin) return false;
	return !(await isTokenClient(request));
}
