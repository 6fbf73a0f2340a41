// The share sheet for many readers: each opening still checks the link (revoked, expired), its rate limit and
// counts, but the page is rendered once per version of what it shows (sheet.ts, `sheetVersion`) and served from
// memory with an ETag; a browser revalidating with If-None-Match gets 304 without a body (RFC 9110 §13.1.2, §15.4.5).
// Only anonymous readers are served from the cache (a signed-in engineer's page carries their own layout data).
//
// Two doors lead to the same `openSheet`: the guard in hooks.server.ts (`serveShareSheet`, inside SvelteKit), and
// the fast path the server entry (scripts/serve.mjs) calls before SvelteKit for GET /s/{token}, which answers a
// 304 or a kept page without building a Web Request (`installShareFastPath`). Whatever the fast path cannot answer
// from memory (a page not rendered yet, a refused link, a signed-in reader) it leaves, uncounted, to SvelteKit.
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { building, dev, version } from '$app/environment';
import { SHARE_TOKEN_PATTERN } from '$lib/schemas/share';
import { securityHeaders } from '$lib/server/http/headers';
import { admitOpening, findShare, sheetVersion, type Opened } from './sheet';

const ROUTE = '/s/[token=token]';
/** The sheet's caching: the reader's browser may keep it but must revalidate; shared caches must not keep it. */
export const SHEET_CACHE_CONTROL = 'private, no-cache';

/** An answer served from memory: the same status, headers (security headers included) and bytes on both doors. */
export interface SheetAnswer {
	status: 200 | 304;
	headers: Record<string, string>;
	body: Uint8Array<ArrayBuffer> | null;
}

interface Rendered {
	body: Uint8Array<ArrayBuffer>;
	headers: Record<string, string>;
}
/** Rendered pages by ETag (per link and version; the oldest go first). */
const pages = new Map<string, Rendered>();
const PAGES_MAX = 300;
/** The 304 answers by ETag, built once (the same few hundred at most). */
const notModified = new Map<string, SheetAnswer>();

/** Keeps value under key in a map of at most PAGES_MAX entries (the oldest go first). */
function keep<V>(map: Map<string, V>, key: string, value: V) {
	map.set(key, value);
	while (map.size > PAGES_MAX) map.delete(map.keys().next().value!);
	return value;
}

/** ETags by looked-up link (a lookup is shared by a burst of readers, then dropped). */
const etags = new WeakMap<Opened, string>();
function etagOf(found: Opened) {
	let etag = etags.get(found);
	if (etag === undefined) {
		etag = `"${version}-${found.share.id.slice(0, 8)}-${sheetVersion(found).key}"`;
		etags.set(found, etag);
	}
	return etag;
}

/** What the page load reuses from the hook for this request: the opened link (counted once). */
const opens = new WeakMap<Request, Opened>();

/** The link opened for this request by the hook, if any (so the page load neither re-opens nor re-counts it). */
export function openedFor(event: RequestEvent): Opened | undefined {
	return opens.get(event.request);
}

/** True when the request carries a session or token (its page then has the user's own layout data). */
function hasCredentials(authorization: string | null | undefined, cookie: string | null | undefined) {
	return !!authorization || /(^|;\s*)(__Secure-)?authjs\.session-token(\.\d+)?=/.test(cookie ?? '');
}

/** True when If-None-Match names this ETag (weak comparison, RFC 9110 §13.1.2: W/ is ignored) or is *. */
function matches(header: string | null | undefined, etag: string) {
	if (!header) return false;
	for (const part of header.split(',')) {
		const t = part.trim();
		if (t === etag || t === '*' || (t.startsWith('W/') && t.slice(2) === etag)) return true;
	}
	return false;
}

/** Headers as set on the answer: the route's own, then the guard's security headers (withSecurityHeaders's list). */
function secured(pathname: string, own: Iterable<[string, string]>): Record<string, string> {
	const headers: Record<string, string> = {};
	for (const [name, value] of own) headers[name.toLowerCase()] = value;
	for (const [name, value] of securityHeaders(pathname, (n) => n in headers)) headers[name] = value;
	return headers;
}

/** The sheet's own headers beside the page (the page load sets the same through setHeaders). */
function sheetHeaders(etag: string): [string, string][] {
	return [['etag', etag], ['cache-control', SHEET_CACHE_CONTROL], ['referrer-policy', 'no-referrer'], ['x-robots-tag', 'noindex']];
}

