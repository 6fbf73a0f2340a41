// Opens a Drizzle database over the postgres driver. Kept free of SvelteKit imports so scripts and tests can use it.
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';

/** Connects to the database at url; max is the pool size. */
export function connect(url: string, max = 10) {
	const client = postgres(url, { max, onnotice: () => {} });
	return { db: drizzle(client, { schema }), client };
}

export type Database = ReturnType<typeof connect>['db'];
