// Request pipeline: the guard (cookies, cross-site forms, unknown API paths, outage answers, API error shape,
// security headers, the share sheet's cache), then Auth.js, then the account handle (user, teams, current team).
import { sequence } from '@sveltejs/kit/hooks';
import { json, type Handle, type HandleServerError, type RequestEvent } from '@sveltejs/kit';
import { handle as authHandle } from './auth';
import { loadAccount } from '$lib/server/auth/account';
import { authGuard } from '$lib/server/auth/guard';
import { installShutdown } from '$lib/server/lifecycle';
import { serverEnv } from '$lib/server/env';
import { errorResponse } from '$lib/server/api';
import { isCrossSiteForm } from '$lib/server/http/csrf';
import { withSecurityHeaders } from '$lib/server/http/headers';
import { RETRY_AFTER_S, UNAVAILABLE_MESSAGE, isDatabaseUnavailable, logUnavailable } from '$lib/server/http/outage';
import { installShareFastPath, serveShareSheet } from '$lib/server/sharing/sheet-cache';

installShutdown();
// the share sheet's fast path for the server entry (scripts/serve.mjs): cached sheets answered before SvelteKit
installShareFastPath();

const isApi = (event: RequestEvent) => event.url.pathname === '/api' || event.url.pathname.startsWith('/api/');

/** Cookies are Secure exactly when the public origin is https (ORIGIN, else the request's own URL). */
function secureCookies(event: RequestEvent) {
	const origin = serverEnv().ORIGIN;
	const secure = origin ? origin.startsWith('https:') : event.url.protocol === 'https:';
	const set = event.cookies.set.bind(event.cookies);
	const del = event.cookies.delete.bind(event.cookies);
	// SvelteKit defaults `secure` to true off localhost, and Auth.js's renewal passes no `secure` when false.
	event.cookies.set = (name, value, opts) => set(name, value, { ...opts, secure });
	event.cookies.delete = (name, opts) => del(name, { ...opts, secure });
}

/** The outage answer: API JSON or a plain page, 503 with Retry-After. */
function unavailable(event: RequestEvent): Response {
	const headers = { 'retry-after': String(RETRY_AFTER_S), 'cache-control': 'no-store' };
	if (isApi(event)) {
		const res = errorResponse(503, { message: UNAVAILABLE_MESSAGE, code: 'unavailable' });
		for (const [k, v] of Object.entries(headers)) res.headers.set(k, v);
		return res;
	}
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Unavailable · Linkwright</title></head><body><h1>Service unavailable</h1><p>${UNAVAILABLE_MESSAGE}</p></body></html>`;
	return new Response(html, { status: 503, headers: { ...headers, 'content-type': 'text/html; charset=utf-8' } });
}

/** Any API error that is not yet in the API's shape `{ error: { code, message } }`, rewritten into it. */
async function apiErrorShape(response: Response): Promise<Response> {
	if (response.status < 400) return response;
	const type = response.headers.get('content-type') ?? '';
	let message = response.statusText || 'Request failed';
	if (type.includes('application/json')) {
		const body = await response.clone().json().catch(() => null);
		if (body && typeof body === 'object' && 'error' in body) return response;
		if (body && typeof body.message === 'string') message = body.message;
	} else {
		const text = (await response.clone().text().catch(() => '')).trim();
		if (text && !type.includes('html') && text.length < 300) message = text;
	}
	const code = response.status === 404 ? 'not_found' : response.status === 405 ? 'method_not_allowed' : response.status >= 500 ? 'server_error' : 'error';
	const res = errorResponse(response.status, { message, code });
	for (const name of ['allow', 'retry-after']) {
		const v = response.headers.get(name);
		if (v) res.headers.set(name, v);
	}
	return res;
}

const guard: Handle = async ({ event, resolve }) => {
	secureCookies(event);
	const api = isApi(event);
	let response: Response;
	try {
		if (await isCrossSiteForm(event)) {
			const message = `Cross-site ${event.request.method} form submissions are forbidden`;
			response = api
				? errorResponse(403, { message, code: 'cross_site' })
				: event.request.headers.get('accept') === 'application/json'
					? json({ message }, { status: 403 })
					: new Response(message, { status: 403, headers: { 'content-type': 'text/plain; charset=utf-8' } });
		} else if (api && event.route.id === null) {
			// No route, or a parameter matcher refused the segment (a malformed id): the API's JSON 404.
			response = errorResponse(404, { message: `No API endpoint at ${event.url.pathname}`, code: 'not_found' });
		} else {
			response = (await serveShareSheet(event, resolve)) ?? (await resolve(event));
			if (event.locals.unavailable) response = unavailable(event);
			else if (api) response = await apiErrorShape(response);
		}
	} catch (e) {
		if (!isDatabaseUnavailable(e)) throw e;
		logUnavailable(e);
		response = unavailable(event);
	}
	return withSecurityHeaders(event, response);
};

const accountHandle: Handle = async ({ event, resolve }) => {
	await loadAccount(event);
	return resolve(event);
};

// the guard first (headers, outage answers, cross-site forms), then the sign-out guard, Auth.js and the account
export const handle = sequence(guard, authGuard, authHandle, accountHandle);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (isDatabaseUnavailable(error)) {
		event.locals.unavailable = true;
		logUnavailable(error);
		return { message: UNAVAILABLE_MESSAGE, code: 'unavailable' };
	}
	if (status >= 500) console.error(error);
	return { message: status >= 500 ? 'Something went wrong on the server. Try again.' : message, code: 'server_error' };
};
