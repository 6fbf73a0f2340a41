// Worker-thread entry of the tolerance study: solves one contiguous block of samples and sends it back.
// Bundled on its own (scripts/worker-bundle.mjs) so it runs the same in the built app, Vitest and the bench.
// Messages in: { spec, start, end }; out: { type: 'progress', done } and { type: 'done', block }.

import { parentPort } from 'node:worker_threads';
import { runSamples, type ToleranceSpec } from './tolerance';

/** Runs one request from the parent thread. */
function onRequest(msg: { spec: ToleranceSpec; start: number; end: number }): void {
	const port = parentPort!;
	const block = runSamples(msg.spec, msg.start, msg.end, (done) => port.postMessage({ type: 'progress', done }));
	port.postMessage({ type: 'done', block }, [block.values.buffer as ArrayBuffer, block.ok.buffer as ArrayBuffer]);
}

parentPort?.on('message', onRequest);
