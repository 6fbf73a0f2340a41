// Runs the tolerance study's samples on worker threads (node:worker_threads), or on this thread where no
// worker can start. The worker's code comes in as a bundled CommonJS text (started with `eval: true`), so
// the same code runs in the built app, in Vitest and in the bench, whatever the bundler did with files.

import { Worker } from 'node:worker_threads';
import { runSamples, splitRange, type SampleBlock, type ToleranceSpec } from './tolerance';

export interface RunOptions {
	/** worker threads to use (0 = this thread) */
	threads: number;
	/** the bundled worker entry (tolerance-worker.ts), or null to run here */
	workerCode: string | null;
	signal?: AbortSignal;
	/** samples done so far, across all threads */
	onProgress?: (done: number) => void;
}

export interface RunOutcome {
	blocks: SampleBlock[];
	/** threads used; 0 = this thread */
	threads: number;
	/** why the study ran on this thread, when it did although threads were asked for */
	fallback: string | null;
}

/** Thrown when the run was cancelled through its signal. */
export class RunCancelled extends Error {
	constructor() {
		super('cancelled');
	}
}

/** Solve all samples of `spec`, in parallel where workers can start. */
export async function runTolerance(spec: ToleranceSpec, options: RunOptions): Promise<RunOutcome> {
	if (options.signal?.aborted) throw new RunCancelled();
	if (options.threads > 0 && options.workerCode) {
		const started = startWorkers(options.workerCode, options.threads);
		if (Array.isArray(started)) return { blocks: await onWorkers(spec, started, options), threads: started.length, fallback: null };
		return { blocks: await onThisThread(spec, options), threads: 0, fallback: started };
	}
	return { blocks: await onThisThread(spec, options), threads: 0, fallback: options.threads > 0 ? 'no worker code was given' : null };
}

/** Start `n` workers, or say why they could not start. */
function startWorkers(code: string, n: number): Worker[] | string {
	const workers: Worker[] = [];
	try {
		for (let i = 0; i < n; i++) workers.push(new Worker(code, { eval: true }));
		return workers;
	} catch (e) {
		for (const w of workers) void w.terminate();
		return `worker threads could not start: ${(e as Error).message}`;
	}
}

/** Hand one block to each worker; resolve with the blocks in order, terminate all on abort or error. */
function onWorkers(spec: ToleranceSpec, workers: Worker[], options: RunOptions): Promise<SampleBlock[]> {
	const ranges = splitRange(spec.samples, workers.length);
	const done = ranges.map(() => 0);
	const blocks: (SampleBlock | null)[] = ranges.map(() => null);
	return new Promise((resolve, reject) => {
		const stop = (e: Error) => {
			for (const w of workers) void w.terminate();
			options.signal?.removeEventListener('abort', onAbort);
			reject(e);
		};
		const onAbort = () => stop(new RunCancelled());
		options.signal?.addEventListener('abort', onAbort, { once: true });
		ranges.forEach(([start, end], i) => {
			const w = workers[i];
			w.on('message', (m: { type: 'progress'; done: number } | { type: 'done'; block: SampleBlock }) => {
				if (m.type === 'progress') {
					done[i] = m.done;
					options.onProgress?.(done.reduce((a, b) => a + b, 0));
					return;
				}
				blocks[i] = m.block;
				done[i] = end - start;
				void w.terminate();
				if (blocks.every((b) => b)) {
					options.signal?.removeEventListener('abort', onAbort);
					options.onProgress?.(spec.samples);
					resolve(blocks as SampleBlock[]);
				}
			});
			w.on('error', (e) => stop(e));
			w.postMessage({ spec, start, end });
		});
		for (const w of workers.slice(ranges.length)) void w.terminate();
	});
}

/** Samples per slice on this thread, between which progress is reported and a cancel is noticed. */
const SLICE = 100;

/** Solve all samples here in slices, yielding to the event loop between them. */
async function onThisThread(spec: ToleranceSpec, options: RunOptions): Promise<SampleBlock[]> {
	const blocks: SampleBlock[] = [];
	for (let s = 0; s < spec.samples; s += SLICE) {
		if (options.signal?.aborted) throw new RunCancelled();
		blocks.push(runSamples(spec, s, Math.min(spec.samples, s + SLICE)));
		options.onProgress?.(Math.min(spec.samples, s + SLICE));
		await new Promise((r) => setImmediate(r));
	}
	return blocks;
}
