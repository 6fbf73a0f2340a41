// A team's members and invitations. The team always keeps at least one owner.
import { and, asc, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { revokeSessionsOfUser } from './sessions';

/** A transaction handle (what db.transaction passes its callback). */
type Tx = Parameters<Parameters<Database['transaction']>[0]>[0];
import { invitations, memberships, teams, users, type Role } from '../schema';

/** A team's members by name, with role and when they joined. */
export function membersOfTeam(db: Database, teamId: string) {
	return db
		.select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.teamId, teamId))
		.orderBy(asc(users.name));
}

/** One member of a team, or null. */
export async function memberOfTeam(db: Database, teamId: string, userId: string) {
	const [row] = await db
		.select({ userId: users.id, name: users.name, email: users.email, role: memberships.role })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
		.limit(1);
	return row ?? null;
}

/** True when an account with this e-mail is already a member of the team. */
export async function isMemberByEmail(db: Database, teamId: string, email: string) {
	const [row] = await db
		.select({ userId: memberships.userId })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.teamId, teamId), eq(users.email, email.toLowerCase())))
		.limit(1);
	return !!row;
}

/** A team's invitations that are neither accepted nor cancelled (expired ones too, marked by their date), newest first. */
export function pendingInvitations(db: Database, teamId: string) {
	return db
		.select({
			id: invitations.id,
			email: invitations.email,
			role: invitations.role,
			createdAt: invitations.createdAt,
			expiresAt: invitations.expiresAt,
			invitedByName: users.name
		})
		.from(invitations)
		.leftJoin(users, eq(users.id, invitations.invitedBy))
		.where(and(eq(invitations.teamId, teamId), isNull(invitations.acceptedAt), isNull(invitations.cancelledAt)))
		.orderBy(desc(invitations.createdAt));
}

export type RoleChange = { ok: true; before: Role } | { ok: false; reason: 'not_member' | 'last_owner' };

/** The team's owner rows locked for the rest of the transaction, so two demotions cannot both pass the check. */
async function lockedOwnerCount(tx: Tx, teamId: string) {
	const rows = await tx
		.select({ userId: memberships.userId })
		.from(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.role, 'owner')))
		.for('update');
	return rows.length;
}

/** One member's role, its row locked until the transaction ends; undefined when not a member. */
async function lockedMember(tx: Parameters<typeof lockedOwnerCount>[0], teamId: string, userId: string) {
	const [member] = await tx
		.select({ role: memberships.role })
		.from(memberships)
		.where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
		.for('update');
	return member;
}

/** Changes a member's role, refusing to demote the last owner. */
export function changeRole(db: Database, teamId: string, userId: string, role: Role): Promise<RoleChange> {
	return db.transaction(async (tx) => {
		const owners = await lockedOwnerCount(tx, teamId);
		const member = await lockedMember(tx, teamId, userId);
		if (!member) return { ok: false, reason: 'not_member' };
		if (member.role === 'owner' && role !== 'owner' && owners <= 1) return { ok: false, reason: 'last_owner' };
		await tx.update(memberships).set({ role }).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
		return { ok: true, before: member.role };
	});
}

