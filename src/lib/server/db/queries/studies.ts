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

/** A study of the corner by id (scoped to the corner), or null. */
export async function studyOfCorner(db: Database, cornerId: string, studyId: string) {
	const [row] = await db.select().from(studies).where(and(eq(studies.cornerId, cornerId), eq(studies.id, studyId)));
	return row ?? null;
}

/**
 * Saves an analysis under a study name: settings replaced, and `results` merged key by key into the stored
 * results (so `results.fix`, `results.tolerance` and `results.tolerances` of one study live side by side).
 */
export async function saveStudyResults(
	db: Database,
	cornerId: string,
	userId: string,
	name: string,
	settings: Record<string, unknown>,
	results: Record<string, unknown>
) {
	return db.transaction(async (tx) => {
		const [existing] = await tx.select({ id: studies.id }).from(studies).where(and(eq(studies.cornerId, cornerId), eq(studies.name, name))).for('update');
		if (existing) {
			const [row] = await tx
				.update(studies)
				.set({ settings, results: sql`coalesce(${studies.results}, '{}'::jsonb) || ${JSON.stringify(results)}::jsonb`, updatedAt: sql`now()` })
				.where(eq(studies.id, existing.id))
				.returning();
			return row;
		}
		const [row] = await tx.insert(studies).values({ cornerId, name, settings, results, createdBy: userId }).returning();
		return row;
	});
}

/** Sets one key of a study's results (scoped to the corner); null when the study is not the corner's. */
export async function setStudyResult(db: Database, cornerId: string, studyId: string, key: string, value: unknown) {
	const [row] = await db
		.update(studies)
		.set({ results: sql`coalesce(${studies.results}, '{}'::jsonb) || jsonb_build_object(${key}::text, ${JSON.stringify(value)}::jsonb)`, updatedAt: sql`now()` })
		.where(and(eq(studies.cornerId, cornerId), eq(studies.id, studyId)))
		.returning();
	return row ?? null;
}