interface Ask {
	token: string;
	pathname: string;
	/** The client's address (as SvelteKit's getClientAddress), asked only when the link opens. */
	address: () => string;
	header: (name: string) => string | null | undefined;
	/** False on the fast path: nothing is counted unless the answer comes from memory. */
	mayRender: boolean;
}

type Opening =
	/** answered from memory; the opening is counted */
	| { answer: SheetAnswer }
	/** counted; the page must be rendered (and is kept when the reader is anonymous) */
	| { render: Opened; etag: string; anonymous: boolean }
	/** not answered and not counted: the link does not open (the page answers 404, 410 or 429), or nothing kept */
	| null;

/**
 * One opening of a share link: finds the link (404/410 leave it to the page), then either a 304 on a matching
 * If-None-Match, the kept page, or (mayRender) the link to render; the rate limit and the open count are taken only
 * once it is known the opening is answered here.
 */
async function openSheet({ token, pathname, address, header, mayRender }: Ask): Promise<Opening> {
	let found: Opened;
	try {
		found = await findShare(token);
	} catch (e) {
		if (isHttpError(e)) return null;
		throw e;
	}
	const etag = etagOf(found);
	const fresh = matches(header('if-none-match'), etag);
	const anonymous = !hasCredentials(header('authorization'), header('cookie'));
	const kept = !fresh && anonymous ? pages.get(etag) : undefined;
	if (!fresh && !kept && !mayRender) return null;
	try {
		admitOpening(found, address());
	} catch (e) {
		if (isHttpError(e)) return null;
		throw e;
	}
	if (fresh) return { answer: notModified.get(etag) ?? keep(notModified, etag, { status: 304, headers: secured(pathname, sheetHeaders(etag)), body: null }) };
	if (kept) return { answer: { status: 200, headers: kept.headers, body: kept.body } };
	return { render: found, etag, anonymous };
}

/**
 * Serves GET /s/{token} inside SvelteKit: 304 on a matching If-None-Match, else the kept page, else renders it
 * (through resolve) and keeps it. Returns null when the request is not for the sheet or the link does not open (the
 * page then answers 404, 410 or 429 itself).
 */
export async function serveShareSheet(event: RequestEvent, resolve: (e: RequestEvent) => Response | Promise<Response>): Promise<Response | null> {
	if (event.route.id !== ROUTE || event.request.method !== 'GET' || event.isDataRequest) return null;
	const { pathname } = event.url;
	const opening = await openSheet({
		token: event.params.token!,
		pathname,
		address: () => event.getClientAddress(),
		header: (name) => event.request.headers.get(name),
		mayRender: true
	});
	if (!opening) return null;
	if ('answer' in opening) return new Response(opening.answer.body, { status: opening.answer.status, headers: opening.answer.headers });
	opens.set(event.request, opening.render);
	const response = await resolve(event);
	if (response.status !== 200) return response;
	response.headers.set('etag', opening.etag);
	if (!opening.anonymous || event.locals.user || response.headers.has('set-cookie')) return response;
	const body = new Uint8Array(await response.arrayBuffer());
	const rendered = keep(pages, opening.etag, { body, headers: secured(pathname, response.headers) });
	return new Response(body, { status: 200, headers: rendered.headers });
}

/** The key of the fast path on globalThis (read by scripts/serve.mjs). */
export const SHARE_FAST_PATH = Symbol.for('linkwright.share-fast-path');

/** Headers as Node's IncomingMessage has them. */
type NodeHeaders = Record<string, string | string[] | undefined>;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v.join(', ') : v);
const SHEET_PATH = /^\/s\/([^/]+)$/;

/**
 * The fast path: GET /s/{token} answered from memory, or null for SvelteKit to answer (nothing counted then).
 * pathname is the request target's path (no query), address the client's as SvelteKit's getClientAddress gives it.
 */
export async function shareFastPath(method: string, pathname: string, headers: NodeHeaders, address: string): Promise<SheetAnswer | null> {
	if (method !== 'GET') return null;
	const token = SHEET_PATH.exec(pathname)?.[1];
	if (!token || !SHARE_TOKEN_PATTERN.test(token)) return null;
	try {
		const opening = await openSheet({ token, pathname, address: () => address, header: (name) => one(headers[name]), mayRender: false });
		return opening && 'answer' in opening ? opening.answer : null;
	} catch {
		return null; // e.g. the database is unreachable: SvelteKit's path answers it (503)
	}
}

/** Registers the fast path for the server entry, in the built server only. */
export function installShareFastPath() {
	if (dev || building) return;
	(globalThis as Record<symbol, unknown>)[SHARE_FAST_PATH] = shareFastPath;
}
