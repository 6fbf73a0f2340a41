// Team settings (a JSON object per team), such as the import mapping the team used last.
import { eq, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { teams } from '../schema';

/** The team's settings object. */
export async function teamSettings(db: Database, teamId: string): Promise<Record<string, unknown>> {
	const [row] = await db.select({ settings: teams.settings }).from(teams).where(eq(teams.id, teamId));
	return row?.settings ?? {};
}

/** Merges one top-level key into the team's settings. */
export async function setTeamSetting(db: Database, teamId: string, key: string, value: unknown) {
	await db
		.update(teams)
		.set({ settings: sql`${teams.settings} || jsonb_build_object(${key}::text, ${JSON.stringify(value)}::jsonb)` })
		.where(eq(teams.id, teamId));
}
