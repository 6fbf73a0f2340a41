// A large tolerance study (QUEUED_TOLERANCE_SAMPLES or more) through the job queue: its samples split into chunks on
// the same pg-boss queue as the explorations, solved by any worker (runSamples, as the fast path), stored once per
// chunk, and read back here in order once all are in. The request waits, reporting progress; a client that goes
// away cancels the run (the workers skip its remaining chunks) and it is deleted.
import { db } from '$lib/server/db';
import { cancelToleranceRun, createToleranceRun, deleteStaleToleranceRuns, deleteToleranceRun, toleranceChunksOf, toleranceRunOf } from '$lib/server/db/queries/tolerance-runs';
import { enqueueToleranceChunks } from '$lib/server/queue/explore-queue';
import { RunCancelled, type RunOutcome } from '$lib/server/studies/parallel';
import type { SampleBlock, ToleranceSpec } from '$lib/server/studies/tolerance';
import { queue } from './explore';

/** Samples per queued chunk (common practice, no source: about as long to solve as an exploration's chunk). */
export const TOLERANCE_CHUNK = 2000;
/** How often the request looks at the run's progress (ms). */
const POLL_MS = 100;

/** Runs `spec` through the queue for `revisionId`; the blocks come back in sample order. */
export function queuedTolerance(ids: { revisionId: string; userId: string }) {
	return async (spec: ToleranceSpec, signal: AbortSignal, onProgress: (done: number) => void): Promise<RunOutcome> => {
		const chunks = Math.ceil(spec.samples / TOLERANCE_CHUNK);
		const q = await queue();
		await deleteStaleToleranceRuns(db);
		const row = await createToleranceRun(db, { revisionId: ids.revisionId, spec: spec as unknown as Record<string, unknown>, samples: spec.samples, chunkSize: TOLERANCE_CHUNK, chunks, createdBy: ids.userId });
		try {
			await enqueueToleranceChunks(q, row.id, chunks);
			for (;;) {
				if (signal.aborted) {
					await cancelToleranceRun(db, row.id);
					throw new RunCancelled();
				}
				const state = await toleranceRunOf(db, row.id);
				if (!state) throw new Error('the queued tolerance study has gone');
				// every poll: the caller passes it on at least once a second, which is how a gone client is noticed
				onProgress(Math.min(spec.samples, state.chunksDone * TOLERANCE_CHUNK));
				if (state.status === 'failed') throw new Error(state.error ?? 'the queued tolerance study failed');
				if (state.status === 'cancelled') throw new RunCancelled();
				if (state.status === 'done') break;
				await new Promise((r) => setTimeout(r, POLL_MS));
			}
			const stored = await toleranceChunksOf(db, row.id);
			const n = stored[0] ? stored[0].values.length / Math.max(1, stored[0].ok.length * spec.measures.length) : 0;
			const blocks: SampleBlock[] = stored.map((c) => ({ start: c.chunk * TOLERANCE_CHUNK, end: c.chunk * TOLERANCE_CHUNK + c.ok.length, count: n, values: c.values, ok: c.ok }));
			return { blocks, threads: 0, fallback: null, queuedChunks: chunks };
		} finally {
			await deleteToleranceRun(db, row.id); // read (or abandoned): the samples are not kept
		}
	};
}
