// Who is calling: a session cookie (pages) or an API token (Authorization: Bearer), and their teams.
import type { RequestEvent } from '@sveltejs/kit';
import type { Session } from '@auth/sveltekit';
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
 * A cookie never outlives its own expiry here. The cache holds only who the cookie names: whether its session is
 * still open is asked of the database on every request (loadAccount).
 */
const known = new Map<string, Caller>();
const REREAD_MS = 5 * 60_000;
const KNOWN_MAX = 2000;

/** Whose request: the account id, and the session id when it came with a session cookie; until when a reading holds. */
interface Caller {
	id: string;
	sid?: string;
	until: number;
}

/**
 * Fills locals.user, locals.teams and locals.team for this request. A session's row is checked in the same query
 * that loads the account, on every request, so a revoked session is refused at once whatever the cookie cache says.
 */
export async function loadAccount(event: RequestEvent) {
	const caller = await whoCalls(event);
	const { user, teams } = caller ? await accountWithTeams(db, caller.id, caller.sid) : { user: null, teams: [] };
	event.locals.user = user;
	event.locals.teams = user ? teams : [];
	const wanted = event.cookies.get(TEAM_COOKIE);
	event.locals.team = event.locals.teams.find((t) => t.id === wanted) ?? event.locals.teams[0] ?? null;
}

/** The account behind the request's API token or session (with the session's id), or null. */
async function whoCalls(event: RequestEvent): Promise<Pick<Caller, 'id' | 'sid'> | null> {
	const header = event.request.headers.get('authorization');
	if (header?.startsWith('Bearer ')) {
		const id = (await userByApiToken(db, hashToken(header.slice(7).trim())))?.id;
		return id ? { id } : null;
	}
	return sessionCaller(event);
}

/** The session cookie's value, if the request (or Auth.js, renewing it during this request) has one. */
function sessionCookie(event: RequestEvent): string | undefined {
	for (const name of SESSION_COOKIES) {
		const value = event.cookies.get(name);
		if (value) return value;
	}
	return undefined;
}

/**
 * The account and session id of the session cookie: from a recent reading of the same cookie, else through
 * Auth.js. A cookie without a session id (issued before sessions were recorded) names no one.
 */
async function sessionCaller(event: RequestEvent): Promise<Pick<Caller, 'id' | 'sid'> | null> {
	const sent = sessionCookie(event);
	if (!sent) return null;
	const now = Date.now();
	const hit = known.get(sent);
	if (hit && hit.until > now) return hit;
	if (hit) known.delete(sent);
	const session = (await event.locals.auth()) as (Session & { sid?: string | null }) | null;
	const id = session?.user?.id ?? null;
	const sid = session?.sid ?? null;
	if (!id || !sid) return null;
	// Auth.js has set a renewed cookie on this response: a browser sends that one next, a script may keep the
	// old one (which, accepted just now, grants nothing the renewed one does not)
	const until = Math.min(now + REREAD_MS, Date.parse(session!.expires) || now);
	remember(sent, { id, sid, until });
	const renewed = sessionCookie(event);
	if (renewed && renewed !== sent) remember(renewed, { id, sid, until });
	return { id, sid };
}

/** Keeps a cookie's reading, dropping the oldest readings past KNOWN_MAX. */
function remember(cookie: string, caller: Caller) {
	known.set(cookie, caller);
	while (known.size > KNOWN_MAX) known.delete(known.keys().next().value!);
}
