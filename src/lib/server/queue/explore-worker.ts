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
	const { db, client } = connect(url, 2);
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

	let workId = '';
	workId = await boss.work<ChunkJob>(EXPLORE_QUEUE, { batchSize: 1, pollingIntervalSeconds: options.pollSeconds ?? 0.5 }, async (jobs) => {
		for (const job of jobs) await one(job.data);
		// pg-boss waits out the polling interval after a job shorter than it; with work in hand, fetch again at once
		if (workId) boss.notifyWorker(workId);
	});
	// Woken at once when chunks are queued (enqueueChunks notifies), instead of at the next poll. The driver's
	// listening connection reconnects by itself after the database restarts; the poll covers the gap.
	const listening = await client.listen(JOBS_CHANNEL, () => boss.notifyWorker(workId));
	return {
		written: () => written,
		async stop() {
			await listening.unlisten().catch(() => {});
			await boss.offWork({ id: workId });
			await boss.stop({ graceful: true, wait: true, timeout: 5000 });
			await client.end({ timeout: 1 });
		}
	};
}
