// The one place that decides who may do what. Every protected load, action and API handler calls it.
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { dev } from '$app/environment';
import { serverEnv } from '$lib/server/env';
import { db } from '$lib/server/db';
import { carForUser } from '$lib/server/db/queries/cars';
import { carRevisionForUser } from '$lib/server/db/queries/car-revisions';
import { cornerForUser, revisionForUser } from '$lib/server/db/queries/corners';
import { explorationForUser } from '$lib/server/db/queries/explorations';
import { shareForUser } from '$lib/server/db/queries/shares';
import { scanForUser } from '$lib/server/db/queries/scans';
import type { Role } from '$lib/server/db/schema';
import type { TeamRole } from '$lib/server/db/queries/users';

export type Action = 'view' | 'edit' | 'share' | 'manage_members';

const ALLOWED: Record<Role, readonly Action[]> = {
	owner: ['view', 'edit', 'share', 'manage_members'],
	engineer: ['view', 'edit', 'share'],
	viewer: ['view']
};

/** True when a role may perform an action. */
export function can(role: Role | null | undefined, action: Action): boolean {
	return role ? ALLOWED[role].includes(action) : false;
}

/** True for API routes, which answer JSON errors instead of redirecting to sign-in. */
function isApi(event: RequestEvent) {
	return event.route.id?.startsWith('/api/') ?? false;
}

/** The signed-in user; API calls without one get 401, pages redirect to sign-in. */
export function requireUser(event: RequestEvent) {
	const user = event.locals.user;
	if (user) return user;
	if (isApi(event)) error(401, { message: 'Sign in or send an API token', code: 'unauthenticated' });
	const back = event.url.pathname + event.url.search;
	redirect(303, `/signin?redirectTo=${encodeURIComponent(back)}`);
}

/** Stops with 403 naming the action the role lacks. */
function forbid(action: Action): never {
	error(403, { message: `Your role does not allow this (${action.replace('_', ' ')})`, code: 'forbidden' });
}

/** Stops with 404, the same answer whether the object is another team's or does not exist. */
export function notFound(what = 'Not found'): never {
	error(404, { message: what, code: 'not_found' });
}

/** The caller's membership of a team (the current team when teamId is omitted), checked for an action. */
export function requireTeam(event: RequestEvent, action: Action, teamId?: string): TeamRole {
	requireUser(event);
	const team = teamId ? event.locals.teams.find((t) => t.id === teamId) : event.locals.team;
	if (!team) notFound('Team not found');
	if (!can(team.role, action)) forbid(action);
	return team;
}

/** An object found through the caller's memberships: 404 when it was not found, 403 when the role lacks the action. */
function allowed<T extends { role: Role }>(found: T | null, what: string, action: Action): T {
	if (!found) notFound(`${what} not found`);
	if (!can(found.role, action)) forbid(action);
	return found;
}

/** A car the caller may act on: 404 when it is not in one of their teams, 403 when their role lacks the action. */
export async function requireCar(event: RequestEvent, carId: string, action: Action) {
	return allowed(await carForUser(db, requireUser(event).id, carId), 'Car', action);
}

/** A corner (with its car) the caller may act on; 404 / 403 as for cars. */
export async function requireCorner(event: RequestEvent, cornerId: string, action: Action) {
	return allowed(await cornerForUser(db, requireUser(event).id, cornerId), 'Corner', action);
}

/** A revision (with its corner and car) the caller may act on; 404 / 403 as for cars. */
export async function requireRevision(event: RequestEvent, revisionId: string, action: Action) {
	return allowed(await revisionForUser(db, requireUser(event).id, revisionId), 'Revision', action);
}

/** A design-space exploration (with its corner and car) the caller may act on; 404 / 403 as for cars. */
export async function requireExploration(event: RequestEvent, explorationId: string, action: Action) {
	return allowed(await explorationForUser(db, requireUser(event).id, explorationId), 'Exploration', action);
}

/** A car revision (with its car) the caller may act on; 404 / 403 as for cars. */
export async function requireCarRevision(event: RequestEvent, carRevisionId: string, action: Action) {
	return allowed(await carRevisionForUser(db, requireUser(event).id, carRevisionId), 'Car revision', action);
}

/** A share link of one of the caller's teams they may act on; 404 / 403 as for cars. */
export async function requireShare(event: RequestEvent, shareId: string, action: Action) {
	return allowed(await shareForUser(db, requireUser(event).id, shareId), 'Share link', action);
}

/** Development and demo pages (/dev/*): 404 unless this is development or demo mode (LW_DEMO). */
export function requireDemoMode() {
	if (!(dev || serverEnv().LW_DEMO)) notFound();
}

/** A scan (with its car) the caller may act on; 404 / 403 as for cars. Scans are team data like revisions. */
export async function requireScan(event: RequestEvent, scanId: string, action: Action) {
	return allowed(await scanForUser(db, requireUser(event).id, scanId), 'Scan', action);
}
