// Corners and their immutable revisions, reached through the caller's memberships.
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { lockNumbering, retryingNumberRace } from './numbering';
import { createHash } from 'node:crypto';
import { cars, corners, memberships, revisions, uploads, users, type Corner } from '../schema';

/** A car's corners in a fixed order with their newest revision number and baseline. */
export function cornersOfCar(db: Database, carId: string) {
	return db
		.select({
			id: corners.id,
			position: corners.position,
			kind: corners.kind,
			baselineRevisionId: corners.baselineRevisionId,
			// Written out in full: inside a one-table select Drizzle leaves column names unqualified.
			revisionCount: sql<number>`(select count(*)::int from revisions r where r.corner_id = "corners"."id")`,
			latestNumber: sql<number | null>`(select max(r.number) from revisions r where r.corner_id = "corners"."id")`
		})
		.from(corners)
		.where(eq(corners.carId, carId))
		.orderBy(asc(corners.position));
}

/** Creates a corner on a car; null when the car already has one at that position. */
export async function createCorner(db: Database, carId: string, position: Corner['position'], kind: Corner['kind']) {
	const [row] = await db.insert(corners).values({ carId, position, kind }).onConflictDoNothing().returning();
	return row ?? null;
}

/** The corner (with its car) if the user is a member of its team, with the user's role; else null. */
export async function cornerForUser(db: Database, userId: string, cornerId: string) {
	const [row] = await db
		.select({ corner: corners, car: cars, role: memberships.role })
		.from(corners)
		.innerJoin(cars, eq(cars.id, corners.carId))
		.innerJoin(memberships, and(eq(memberships.teamId, cars.teamId), eq(memberships.userId, userId)))
		.where(eq(corners.id, cornerId))
		.limit(1);
	return row ?? null;
}

/** The revision (with corner and car) if the user is a member of its team, with the user's role; else null. */
export async function revisionForUser(db: Database, userId: string, revisionId: string) {
	const [row] = await db
		.select({ revision: revisions, corner: corners, car: cars, role: memberships.role })
		.from(revisions)
		.innerJoin(corners, eq(corners.id, revisions.cornerId))
		.innerJoin(cars, eq(cars.id, corners.carId))
		.innerJoin(memberships, and(eq(memberships.teamId, cars.teamId), eq(memberships.userId, userId)))
		.where(eq(revisions.id, revisionId))
		.limit(1);
	return row ?? null;
}

/** The columns of a revision list row (no geometry). */
const listColumns = {
	id: revisions.id,
	number: revisions.number,
	label: revisions.label,
	note: revisions.note,
	kind: revisions.kind,
	parentId: revisions.parentId,
	createdAt: revisions.createdAt,
	authorName: users.name
};

/** A corner's revisions, newest first, with the author's name (no geometry). */
export function revisionsOfCorner(db: Database, cornerId: string) {
	return db
		.select(listColumns)
		.from(revisions)
		.leftJoin(users, eq(users.id, revisions.authorId))
		.where(eq(revisions.cornerId, cornerId))
		.orderBy(desc(revisions.number));
}

