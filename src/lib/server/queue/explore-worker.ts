// One queue worker: takes exploration chunks from pg-boss, solves them with the study's evaluator (kept per
// exploration between chunks) and stores each chunk once. Used by scripts/worker.ts (one per thread), the bench and
// the tests; nothing of SvelteKit is imported, so it runs under plain Node (tsx).
import type PgBoss from 'pg-boss';
import { connect } from '../db/connect';
import { explorationForWorker, failExploration, storeChunk } from '../db/queries/explorations';
import { EXPLORE_MEASURES, exploreEvaluator, solveChunk, type ExploreSpec } from '../studies/explore';
import type { CornerEvaluator } from '../studies/evaluate';
import type { CornerInput } from '../kinematics/corner';
import { failToleranceRun, storeToleranceChunk, toleranceRunOf } from '../db/queries/tolerance-runs';
import { runSamples, type ToleranceSpec } from '../studies/tolerance';
import { EXPLORE_QUEUE, JOBS_CHANNEL, startQueue, type ChunkJob } from './explore-queue';

export interface WorkerHandle {
	/** chunks this worker wrote (a chunk found already written is not counted) */
	readonly written: () => number;
	stop(): Promise<void>;
}

export interface WorkerOptions {
	/** run the queue's maintenance (expired jobs back to retry) from this worker */
	supervise?: boolean;
	/** seconds between polls when the queue is empty (pg-boss's minimum is 0.5) */
	pollSeconds?: number;
	onChunk?: (job: ChunkJob, wrote: boolean) => void;
}

/** Starts a worker on the database at `url`. */
export async function runExploreWorker(url: string, options: WorkerOptions = {}): Promise<WorkerHandle> {
	// The chunks' writes commit without waiting for their WAL to reach the disk (a third off a chunk's write on this
	// machine). Safe here: the job is completed afterwards through pg-boss's own pool with a synchronous commit, and
	// flushing WAL up to that commit flushes the chunk's earlier commit too; a crash before it leaves the job active,
	// so the chunk is retried (and found stored, or solved again).
	const { db, client } = connect(url, 2, { asyncCommit: true });
	const boss: PgBoss = await startQueue(url, { supervise: options.supervise ?? true });
	const evaluators = new Map<string, { spec: ExploreSpec; ev: CornerEvaluator }>();
	let written = 0;

	let lastEnd = performance.now();
	async function one(job: ChunkJob): Promise<void> {
		if ('toleranceId' in job) return toleranceChunk(job);
		const t0 = performance.now();
		let entry = evaluators.get(job.explorationId);
		// the study's state every chunk (cancelled, finished or gone: nothing to do); its geometry only the first time
		const study = await explorationForWorker(db, job.explorationId, !entry);
		if (!study || study.status !== 'queued') return;
		if (!entry) {
			const spec = study.spec as unknown as ExploreSpec;
			try {
				entry = { spec, ev: exploreEvaluator(study.geometry as unknown as CornerInput, spec) };
			} catch (err) {
				await failExploration(db, job.explorationId, (err as Error).message);
				return;
			}
			if (evaluators.size >= 4) evaluators.delete(evaluators.keys().next().value!);
			evaluators.set(job.explorationId, entry);
		}
		const first = job.chunk * study.chunkSize;
		const count = Math.min(study.chunkSize, study.variants - first);
		if (count <= 0) return;
		const t1 = performance.now();
		const r = solveChunk(entry.ev, entry.spec, first, count);
		const t2 = performance.now();
		const wrote = await storeChunk(db, job.explorationId, job.chunk, first, { ok: r.ok, values: r.values, measures: EXPLORE_MEASURES.length, clear: r.clear });
		if (process.env.LW_WORKER_TIMING) console.error(`[timing] pid ${process.pid} chunk ${job.chunk} load ${(t1 - t0).toFixed(1)} solve ${(t2 - t1).toFixed(1)} store ${(performance.now() - t2).toFixed(1)} gap ${(t0 - lastEnd).toFixed(1)}`);
		lastEnd = performance.now();
		if (wrote) written++;
		options.onChunk?.(job, wrote);
	}

	/** A chunk of a large tolerance study: its samples solved exactly as the study's fast path does (runSamples). */
	async function toleranceChunk(job: { toleranceId: string; chunk: number }): Promise<void> {
		const run = await toleranceRunOf(db, job.toleranceId, true);
		if (!run || run.status !== 'queued') return;
		const start = job.chunk * run.chunkSize;
		const end = Math.min(run.samples, start + run.chunkSize);
		if (end <= start) return;
		let block;
		try {
			block = runSamples(run.spec as unknown as ToleranceSpec, start, end);
		} catch (err) {
			await failToleranceRun(db, job.toleranceId, (err as Error).message);
			return;
		}
		const wrote = await storeToleranceChunk(db, job.toleranceId, job.chunk, block.ok, block.values);
		if (wrote) written++;
		options.onChunk?.(job, wrote);
	}

	// The worker's own loop over pg-boss's fetch / complete / fail (not boss.work, which completes a job without
	// awaiting it: with the database gone, that rejection is unhandled and ends the process). A job is fetched again
	// at once after one is done; an empty queue waits up to the polling interval, or less when chunks are queued
	// (enqueueChunks NOTIFYs; the driver's listening connection reconnects by itself after a database restart).
	// A database error waits a second and tries again; a job whose completion was lost expires and is retried, and
	// its chunk is found already stored.
	const pollMs = (options.pollSeconds ?? 0.5) * 1000;
	let stopping = false;
	let wake: (() => void) | null = null;
	const nap = (ms: number) =>
		new Promise<void>((r) => {
			const t = setTimeout(() => ((wake = null), r()), ms);
			wake = () => (clearTimeout(t), (wake = null), r());
		});
	const loop = (async () => {
		while (!stopping) {
			let jobs: PgBoss.Job<ChunkJob>[];
			try {
				jobs = await boss.fetch<ChunkJob>(EXPLORE_QUEUE, { batchSize: 1 });
			} catch (err) {
				console.error(`[queue] fetch: ${(err as Error).message}`);
				await nap(1000);
				continue;
			}
			if (!jobs?.length) {
				await nap(pollMs);
				continue;
			}
			for (const job of jobs) {
				try {
					await one(job.data);
					await boss.complete(EXPLORE_QUEUE, job.id);
				} catch (err) {
					console.error(`[queue] chunk ${job.data.chunk}: ${(err as Error).message}`);
					await boss.fail(EXPLORE_QUEUE, job.id, { message: (err as Error).message }).catch(() => {});
					await nap(1000);
				}
			}
		}
	})();
	const listening = await client.listen(JOBS_CHANNEL, () => wake?.());
	return {
		written: () => written,
		async stop() {
			stopping = true;
			wake?.();
			await loop;
			await listening.unlisten().catch(() => {});
			await boss.stop({ graceful: true, wait: true, timeout: 5000 });
			await client.end({ timeout: 1 });
		}
	};
}
