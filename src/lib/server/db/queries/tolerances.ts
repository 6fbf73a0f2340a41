// The placement tolerances adopted for a revision, as the tolerance study writes them into `studies.results`:
// results.tolerances = { revisionId, points: { [name]: { mm, mode: 'axis' | 'sphere' } }, updatedAt (ISO) }.
import { and, eq, sql } from 'drizzle-orm';
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
	// Sorted here by the instant, not the string: ISO times with different offsets do not sort as text.
	const valid = rows
		.map((r) => adoptedTolerances.safeParse(r.tolerances))
		.flatMap((p) => (p.success && !Number.isNaN(Date.parse(p.data.updatedAt)) ? [p.data] : []));
	valid.sort((a, b) => Date.parse(b.updatedAt) - Date.parse(a.updatedAt));
	return valid[0] ?? null;
}
