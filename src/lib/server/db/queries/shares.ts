// Share links: read-only links to one revision for people without an account. Only the token's hash is stored.
import { and, desc, eq, getTableColumns, sql } from 'drizzle-orm';
import { tolerancesOfRevisionSql } from './tolerances';
import type { Database } from '../connect';
import { auditEvents, carRevisions, cars, corners, memberships, revisions, shareLinks, users } from '../schema';

export interface NewShareLink {
	teamId: string;
	revisionId: string;
	tokenHash: string;
	note: string;
	showRevisionNote: boolean;
	expiresAt: Date;
	createdBy: string;
	sentTo?: string | null;
}

/** Stores a new revision-scoped link. */
export async function createShareLink(db: Database, input: NewShareLink) {
	const [row] = await db.insert(shareLinks).values({ ...input, scope: 'revision' }).returning();
	return row;
}

/** A link's columns as the lists show them, with the creator's name (never the token). */
const LISTED = {
	id: shareLinks.id,
	note: shareLinks.note,
	createdAt: shareLinks.createdAt,
	expiresAt: shareLinks.expiresAt,
	revokedAt: shareLinks.revokedAt,
	lastOpenedAt: shareLinks.lastOpenedAt,
	openCount: shareLinks.openCount,
	createdByName: users.name
};

/** A revision's links, newest first, with the creator's name (never the token). */
export function sharesOfRevision(db: Database, revisionId: string) {
	return db
		.select({ ...LISTED, showRevisionNote: shareLinks.showRevisionNote, sentTo: shareLinks.sentTo })
		.from(shareLinks)
		.leftJoin(users, eq(users.id, shareLinks.createdBy))
		.where(eq(shareLinks.revisionId, revisionId))
		.orderBy(desc(shareLinks.createdAt));
}

/** Stores a new link to one axle of a car revision (scope 'axle'). */
export async function createAxleShareLink(db: Database, input: Omit<NewShareLink, 'revisionId'> & { carRevisionId: string; axle: 'front' | 'rear' }) {
	const [row] = await db.insert(shareLinks).values({ ...input, scope: 'axle' }).returning();
	return row;
}

/** A car revision's axle links, newest first, with the creator's name (never the token). */
export function sharesOfCarRevision(db: Database, carRevisionId: string) {
	return db
		.select({ ...LISTED, axle: shareLinks.axle })
		.from(shareLinks)
		.leftJoin(users, eq(users.id, shareLinks.createdBy))
		.where(and(eq(shareLinks.carRevisionId, carRevisionId), eq(shareLinks.scope, 'axle')))
		.orderBy(desc(shareLinks.createdAt));
}

/** An axle link by its token's hash with its car revision and car (the car in the link's own team); null when unknown. */
export async function axleShareToOpen(db: Database, tokenHash: string) {
	const [row] = await db
		.select({ share: shareLinks, carRevision: carRevisions, car: cars })
		.from(shareLinks)
		.innerJoin(carRevisions, eq(carRevisions.id, shareLinks.carRevisionId))
		.innerJoin(cars, and(eq(cars.id, carRevisions.carId), eq(cars.teamId, shareLinks.teamId)))
		.where(and(eq(shareLinks.tokenHash, tokenHash), eq(shareLinks.scope, 'axle')))
		.limit(1);
	return row ?? null;
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

/** The revision's columns but its geometry (the sheet reads that once per revision, see revisionById). */
const { geometry: _geometry, ...revisionSummary } = getTableColumns(revisions);

/**
 * What opening a link needs in one round trip: the link, its revision (without the geometry), corner and car,
 * and the adopted tolerances of that revision (raw; pick with latestTolerances). Null for an unknown token.
 */
export async function shareToOpen(db: Database, tokenHash: string) {
	const [row] = await db
		.select({ share: shareLinks, revision: revisionSummary, corner: corners, car: cars, tolerances: tolerancesOfRevisionSql(corners.id, revisions.id) })
		.from(shareLinks)
		.innerJoin(revisions, eq(revisions.id, shareLinks.revisionId))
		.innerJoin(corners, eq(corners.id, revisions.cornerId))
		.innerJoin(cars, and(eq(cars.id, corners.carId), eq(cars.teamId, shareLinks.teamId)))
		.where(and(eq(shareLinks.tokenHash, tokenHash), eq(shareLinks.scope, 'revision')))
		.limit(1);
	return row ?? null;
}

/** Openings of one link gathered in memory between two flushes (see sharing/opens.ts). */
export interface ShareOpenBatch {
	shareId: string;
	teamId: string;
	count: number;
	first: Date;
	last: Date;
	detail: Record<string, unknown>;
}

/**
 * Adds a batch of openings to their links (open_count, last_opened_at) in one transaction, and writes a
 * `share.opened` audit event, dated at the batch's first opening, for each link not opened within gapMs before it.
 * Each link row is locked only for its own update.
 */
export async function addShareOpens(db: Database, batches: ShareOpenBatch[], gapMs: number) {
	if (batches.length === 0) return;
	await db.transaction(async (tx) => {
		for (const b of [...batches].sort((x, y) => x.shareId.localeCompare(y.shareId))) {
			const [before] = await tx
				.select({ lastOpenedAt: shareLinks.lastOpenedAt })
				.from(shareLinks)
				.where(eq(shareLinks.id, b.shareId))
				.for('update');
			if (!before) continue; // the link was deleted with its revision or team
			await tx
				.update(shareLinks)
				.set({
					openCount: sql`${shareLinks.openCount} + ${b.count}`,
					lastOpenedAt: sql`greatest(${shareLinks.lastOpenedAt}, ${b.last.toISOString()}::timestamptz)`
				})
				.where(eq(shareLinks.id, b.shareId));
			if (!before.lastOpenedAt || b.first.getTime() - before.lastOpenedAt.getTime() > gapMs) {
				await tx.insert(auditEvents).values({
					teamId: b.teamId,
					actorId: null,
					action: 'share.opened',
					subjectType: 'share_link',
					subjectId: b.shareId,
					detail: { ...b.detail, opens: b.count },
					createdAt: b.first
				});
			}
		}
	});
}

/** A revision by id within a corner, for the baseline of a shared revision (no team check: the caller has one). */
export async function revisionById(db: Database, revisionId: string) {
	const [row] = await db.select().from(revisions).where(eq(revisions.id, revisionId)).limit(1);
	return row ?? null;
}