/** A LIKE pattern matching `word` anywhere, with LIKE's own wildcards taken literally. */
function containing(word: string) {
	return `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/**
 * What a search word may match in a revision: its label, note, author's name, its number written `r12`, and its
 * date as `2026-12-03` or `3 Dec 2026` (UTC, the server's dates). Every word must match (the words are ANDed).
 */
function revisionSearch(q: string) {
	const words = q.trim().split(/\s+/).filter(Boolean).slice(0, 8);
	if (!words.length) return undefined;
	return and(
		...words.map(
			(w) => sql`concat_ws(' ', ${revisions.label}, ${revisions.note}, ${users.name}, 'r' || ${revisions.number},
				to_char(${revisions.createdAt} at time zone 'UTC', 'YYYY-MM-DD FMDD Mon YYYY')) ilike ${containing(w)}`
		)
	);
}

/** One page of a corner's revisions, newest first, optionally searched, and how many match in all. */
export async function revisionPage(db: Database, cornerId: string, opts: { q?: string; limit: number; offset: number }) {
	const where = and(eq(revisions.cornerId, cornerId), opts.q ? revisionSearch(opts.q) : undefined);
	const [rows, [{ total }]] = await Promise.all([
		db
			.select(listColumns)
			.from(revisions)
			.leftJoin(users, eq(users.id, revisions.authorId))
			.where(where)
			.orderBy(desc(revisions.number))
			.limit(opts.limit)
			.offset(opts.offset),
		db
			.select({ total: sql<number>`count(*)::int` })
			.from(revisions)
			.leftJoin(users, eq(users.id, revisions.authorId))
			.where(where)
	]);
	return { rows, total };
}

/** The listed revisions of a corner among `ids` (ids of another corner are left out), newest first. */
export function revisionsOfCornerByIds(db: Database, cornerId: string, ids: string[]) {
	if (!ids.length) return Promise.resolve([]);
	return db
		.select(listColumns)
		.from(revisions)
		.leftJoin(users, eq(users.id, revisions.authorId))
		.where(and(eq(revisions.cornerId, cornerId), inArray(revisions.id, ids)))
		.orderBy(desc(revisions.number));
}

/** A revision of a corner by id (with geometry), or null. */
export async function revisionOfCorner(db: Database, cornerId: string, revisionId: string) {
	const [row] = await db
		.select()
		.from(revisions)
		.where(and(eq(revisions.cornerId, cornerId), eq(revisions.id, revisionId)))
		.limit(1);
	return row ?? null;
}

/** The newest revision of a corner (with geometry), or null. */
export async function latestRevision(db: Database, cornerId: string) {
	const [row] = await db
		.select()
		.from(revisions)
		.where(eq(revisions.cornerId, cornerId))
		.orderBy(desc(revisions.number))
		.limit(1);
	return row ?? null;
}

export interface NewUpload {
	teamId: string;
	filename: string;
	contentType: string;
	bytes: Buffer;
	createdBy: string | null;
}

export interface NewRevision {
	cornerId: string;
	kind: Corner['kind'];
	geometry: Record<string, unknown>;
	label: string;
	note: string;
	parentId: string | null;
	authorId: string | null;
}


/**
 * Appends a revision with the next number, and the original upload it came from if any, in one
 * transaction. Two saves at once both succeed: the loser of the unique-number race takes the next number.
 */
export async function appendRevision(
	db: Database,
	input: NewRevision,
	upload?: NewUpload,
	/** more writes that must commit with the revision or not at all (the corner's kind, the audit event) */
	alongside?: (tx: Database, row: typeof revisions.$inferSelect) => Promise<void>
) {
	return retryingNumberRace('revisions_corner_number_key', () =>
		db.transaction(async (tx) => {
			await lockNumbering(tx as unknown as Database, 'revisions', input.cornerId);
			const [row] = await tx
				.insert(revisions)
				.values({
					...input,
					number: sql`(select coalesce(max(${revisions.number}), 0) + 1 from ${revisions} where ${revisions.cornerId} = ${input.cornerId})`
				})
				.returning();
			if (upload) {
				const sha256 = createHash('sha256').update(upload.bytes).digest('hex');
				await tx.insert(uploads).values({ ...upload, revisionId: row.id, sizeBytes: upload.bytes.length, sha256 });
			}
			if (alongside) await alongside(tx as unknown as Database, row);
			return row;
		})
	);
}

/** Points the corner's baseline at one of its revisions (revisions themselves never change). */
export async function setBaseline(db: Database, cornerId: string, revisionId: string | null) {
	await db.update(corners).set({ baselineRevisionId: revisionId }).where(eq(corners.id, cornerId));
}

/** The revision's corner kind is also the corner's; keep the corner row in step when a revision changes kind. */
export async function setCornerKind(db: Database, cornerId: string, kind: Corner['kind']) {
	await db.update(corners).set({ kind }).where(eq(corners.id, cornerId));
}

/** Replaces the corner's joint settings (limits and axes per joint). */
export async function setJointSettings(db: Database, cornerId: string, settings: Corner['jointSettings']) {
	await db.update(corners).set({ jointSettings: settings }).where(eq(corners.id, cornerId));
}
