// Users, teams and memberships.
import { and, asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { apiTokens, memberships, sessions, teams, users, type Role } from '../schema';

export interface TeamRole {
	id: string;
	name: string;
	role: Role;
}

/** The account with this (lower-case) e-mail, or null. */
export async function findUserByEmail(db: Database, email: string) {
	const [row] = await db.select().from(users).where(eq(users.email, email.toLowerCase())).limit(1);
	return row ?? null;
}

/** The account with this id, without its password hash, or null. */
export async function findUserById(db: Database, id: string) {
	const [row] = await db
		.select({ id: users.id, email: users.email, name: users.name })
		.from(users)
		.where(eq(users.id, id))
		.limit(1);
	return row ?? null;
}

/**
 * The account with this id (without its password hash) and its teams by name, in one statement: every
 * request reads both, and one round trip to the database is a millisecond or two less than two. With a
 * session id, the same statement also requires that session of this account to be open (not revoked, not
 * expired), so a revoked session is refused on its next request.
 */
export async function accountWithTeams(
	db: Database,
	id: string,
	sessionId?: string
): Promise<{ user: { id: string; email: string; name: string; lengthUnit: 'mm' | 'in' } | null; teams: TeamRole[] }> {
	const open = sessionId
		? sql`exists (select 1 from ${sessions} where ${sessions.id} = ${sessionId} and ${sessions.userId} = ${users.id} and ${sessions.revokedAt} is null and ${sessions.expiresAt} > now())`
		: sql`true`;
	const rows = await db
		.select({ id: users.id, email: users.email, name: users.name, lengthUnit: users.lengthUnit, teamId: teams.id, teamName: teams.name, role: memberships.role })
		.from(users)
		.leftJoin(memberships, eq(memberships.userId, users.id))
		.leftJoin(teams, eq(teams.id, memberships.teamId))
		.where(and(eq(users.id, id), open))
		.orderBy(asc(teams.name));
	if (rows.length === 0) return { user: null, teams: [] };
	const { email, name, lengthUnit } = rows[0];
	const list = rows.flatMap((r) => (r.teamId && r.teamName && r.role ? [{ id: r.teamId, name: r.teamName, role: r.role }] : []));
	return { user: { id, email, name, lengthUnit }, teams: list };
}

/** Creates an account and its own team with the account as owner, in one transaction. */
export async function createUserWithTeam(
	db: Database,
	input: { email: string; name: string; passwordHash: string; teamName: string }
) {
	return db.transaction(async (tx) => {
		const [user] = await tx
			.insert(users)
			.values({ email: input.email.toLowerCase(), name: input.name, passwordHash: input.passwordHash })
			.onConflictDoNothing()
			.returning({ id: users.id, email: users.email, name: users.name });
		if (!user) return null;
		const [team] = await tx.insert(teams).values({ name: input.teamName }).returning({ id: teams.id });
		await tx.insert(memberships).values({ teamId: team.id, userId: user.id, role: 'owner' });
		return { user, teamId: team.id };
	});
}

/** The account an unrevoked API token (by hash) belongs to, marking the token used; or null. */
export async function userByApiToken(db: Database, tokenHash: string) {
	const [row] = await db
		.update(apiTokens)
		.set({ lastUsedAt: sql`now()` })
		.where(and(eq(apiTokens.tokenHash, tokenHash), sql`${apiTokens.revokedAt} is null`))
		.returning({ userId: apiTokens.userId });
	return row ? findUserById(db, row.userId) : null;
}

/** Stores a new API token hash for a user. */
export async function createApiToken(db: Database, userId: string, name: string, tokenHash: string) {
	const [row] = await db.insert(apiTokens).values({ userId, name, tokenHash }).returning({ id: apiTokens.id });
	return row;
}

/** A user's API tokens (never the token itself), newest first. */
export function apiTokensOfUser(db: Database, userId: string) {
	return db
		.select({ id: apiTokens.id, name: apiTokens.name, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt, revokedAt: apiTokens.revokedAt })
		.from(apiTokens)
		.where(eq(apiTokens.userId, userId))
		.orderBy(sql`${apiTokens.createdAt} desc`);
}

/** Revokes one of the user's tokens; false when it is not theirs or already revoked. */
export async function revokeApiToken(db: Database, userId: string, tokenId: string) {
	const rows = await db
		.update(apiTokens)
		.set({ revokedAt: sql`now()` })
		.where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), sql`${apiTokens.revokedAt} is null`))
		.returning({ id: apiTokens.id });
	return rows.length > 0;
}

/** Sets the account's length unit for display. */
export async function setLengthUnit(db: Database, userId: string, unit: 'mm' | 'in') {
	await db.update(users).set({ lengthUnit: unit }).where(eq(users.id, userId));
}
