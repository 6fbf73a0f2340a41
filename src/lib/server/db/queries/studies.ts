// Studies: saved analysis settings per corner.
import { and, asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { studies } from '../schema';

/** A corner's studies by name. */
export function studiesOfCorner(db: Database, cornerId: string) {
	return db
		.select({ id: studies.id, name: studies.name, settings: studies.settings, updatedAt: studies.updatedAt })
		.from(studies)
		.where(eq(studies.cornerId, cornerId))
		.orderBy(asc(studies.name));
}

/** Saves a study under its name: a new one, or the settings of the same-named one replaced. */
export async function saveStudy(db: Database, cornerId: string, userId: string, name: string, settings: Record<string, unknown>) {
	const [existing] = await db.select({ id: studies.id }).from(studies).where(and(eq(studies.cornerId, cornerId), eq(studies.name, name)));
	if (existing) {
		const [row] = await db.update(studies).set({ settings, updatedAt: sql`now()` }).where(eq(studies.id, existing.id)).returning();
		return row;
	}
	const [row] = await db.insert(studies).values({ cornerId, name, settings, createdBy: userId }).returning();
	return row;
}
