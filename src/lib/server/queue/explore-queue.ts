// The job queue: pg-boss (v10) in the product's own PostgreSQL (its tables in schema `pgboss`), no new server.
// A design-space exploration is queued as one job per chunk of variants; any worker process that reaches the
// database (`npm run worker`, or the one `npm start` runs) takes them.
import PgBoss from 'pg-boss';

export const EXPLORE_QUEUE = 'explore-chunk';
/**
 * A chunk not finished within this long (a killed worker) is failed by the queue's maintenance and retried.
 * LW_CHUNK_EXPIRE_S and LW_QUEUE_MAINTENANCE_S (how often maintenance runs, 15 s) shorten both for the fault test.
 */
export const CHUNK_EXPIRE_S = Number(process.env.LW_CHUNK_EXPIRE_S || 120);
export const CHUNK_RETRIES = 5;
/** NOTIFY channel that wakes idle workers when chunks are queued (pg-boss would otherwise wait out its polling interval). */
export const JOBS_CHANNEL = 'explore_jobs';

/** Starts a pg-boss instance on `url` and makes sure the queue exists. `supervise`: run the queue's maintenance. */
export async function startQueue(url: string, { supervise = false, max = 2 }: { supervise?: boolean; max?: number } = {}): Promise<PgBoss> {
	const boss = new PgBoss({
		connectionString: url,
		max,
		application_name: 'linkwright-queue',
		supervise,
		schedule: false,
		maintenanceIntervalSeconds: Number(process.env.LW_QUEUE_MAINTENANCE_S || 15)
	});
	boss.on('error', (err) => console.error(`[queue] ${err.message}`));
	await boss.start();
	if (!(await boss.getQueue(EXPLORE_QUEUE))) {
		try {
			await boss.createQueue(EXPLORE_QUEUE, { name: EXPLORE_QUEUE, retryLimit: CHUNK_RETRIES, retryDelay: 1, expireInSeconds: CHUNK_EXPIRE_S });
		} catch (err) {
			// another process created it between the check and here
			if (!(await boss.getQueue(EXPLORE_QUEUE))) throw err;
		}
	}
	return boss;
}

/** Queues chunks 0 … chunks − 1 of an exploration, in one insert. */
export async function enqueueChunks(boss: PgBoss, explorationId: string, chunks: number, expireInSeconds = CHUNK_EXPIRE_S): Promise<void> {
	const jobs: PgBoss.JobInsert[] = [];
	for (let c = 0; c < chunks; c++) jobs.push({ name: EXPLORE_QUEUE, data: { explorationId, chunk: c }, retryLimit: CHUNK_RETRIES, retryDelay: 1, expireInSeconds });
	for (let i = 0; i < jobs.length; i += 1000) await boss.insert(jobs.slice(i, i + 1000));
	await boss.getDb().executeSql(`select pg_notify('${JOBS_CHANNEL}', '')`, []);
}

/** Queues chunks 0 … chunks − 1 of a large tolerance study on the same queue (the workers take both kinds). */
export async function enqueueToleranceChunks(boss: PgBoss, toleranceId: string, chunks: number, expireInSeconds = CHUNK_EXPIRE_S): Promise<void> {
	const jobs: PgBoss.JobInsert[] = [];
	for (let c = 0; c < chunks; c++) jobs.push({ name: EXPLORE_QUEUE, data: { toleranceId, chunk: c }, retryLimit: CHUNK_RETRIES, retryDelay: 1, expireInSeconds });
	for (let i = 0; i < jobs.length; i += 1000) await boss.insert(jobs.slice(i, i + 1000));
	await boss.getDb().executeSql(`select pg_notify('${JOBS_CHANNEL}', '')`, []);
}

/** A job of the queue: a chunk of an exploration, or of a large tolerance study. */
export type ChunkJob = { explorationId: string; chunk: number } | { toleranceId: string; chunk: number };
