// Objects numbered per parent (corner revisions, car revisions): the next number is taken inside the insert, and
// saves at once all succeed. Each save first takes a transaction-scoped advisory lock of its parent, so saves to one
// parent queue rather than race (with 20 writers on one corner a plain retry could lose 20 times in a row under
// load); the unique index still guards the numbers, and a lost race (a save through another path) is retried.
import { sql } from 'drizzle-orm';
import type { Database } from '../connect';

const UNIQUE_VIOLATION = '23505';

/** True when e is a unique violation of the named constraint (also when the driver's error is wrapped as `cause`). */
function violates(e: unknown, constraint: string) {
	const cause = (e as { cause?: { code?: string; constraint_name?: string } }).cause ?? (e as { code?: string; constraint_name?: string });
	return cause?.code === UNIQUE_VIOLATION && cause.constraint_name === constraint;
}

/** Runs save (a transaction that inserts the next number) again while it loses the race on `constraint`, at most 20 times. */
export async function retryingNumberRace<T>(constraint: string, save: () => Promise<T>): Promise<T> {
	for (let attempt = 0; ; attempt++) {
		try {
			return await save();
		} catch (e) {
			if (!violates(e, constraint) || attempt >= 20) throw e;
		}
	}
}

/** Takes the numbering lock of one parent until the transaction ends (PostgreSQL's pg_advisory_xact_lock). */
export async function lockNumbering(tx: Database, scope: 'revisions' | 'car_revisions', parentId: string) {
	await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`linkwright:${scope}:${parentId}`}, 0))`);
}
