// The share sheet for many readers: each opening still checks the link (revoked, expired), its rate limit and
// counts, but the page is rendered once per version of what it shows (sheet.ts, `sheetVersion`) and served from
// memory with an ETag; a browser revalidating with If-None-Match gets 304 without a body (RFC 9110 §13.1.2, §15.4.5).
// Only anonymous readers are served from the cache (a signed-in engineer's page carries their own layout data).
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { version } from '$app/environment';
import { openShare, cachedSheet, type Opened } from './sheet';

const ROUTE = '/s/[token=token]';
/** The sheet's caching: the reader's browser may keep it but must revalidate; shared caches must not keep it. */
export const SHEET_CACHE_CONTROL = 'private, no-cache';

interface Rendered {
	body: Uint8Array<ArrayBuffer>;
	headers: [string, string][];
}
/** Rendered pages by ETag (per link and version; the oldest go first). */
const pages = new Map<string, Rendered>();
const PAGES_MAX = 300;

/** What the page load reuses from the hook for this request: the opened link (counted once). */
const opens = new WeakMap<Request, Opened>();

/** The link opened for this request by the hook, if any (so the page load neither re-opens nor re-counts it). */
export function openedFor(event: RequestEvent): Opened | undefined {
	return opens.get(event.request);
}

/** True when the request carries a session or token (its page then has the user's own layout data). */
function hasCredentials(request: Request) {
	return request.headers.has('authorization') || /(^|;\s*)(__Secure-)?authjs\.session-token(\.\d+)?=/.test(request.headers.get('cookie') ?? '');
}

/** True when If-None-Match names this ETag (or is *). */
function matches(request: Request, etag: string) {
	const header = request.headers.get('if-none-match');
	return !!header && header.split(',').some((t) => t.trim() === etag || t.trim() === '*');
}

/**
 * Serves GET /s/{token}: 304 on a matching If-None-Match, else the cached page, else renders it (through resolve)
 * and keeps it. Returns null when the request is not for the sheet or the link does not open (the page then
 * answers 404, 410 or 429 itself).
 */
export async function serveShareSheet(event: RequestEvent, resolve: (e: RequestEvent) => Response | Promise<Response>): Promise<Response | null> {
	if (event.route.id !== ROUTE || event.request.method !== 'GET' || event.isDataRequest) return null;
	let opened: Opened;
	try {
		opened = await openShare(event.params.token!, event.getClientAddress());
	} catch (e) {
		if (isHttpError(e)) return null;
		throw e;
	}
	opens.set(event.request, opened);
	const sheet = await cachedSheet(opened);
	const etag = `"${version}-${opened.share.id.slice(0, 8)}-${sheet.version}"`;
	const headers = { etag, 'cache-control': SHEET_CACHE_CONTROL, 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' };
	if (matches(event.request, etag)) return new Response(null, { status: 304, headers });
	const anonymous = !hasCredentials(event.request);
	const kept = anonymous ? pages.get(etag) : undefined;
	if (kept) return new Response(kept.body, { status: 200, headers: kept.headers }); // the Response copies it
	const response = await resolve(event);
	if (response.status !== 200) return response;
	response.headers.set('etag', etag);
	if (!anonymous || event.locals.user || response.headers.has('set-cookie')) return response;
	const body = new Uint8Array(await response.arrayBuffer());
	const rendered: Rendered = { body, headers: [...response.headers] };
	pages.set(etag, rendered);
	while (pages.size > PAGES_MAX) pages.delete(pages.keys().next().value!);
	return new Response(body, { status: 200, headers: rendered.headers });
}
