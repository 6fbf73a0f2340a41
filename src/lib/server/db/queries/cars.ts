// Cars, always reached through the caller's memberships so another team's car is simply not found.
import { and, asc, eq, sql } from 'drizzle-orm';
import type { CarInput, CarPatch } from '$lib/schemas/car';
import type { Database } from '../connect';
import { cars, memberships } from '../schema';

/** A team's cars by name, with their number of corners. */
export function listCars(db: Database, teamId: string) {
	return db
		.select({
			id: cars.id,
			name: cars.name,
			series: cars.series,
			driveLayout: cars.driveLayout,
			updatedAt: cars.updatedAt,
			// Written out in full: inside a one-table select Drizzle leaves column names unqualified.
			cornerCount: sql<number>`(select count(*)::int from corners c where c.car_id = "cars"."id")`
		})
		.from(cars)
		.where(eq(cars.teamId, teamId))
		.orderBy(asc(cars.name));
}

/** The car with this id if the user is a member of its team, with the user's role there; else null. */
export async function carForUser(db: Database, userId: string, carId: string) {
	const [row] = await db
		.select({ car: cars, role: memberships.role })
		.from(cars)
		.innerJoin(memberships, and(eq(memberships.teamId, cars.teamId), eq(memberships.userId, userId)))
		.where(eq(cars.id, carId))
		.limit(1);
	return row ?? null;
}

/** Creates a car in a team. */
export async function createCar(db: Database, teamId: string, userId: string, input: CarInput) {
	const [row] = await db
		.insert(cars)
		.values({ ...input, teamId, createdBy: userId })
		.returning();
	return row;
}

/** Updates a car's fields. */
export async function updateCar(db: Database, carId: string, patch: CarPatch) {
	const [row] = await db
		.update(cars)
		.set({ ...patch, updatedAt: sql`now()` })
		.where(eq(cars.id, carId))
		.returning();
	return row;
}

/** Replaces a car's targets (validated by the caller). */
export async function setCarTargets(db: Database, carId: string, targets: unknown[]) {
	await db.update(cars).set({ targets, updatedAt: sql`now()` }).where(eq(cars.id, carId));
}
