// Scans (issue 17) and the point sources of revisions captured on them. Reached through the caller's memberships.
import { and, asc, desc, eq, inArray, lt, or, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { cars, corners, memberships, pointSources, scans, type Scan } from '../schema';

/** The scan (with its car) if the user is a member of its team, with the user's role; else null. */
export async function scanForUser(db: Database, userId: string, scanId: string) {
	const [row] = await db
		.select({ scan: scans, car: cars, role: memberships.role })
		.from(scans)
		.innerJoin(cars, eq(cars.id, scans.carId))
		.innerJoin(memberships, and(eq(memberships.teamId, cars.teamId), eq(memberships.userId, userId)))
		.where(eq(scans.id, scanId))
		.limit(1);
	return row ?? null;
}

/** A car's scans, newest first (a corner's only, when cornerId is given). */
export function scansOfCar(db: Database, carId: string, cornerId?: string) {
	return db
		.select()
		.from(scans)
		.where(cornerId ? and(eq(scans.carId, carId), eq(scans.cornerId, cornerId)) : eq(scans.carId, carId))
		.orderBy(desc(scans.createdAt));
}

/** The corner of a car by id, or null (scans name a corner of their own car only). */
export async function cornerOfCar(db: Database, carId: string, cornerId: string) {
	const [row] = await db.select().from(corners).where(and(eq(corners.id, cornerId), eq(corners.carId, carId))).limit(1);
	return row ?? null;
}

export type NewScan = Pick<Scan, 'carId' | 'cornerId' | 'name' | 'format' | 'sizeBytes' | 'objectKey' | 'createdBy'> & { id: string; uploadId: string };

/** Inserts a scan in the 'uploading' state. */
export async function insertScan(db: Database, scan: NewScan) {
	const [row] = await db.insert(scans).values({ ...scan, status: 'uploading' }).returning();
	return row;
}

/** Moves a scan from one status to another; null when it was not in `from` any more (someone else moved it). */
export async function moveScan(db: Database, scanId: string, from: Scan['status'][], set: Partial<Scan> & { status: Scan['status'] }) {
	const [row] = await db
		.update(scans)
		.set({ ...set, statusAt: sql`now()` })
		.where(and(eq(scans.id, scanId), inArray(scans.status, from)))
		.returning();
	return row ?? null;
}

/** Sets the scan's unit and alignment. */
export async function setScanAlignment(db: Database, scanId: string, unit: Scan['unit'], alignment: Scan['alignment']) {
	const [row] = await db.update(scans).set({ unit, alignment }).where(eq(scans.id, scanId)).returning();
	return row ?? null;
}

/** Deletes a scan row; returns it, or null when it was gone. */
export async function deleteScanRow(db: Database, scanId: string) {
	const [row] = await db.delete(scans).where(eq(scans.id, scanId)).returning();
	return row ?? null;
}

/**
 * Scans stuck in 'uploading' past `uploadingSeconds` or in 'processing' past `processingSeconds` (a crash, a closed
 * browser): marked 'failed' with a message; returned so their upload or objects can be dropped.
 */
export async function sweepStaleScans(db: Database, uploadingSeconds: number, processingSeconds: number) {
	return db
		.update(scans)
		.set({
			status: 'failed',
			statusAt: sql`now()`,
			error: sql`case when ${scans.status} = 'uploading' then 'the upload was not finished in time; upload the file again' else 'processing stopped before it finished (the server restarted?); upload the file again' end`
		})
		.where(
			or(
				and(eq(scans.status, 'uploading'), lt(scans.statusAt, sql`now() - make_interval(secs => ${uploadingSeconds})`)),
				and(eq(scans.status, 'processing'), lt(scans.statusAt, sql`now() - make_interval(secs => ${processingSeconds})`))
			)
		)
		.returning({ id: scans.id, objectKey: scans.objectKey, uploadId: scans.uploadId, previewKey: scans.previewKey, previous: sql<string>`'stale'` });
}

export interface NewPointSource {
	point: string;
	scanId: string;
	scanName: string;
	fit: string;
	residualMm: number | null;
	pointsUsed: number | null;
}

/** Writes a revision's point sources (inside the revision's transaction). */
export async function insertPointSources(db: Database, revisionId: string, rows: NewPointSource[]) {
	if (rows.length) await db.insert(pointSources).values(rows.map((r) => ({ ...r, revisionId })));
}

/** A revision's point sources by point name. */
export function pointSourcesOf(db: Database, revisionId: string) {
	return db.select().from(pointSources).where(eq(pointSources.revisionId, revisionId)).orderBy(asc(pointSources.point));
}
