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
	/** chunks the job queue's workers solved (a large study; absent: none) */
	queuedChunks?: number;
}

/** Thrown when the run was cancelled through its signal. */
export class RunCancelled extends Error {
	constructor() {
		super('cancelled');
	}
}

/**
 * Idle workers by code, kept between studies so their compiled (JIT-warm) solver is reused: a started worker
 * is cold and runs its first thousands of sweeps several times slower. They hold no data between jobs, so this
 * is no state of the server's (any instance can run any study); idle ones are unref'd and never keep a process up.
 */
const idle = new Map<string, Worker[]>();
/** At most this many idle workers are kept per code. */
const KEEP_IDLE = 4;

/** Hand a finished worker back to the idle list (or end it when the list is full). */
function release(code: string, w: Worker): void {
	w.removeAllListeners('message');
	w.removeAllListeners('error');
	const list = idle.get(code) ?? [];
	if (list.length >= KEEP_IDLE) return void w.terminate();
	w.unref();
	list.push(w);
	idle.set(code, list);
}

/** End the idle workers (tests and the bench use it to measure cold starts). */
export async function endIdleWorkers(): Promise<void> {
	const all = [...idle.values()].flat();
	idle.clear();
	await Promise.all(all.map((w) => w.terminate()));
}

/** Solve all samples of `spec`, in parallel where workers can start. */
export async function runTolerance(spec: ToleranceSpec, options: RunOptions): Promise<RunOutcome> {
	if (options.signal?.aborted) throw new RunCancelled();
	if (options.threads > 0 && options.workerCode) {
		const started = startWorkers(options.workerCode, options.threads);
		if (Array.isArray(started)) return { blocks: await onWorkers(spec, started, options.workerCode, options), threads: started.length, fallback: null };
		return { blocks: await onThisThread(spec, options), threads: 0, fallback: started };
	}
	return { blocks: await onThisThread(spec, options), threads: 0, fallback: options.threads > 0 ? 'no worker code was given' : null };
}

/** Take `n` workers (idle ones first, else new), or say why they could not start. */
function startWorkers(code: string, n: number): Worker[] | string {
	const workers: Worker[] = [];
	const list = idle.get(code) ?? [];
	try {
		while (workers.length < n && list.length) {
			const w = list.pop()!;
			if (w.threadId === -1) continue; // it has exited meanwhile
			w.ref();
			workers.push(w);
		}
		while (workers.length < n) workers.push(new Worker(code, { eval: true }));
		return workers;
	} catch (e) {
		for (const w of workers) void w.terminate();
		return `worker threads could not start: ${(e as Error).message}`;
	}
}

/** Hand one block to each worker; resolve with the blocks in order, terminate all on abort or error. */
function onWorkers(spec: ToleranceSpec, workers: Worker[], code: string, options: RunOptions): Promise<SampleBlock[]> {
	const ranges = splitRange(spec.samples, workers.length);
	const done = ranges.map(() => 0);
	const blocks: (SampleBlock | null)[] = ranges.map(() => null);
	return new Promise((resolve, reject) => {
		const stop = (e: Error) => {
			// end the workers still busy (finished ones are back in the idle list, unharmed)
			workers.forEach((w, i) => i < ranges.length && !blocks[i] && void w.terminate());
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
				release(code, w);
				if (blocks.every((b) => b)) {
					options.signal?.removeEventListener('abort', onAbort);
					options.onProgress?.(spec.samples);
					resolve(blocks as SampleBlock[]);
				}
			});
			w.on('error', (e) => stop(e));
			w.postMessage({ spec, start, end });
		});
		for (const w of workers.slice(ranges.length)) release(code, w);
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
