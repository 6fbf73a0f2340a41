// Share links: read-only links to one revision for people without an account. Only the token's hash is stored.
import { and, desc, eq, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { cars, corners, memberships, revisions, shareLinks, users } from '../schema';

export interface NewShareLink {
	teamId: string;
	revisionId: string;
	tokenHash: string;
	note: string;
	showRevisionNote: boolean;
	expiresAt: Date;
	createdBy: string;
}

/** Stores a new revision-scoped link. */
export async function createShareLink(db: Database, input: NewShareLink) {
	const [row] = await db.insert(shareLinks).values({ ...input, scope: 'revision' }).returning();
	return row;
}

/** A revision's links, newest first, with the creator's name (never the token). */
export function sharesOfRevision(db: Database, revisionId: string) {
	return db
		.select({
			id: shareLinks.id,
			note: shareLinks.note,
			showRevisionNote: shareLinks.showRevisionNote,
			createdAt: shareLinks.createdAt,
			expiresAt: shareLinks.expiresAt,
			revokedAt: shareLinks.revokedAt,
			lastOpenedAt: shareLinks.lastOpenedAt,
			openCount: shareLinks.openCount,
			createdByName: users.name
		})
		.from(shareLinks)
		.leftJoin(users, eq(users.id, shareLinks.createdBy))
		.where(eq(shareLinks.revisionId, revisionId))
		.orderBy(desc(shareLinks.createdAt));
}

/** A link (with the caller's role in its team) if the user is a member of the team that made it; else null. */
export async function shareForUser(db: Database, userId: string, shareId: string) {
	const [row] = await db
		.select({ share: shareLinks, role: memberships.role })
		.from(shareLinks)
		.innerJoin(memberships, and(eq(memberships.teamId, shareLinks.teamId), eq(memberships.userId, userId)))
		.where(eq(shareLinks.id, shareId))
		.limit(1);
	return row ?? null;
}

/** Revokes a link now; null when it was already revoked. */
export async function revokeShareLink(db: Database, shareId: string) {
	const [row] = await db
		.update(shareLinks)
		.set({ revokedAt: sql`now()` })
		.where(and(eq(shareLinks.id, shareId), sql`${shareLinks.revokedAt} is null`))
		.returning();
	return row ?? null;
}

/** The link with this token hash and the one revision it opens (with corner and car), or null. */
export async function shareByTokenHash(db: Database, tokenHash: string) {
	const [row] = await db
		.select({ share: shareLinks, revision: revisions, corner: corners, car: cars })
		.from(shareLinks)
		.innerJoin(revisions, eq(revisions.id, shareLinks.revisionId))
		.innerJoin(corners, eq(corners.id, revisions.cornerId))
		.innerJoin(cars, and(eq(cars.id, corners.carId), eq(cars.teamId, shareLinks.teamId)))
		.where(and(eq(shareLinks.tokenHash, tokenHash), eq(shareLinks.scope, 'revision')))
		.limit(1);
	return row ?? null;
}

/** Counts one opening; returns when the link had last been opened before this (null the first time). */
export async function markShareOpened(db: Database, shareId: string): Promise<Date | null> {
	return db.transaction(async (tx) => {
		const [before] = await tx
			.select({ lastOpenedAt: shareLinks.lastOpenedAt })
			.from(shareLinks)
			.where(eq(shareLinks.id, shareId))
			.for('update');
		await tx
			.update(shareLinks)
			.set({ openCount: sql`${shareLinks.openCount} + 1`, lastOpenedAt: sql`now()` })
			.where(eq(shareLinks.id, shareId));
		return before?.lastOpenedAt ?? null;
	});
}

/** A revision by id within a corner, for the baseline of a shared revision (no team check: the caller has one). */
export async function revisionById(db: Database, revisionId: string) {
	const [row] = await db.select().from(revisions).where(eq(revisions.id, revisionId)).limit(1);
	return row ?? null;
}
