// One queue worker: takes exploration chunks from pg-boss, solves them with the study's evaluator (kept per
// exploration between chunks) and stores each chunk once. Used by scripts/worker.ts (one per thread), the bench and
// the tests; nothing of SvelteKit is imported, so it runs under plain Node (tsx).
import type PgBoss from 'pg-boss';
import { connect } from '../db/connect';
import { explorationForWorker, failExploration, storeChunk } from '../db/queries/explorations';
import { EXPLORE_MEASURES, exploreEvaluator, solveChunk, type ExploreSpec } from '../studies/explore';
import type { CornerEvaluator } from '../studies/evaluate';
import type { CornerInput } from '../kinematics/corner';
import { EXPLORE_QUEUE, startQueue, type ChunkJob } from './explore-queue';

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

	async function one(job: ChunkJob): Promise<void> {
		const study = await explorationForWorker(db, job.explorationId);
		if (!study || study.status !== 'queued') return; // cancelled, finished or gone: nothing to do
		let entry = evaluators.get(job.explorationId);
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
		const r = solveChunk(entry.ev, entry.spec, first, count);
		const wrote = await storeChunk(db, job.explorationId, job.chunk, first, r.ok, r.values, EXPLORE_MEASURES.length);
		if (wrote) written++;
		options.onChunk?.(job, wrote);
	}

	let workId = '';
	workId = await boss.work<ChunkJob>(EXPLORE_QUEUE, { batchSize: 1, pollingIntervalSeconds: options.pollSeconds ?? 0.5 }, async (jobs) => {
		for (const job of jobs) await one(job.data);
		// pg-boss waits out the polling interval after a job shorter than it; with work in hand, fetch again at once
		if (workId) boss.notifyWorker(workId);
	});
	return {
		written: () => written,
		async stop() {
			await boss.offWork({ id: workId });
			await boss.stop({ graceful: true, wait: true, timeout: 5000 });
			await client.end({ timeout: 1 });
		}
	};
}