/** Removes a member from a team, refusing to remove the last owner. */
export function removeMember(db: Database, teamId: string, userId: string): Promise<RoleChange> {
	return db.transaction(async (tx) => {
		const owners = await lockedOwnerCount(tx, teamId);
		const member = await lockedMember(tx, teamId, userId);
		if (!member) return { ok: false, reason: 'not_member' };
		if (member.role === 'owner' && owners <= 1) return { ok: false, reason: 'last_owner' };
		await tx.delete(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
		// a removed member's open pages end with their sessions: they sign in again to reach their other teams
		await revokeSessionsOfUser(tx, userId);
		return { ok: true, before: member.role };
	});
}

export interface NewInvitation {
	teamId: string;
	email: string;
	role: Role;
	tokenHash: string;
	invitedBy: string;
	expiresAt: Date;
}

/** Stores an invitation, cancelling any earlier pending one to the same address, in one transaction. */
export function createInvitation(db: Database, input: NewInvitation) {
	return db.transaction(async (tx) => {
		await tx
			.update(invitations)
			.set({ cancelledAt: sql`now()` })
			.where(
				and(eq(invitations.teamId, input.teamId), eq(invitations.email, input.email), isNull(invitations.acceptedAt), isNull(invitations.cancelledAt))
			);
		const [row] = await tx.insert(invitations).values(input).returning();
		return row;
	});
}

/** A team's pending invitation by id, or null. */
export async function pendingInvitationOfTeam(db: Database, teamId: string, invitationId: string) {
	const [row] = await db
		.select()
		.from(invitations)
		.where(and(eq(invitations.id, invitationId), eq(invitations.teamId, teamId), isNull(invitations.acceptedAt), isNull(invitations.cancelledAt)))
		.limit(1);
	return row ?? null;
}

/** Gives a pending invitation a new token and expiry (the old link stops working); null when not pending. */
export async function renewInvitation(db: Database, invitationId: string, tokenHash: string, expiresAt: Date) {
	const [row] = await db
		.update(invitations)
		.set({ tokenHash, expiresAt })
		.where(and(eq(invitations.id, invitationId), isNull(invitations.acceptedAt), isNull(invitations.cancelledAt)))
		.returning();
	return row ?? null;
}

/** Cancels a pending invitation; null when it was not pending. */
export async function cancelInvitation(db: Database, teamId: string, invitationId: string) {
	const [row] = await db
		.update(invitations)
		.set({ cancelledAt: sql`now()` })
		.where(and(eq(invitations.id, invitationId), eq(invitations.teamId, teamId), isNull(invitations.acceptedAt), isNull(invitations.cancelledAt)))
		.returning();
	return row ?? null;
}

/** The invitation with this token hash, with its team's and inviter's names, or null. */
export async function invitationByTokenHash(db: Database, tokenHash: string) {
	const [row] = await db
		.select({ invitation: invitations, teamName: teams.name, invitedByName: users.name })
		.from(invitations)
		.innerJoin(teams, eq(teams.id, invitations.teamId))
		.leftJoin(users, eq(users.id, invitations.invitedBy))
		.where(eq(invitations.tokenHash, tokenHash))
		.limit(1);
	return row ?? null;
}

/** Marks a still-open invitation accepted inside a transaction; false when it was taken, cancelled or expired meanwhile. */
async function claim(tx: Tx, invitationId: string) {
	const rows = await tx
		.update(invitations)
		.set({ acceptedAt: sql`now()` })
		.where(
			and(eq(invitations.id, invitationId), isNull(invitations.acceptedAt), isNull(invitations.cancelledAt), gt(invitations.expiresAt, sql`now()`))
		)
		.returning({ id: invitations.id });
	return rows.length > 0;
}

/** Adds an existing account to the invitation's team (keeping a role it already has there); false when no longer open. */
export function acceptInvitation(db: Database, invitationId: string, teamId: string, userId: string, role: Role) {
	return db.transaction(async (tx) => {
		if (!(await claim(tx, invitationId))) return false;
		await tx.insert(memberships).values({ teamId, userId, role }).onConflictDoNothing();
		return true;
	});
}

class Refused extends Error {
	constructor(readonly reason: 'closed' | 'exists') {
		super(reason);
	}
}

/**
 * Creates the account of an invited person as a member of the team and uses up the invitation, in one
 * transaction; 'closed' when the invitation is no longer open, 'exists' when the e-mail already has an account.
 */
export async function createUserForInvitation(
	db: Database,
	input: { invitationId: string; teamId: string; role: Role; email: string; name: string; passwordHash: string }
) {
	try {
		return await db.transaction(async (tx) => {
			if (!(await claim(tx, input.invitationId))) throw new Refused('closed');
			const [user] = await tx
				.insert(users)
				.values({ email: input.email.toLowerCase(), name: input.name, passwordHash: input.passwordHash })
				.onConflictDoNothing()
				.returning({ id: users.id, email: users.email, name: users.name });
			if (!user) throw new Refused('exists');
			await tx.insert(memberships).values({ teamId: input.teamId, userId: user.id, role: input.role });
			return user;
		});
	} catch (e) {
		if (e instanceof Refused) return e.reason;
		throw e;
	}
}
