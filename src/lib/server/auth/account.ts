// Who is calling: a session cookie (pages) or an API token (Authorization: Bearer), and their teams.
import type { RequestEvent } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { accountWithTeams, userByApiToken } from '$lib/server/db/queries/users';
import { hashToken } from './tokens';

export const TEAM_COOKIE = 'lw_team';

/** Auth.js's session cookie, with the prefix it uses over HTTPS. */
const SESSION_COOKIES = ['__Secure-authjs.session-token', 'authjs.session-token'];

/**
 * Session cookies already read, by their exact value: the account id and until when the answer holds.
 * Reading a session through Auth.js decrypts the cookie and issues a fresh one (several milliseconds a
 * request, most of a live-preview solve); a cookie seen a moment ago names the same account, so it is
 * read again only after REREAD_MS, which also keeps the rolling session renewed while the user works.
 * A cookie never outlives its own expiry here. Sign-out clears the cookie in the browser, as before.
 */
const known = new Map<string, { id: string; until: number }>();
const REREAD_MS = 5 * 60_000;
const KNOWN_MAX = 2000;

/** Fills locals.user, locals.teams and locals.team for this request. */
export async function loadAccount(event: RequestEvent) {
	const id = await callerId(event);
	const { user, teams } = id ? await accountWithTeams(db, id) : { user: null, teams: [] };
	event.locals.user = user;
	event.locals.teams = user ? teams : [];
	const wanted = event.cookies.get(TEAM_COOKIE);
	event.locals.team = event.locals.teams.find((t) => t.id === wanted) ?? event.locals.teams[0] ?? null;
}

/** The id of the account behind the request's API token or session, or null. */
async function callerId(event: RequestEvent): Promise<string | null> {
	const header = event.request.headers.get('authorization');
	if (header?.startsWith('Bearer ')) return (await userByApiToken(db, hashToken(header.slice(7).trim())))?.id ?? null;
	return sessionUserId(event);
}

/** The session cookie's value, if the request (or Auth.js, renewing it during this request) has one. */
function sessionCookie(event: RequestEvent): string | undefined {
	for (const name of SESSION_COOKIES) {
		const value = event.cookies.get(name);
		if (value) return value;
	}
	return undefined;
}

/** The account id of the session cookie: from a recent reading of the same cookie, else through Auth.js. */
async function sessionUserId(event: RequestEvent): Promise<string | null> {
	const sent = sessionCookie(event);
	if (!sent) return null;
	const now = Date.now();
	const hit = known.get(sent);
	if (hit && hit.until > now) return hit.id;
	if (hit) known.delete(sent);
	const session = await event.locals.auth();
	const id = session?.user?.id ?? null;
	if (id) {
		// Auth.js has set a renewed cookie on this response: a browser sends that one next, a script may keep the
		// old one (which, accepted just now, grants nothing the renewed one does not)
		const until = Math.min(now + REREAD_MS, Date.parse(session!.expires) || now);
		remember(sent, id, until);
		const renewed = sessionCookie(event);
		if (renewed && renewed !== sent) remember(renewed, id, until);
	}
	return id;
}

/** Keeps a cookie's reading, dropping the oldest readings past KNOWN_MAX. */
function remember(cookie: string, id: string, until: number) {
	known.set(cookie, { id, until });
	while (known.size > KNOWN_MAX) known.delete(known.keys().next().value!);
}
