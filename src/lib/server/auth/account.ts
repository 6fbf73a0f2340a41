// Who is calling: a session cookie (pages) or an API token (Authorization: Bearer), and their teams.
import type { RequestEvent } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { findUserById, teamsOfUser, userByApiToken } from '$lib/server/db/queries/users';
import { hashToken } from './tokens';

export const TEAM_COOKIE = 'lw_team';

/** Fills locals.user, locals.teams and locals.team for this request. */
export async function loadAccount(event: RequestEvent) {
	const id = await callerId(event);
	// the account and its teams in parallel: one round trip to the database, not two
	const [user, teams] = id ? await Promise.all([findUserById(db, id), teamsOfUser(db, id)]) : [null, []];
	event.locals.user = user;
	event.locals.teams = user ? teams : [];
	const wanted = event.cookies.get(TEAM_COOKIE);
	event.locals.team = event.locals.teams.find((t) => t.id === wanted) ?? event.locals.teams[0] ?? null;
}

/** The id of the account behind the request's API token or session, or null. */
async function callerId(event: RequestEvent): Promise<string | null> {
	const header = event.request.headers.get('authorization');
	if (header?.startsWith('Bearer ')) return (await userByApiToken(db, hashToken(header.slice(7).trim())))?.id ?? null;
	const session = await event.locals.auth();
	return session?.user?.id ?? null;
}
