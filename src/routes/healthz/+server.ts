// For a load balancer or a monitor: the app answers, and whether the database does (200 both up, 503 otherwise).
import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { pingDatabase } from '$lib/server/db/queries/health';
import { RETRY_AFTER_S } from '$lib/server/http/outage';
import type { RequestHandler } from './$types';

/** How long the database may take to answer the check before it counts as down. */
const PING_TIMEOUT_MS = 2000;

export const GET: RequestHandler = async () => {
	const started = performance.now();
	const database = await Promise.race([
		pingDatabase(db).then(() => 'up' as const, () => 'down' as const),
		new Promise<'down'>((r) => setTimeout(() => r('down'), PING_TIMEOUT_MS).unref())
	]);
	const body = { app: 'up', database, databaseMs: Math.round(performance.now() - started) };
	return json(body, {
		status: database === 'up' ? 200 : 503,
		headers: { 'cache-control': 'no-store', ...(database === 'up' ? {} : { 'retry-after': String(RETRY_AFTER_S) }) }
	});
};
