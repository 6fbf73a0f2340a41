// Who is calling: a session cookie (pages) or an API token (Authorization: Bearer), and their teams.
import type { RequestEvent } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { findUserById, teamsOfUser, userByApiToken } from '$lib/server/db/queries/users';
import { hashToken } from './tokens';

export const TEAM_COOKIE = 'lw_team';

/** Fills locals.user, locals.teams and locals.team for this request. */
export async function loadAccount(event: RequestEvent) {
	event.locals.user = await callerOf(event);
	event.locals.teams = event.locals.user ? await teamsOfUser(db, event.locals.user.id) : [];
	const wanted = event.cookies.get(TEAM_COOKIE);
	event.locals.team = event.locals.teams.find((t) => t.id === wanted) ?? event.locals.teams[0] ?? null;
}

/** The account behind the request's API token or session, or null. */
async function callerOf(event: RequestEvent) {
	const header = event.request.headers.get('authorization');
	if (header?.startsWith('Bearer ')) return userByApiToken(db, hashToken(header.slice(7).trim()));
	const session = await event.locals.auth();
	const id = session?.user?.id;
	return id ? findUserById(db, id) : null;
}
