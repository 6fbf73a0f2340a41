// Opens a Drizzle database over the postgres driver. Kept free of SvelteKit imports so scripts and tests can use it.
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';

/**
 * Timeouts for the app's pool, so a request fails within a few seconds while the database is unreachable or stalled
 * (and gets the outage answer, 503) instead of hanging: a new connection gives up after CONNECT_TIMEOUT_S, a
 * statement is cancelled by the server after STATEMENT_TIMEOUT_MS, a transaction left idle is ended, and a closed
 * connection is retried after at most a second.
 * Common-practice figures for an interactive web app; no source.
 */
export const POOL_TIMEOUTS = { connectTimeoutS: 3, statementTimeoutMs: 10_000, idleInTransactionMs: 10_000, maxBackoffS: 1 };

/**
 * Connects to the database at url; max is the pool size; `timeouts` sets POOL_TIMEOUTS (the app's pool);
 * `asyncCommit` turns synchronous_commit off for this pool's sessions (the queue workers' writes: see explore-worker.ts).
 */
export function connect(url: string, max = 10, { timeouts = false, asyncCommit = false } = {}) {
	const client = postgres(url, {
		max,
		onnotice: () => {},
		...(asyncCommit ? { connection: { synchronous_commit: 'off' } } : {}),
		...(timeouts
			? {
					connect_timeout: POOL_TIMEOUTS.connectTimeoutS,
					// The driver waits before reconnecting a closed connection, and queries wait with it: by default up to
					// 20 s after a few failures (3^n / 100 s). Capped so a query during an outage fails within about a second.
					backoff: (retries: number) => Math.min(0.05 * 2 ** retries, POOL_TIMEOUTS.maxBackoffS),
					connection: {
						statement_timeout: POOL_TIMEOUTS.statementTimeoutMs,
						idle_in_transaction_session_timeout: POOL_TIMEOUTS.idleInTransactionMs
					}
				}
			: {})
	});
	return { db: drizzle(client, { schema }), client };
}

export type Database = ReturnType<typeof connect>['db'];
