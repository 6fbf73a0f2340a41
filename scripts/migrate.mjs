#!/usr/bin/env node
// Applies the SQL migrations in drizzle/ over one connection. Usage: node scripts/migrate.mjs [DATABASE_URL]
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';

/** Migrates the database at url to the newest schema. */
export async function migrateDatabase(url) {
	const client = postgres(url, { max: 1, onnotice: () => {} });
	try {
		await migrate(drizzle(client), { migrationsFolder: new URL('../drizzle', import.meta.url).pathname });
	} finally {
		await client.end();
	}
}

if (import.meta.url === `file://${process.argv[1]}`) {
	const url = process.argv[2] ?? process.env.DATABASE_URL;
	if (!url) {
		console.error('usage: node scripts/migrate.mjs DATABASE_URL (or set DATABASE_URL)');
		process.exit(1);
	}
	await migrateDatabase(url);
	console.log('[db] migrations applied');
}
