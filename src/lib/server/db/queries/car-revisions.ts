// Car revisions: immutable snapshots of a car's own model pinning one revision of each corner.
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { lockNumbering, retryingNumberRace } from './numbering';
import { carRevisions, cars, corners, memberships, revisions, users } from '../schema';

export type NewCarRevision = Omit<typeof carRevisions.$inferInsert, 'number' | 'createdAt'>;

/** Appends a car revision with the next number; `alongside` writes (the audit event) commit with it or not at all. */
export async function appendCarRevision(db: Database, input: NewCarRevision, alongside?: (tx: Database, row: typeof carRevisions.$inferSelect) => Promise<void>) {
	return retryingNumberRace('car_revisions_car_number_key', () =>
		db.transaction(async (tx) => {
			await lockNumbering(tx as unknown as Database, 'car_revisions', input.carId);
			const [row] = await tx
				.insert(carRevisions)
				.values({ ...input, number: sql`(select coalesce(max(${carRevisions.number}), 0) + 1 from ${carRevisions} where ${carRevisions.carId} = ${input.carId})` })
				.returning();
			if (alongside) await alongside(tx as unknown as Database, row);
			return row;
		})
	);
}

/** A car's revisions, newest first, with their authors' names (without the model). */
export function carRevisionsOfCar(db: Database, carId: string, limit = 100) {
	return db
		.select({ id: carRevisions.id, number: carRevisions.number, label: carRevisions.label, note: carRevisions.note, createdAt: carRevisions.createdAt, authorName: users.name })
		.from(carRevisions)
		.leftJoin(users, eq(users.id, carRevisions.authorId))
		.where(eq(carRevisions.carId, carId))
		.orderBy(desc(carRevisions.number))
		.limit(limit);
}

/** One revision of this car (or its newest when revisionId is null), or null. */
export async function carRevisionOfCar(db: Database, carId: string, revisionId: string | null) {
	const [row] = await db
		.select()
		.from(carRevisions)
		.where(revisionId ? and(eq(carRevisions.carId, carId), eq(carRevisions.id, revisionId)) : eq(carRevisions.carId, carId))
		.orderBy(desc(carRevisions.number))
		.limit(1);
	return row ?? null;
}

/** The car revision with its car and the caller's role there, if the caller is a member of its team; else null. */
export async function carRevisionForUser(db: Database, userId: string, revisionId: string) {
	const [row] = await db
		.select({ carRevision: carRevisions, car: cars, role: memberships.role })
		.from(carRevisions)
		.innerJoin(cars, eq(cars.id, carRevisions.carId))
		.innerJoin(memberships, and(eq(memberships.teamId, cars.teamId), eq(memberships.userId, userId)))
		.where(eq(carRevisions.id, revisionId))
		.limit(1);
	return row ?? null;
}

/** The newest revision of each corner of a car: position → { id, geometry }. */
export async function latestCornerRevisions(db: Database, carId: string) {
	const rows = await db
		.selectDistinctOn([corners.position], { position: corners.position, id: revisions.id, geometry: revisions.geometry })
		.from(revisions)
		.innerJoin(corners, eq(corners.id, revisions.cornerId))
		.where(eq(corners.carId, carId))
		.orderBy(corners.position, desc(revisions.number));
	return Object.fromEntries(rows.map((r) => [r.position, { id: r.id, geometry: r.geometry }]));
}

/** Corner revisions by id that belong to this car: id → { position, geometry, number }. */
export async function cornerRevisionsOfCar(db: Database, carId: string, ids: string[]) {
	if (!ids.length) return new Map<string, { position: string; geometry: Record<string, unknown>; number: number }>();
	const rows = await db
		.select({ id: revisions.id, position: corners.position, geometry: revisions.geometry, number: revisions.number })
		.from(revisions)
		.innerJoin(corners, eq(corners.id, revisions.cornerId))
		.where(and(eq(corners.carId, carId), inArray(revisions.id, ids)));
	return new Map(rows.map((r) => [r.id, { position: r.position, geometry: r.geometry, number: r.number }]));
}
