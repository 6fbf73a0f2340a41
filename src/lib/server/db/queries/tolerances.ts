// The placement tolerances adopted for a revision, as the tolerance study writes them into `studies.results`:
// results.tolerances = { revisionId, points: { [name]: { mm, mode: 'axis' | 'sphere' } }, updatedAt (ISO) }.
import { and, eq, sql, type SQLWrapper } from 'drizzle-orm';
import { z } from 'zod';
import type { Database } from '../connect';
import { studies } from '../schema';

export const adoptedTolerances = z.object({
	revisionId: z.string(),
	points: z.record(z.string(), z.object({ mm: z.number().positive().finite(), mode: z.enum(['axis', 'sphere']) })),
	updatedAt: z.string()
});

export type AdoptedTolerances = z.infer<typeof adoptedTolerances>;

/**
 * The tolerances of the corner's most recently updated study (by results.tolerances.updatedAt) that adopted
 * them for this revision, or null when none did. A row whose tolerances do not match the contract is skipped.
 */
export async function tolerancesForRevision(db: Database, cornerId: string, revisionId: string): Promise<AdoptedTolerances | null> {
	const rows = await db
		.select({ tolerances: sql<unknown>`${studies.results} -> 'tolerances'` })
		.from(studies)
		.where(and(eq(studies.cornerId, cornerId), sql`${studies.results} -> 'tolerances' ->> 'revisionId' = ${revisionId}`))
		.orderBy(sql`${studies.updatedAt} desc`);
	return latestTolerances(rows.map((r) => r.tolerances));
}

/**
 * The corner's adopted tolerances for a revision as one JSON array, for a query that selects from corners and
 * revisions (the share sheet's lookup); pick the valid newest with latestTolerances.
 */
export const tolerancesOfRevisionSql = (cornerId: SQLWrapper, revisionId: SQLWrapper) =>
	sql<unknown[]>`(select coalesce(jsonb_agg(${studies.results} -> 'tolerances'), '[]'::jsonb) from ${studies}
		where ${studies.cornerId} = ${cornerId} and ${studies.results} -> 'tolerances' ->> 'revisionId' = ${revisionId}::text)`;

/** The valid entry with the newest updatedAt among raw `results.tolerances` values, or null. */
export function latestTolerances(raw: unknown[]): AdoptedTolerances | null {
	// Sorted here by the instant, not the string: ISO times with different offsets do not sort as text.
	const valid = raw
		.map((r) => adoptedTolerances.safeParse(r))
		.flatMap((p) => (p.success && !Number.isNaN(Date.parse(p.data.updatedAt)) ? [p.data] : []));
	valid.sort((a, b) => Date.parse(b.updatedAt) - Date.parse(a.updatedAt));
	return valid[0] ?? null;
}
