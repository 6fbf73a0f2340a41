// The database's answer to the health check.
import { sql } from 'drizzle-orm';
import type { Database } from '../connect';

/** Round-trips one trivial statement; resolves to true, or rejects with the driver's error. */
export async function pingDatabase(db: Database) {
	await db.execute(sql`select 1`);
	return true;
}
