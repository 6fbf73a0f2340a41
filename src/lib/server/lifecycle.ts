// Graceful shutdown of the built app. On SIGTERM or SIGINT the server entry (scripts/serve.mjs, as adapter-node's
// build/index.js) stops accepting, lets the requests in flight finish (SHUTDOWN_TIMEOUT s, which `npm start` sets to
// 3) and then emits `sveltekit:shutdown`;
// here the registered steps run (last registered first: flush what is batched, then close the pool), so nothing
// holds the event loop and the process exits. Whatever still runs 5 s after the signal is ended by a backstop.
import { building, dev } from '$app/environment';

type Step = () => unknown;

const steps: { name: string; run: Step }[] = [];
/** The whole shutdown's limit (ms), signal to exit (issue 15). */
export const SHUTDOWN_LIMIT_MS = 5000;

/** Registers a step to run at shutdown (e.g. flush counters, close a pool); name is for the log. */
export function onShutdown(name: string, run: Step) {
	steps.push({ name, run });
}

/** Runs every step, newest first, each awaited; a failing step is logged and the others still run. */
export async function runShutdown() {
	for (const { name, run } of steps.splice(0).reverse()) {
		try {
			await run();
		} catch (e) {
			console.error(`[shutdown] ${name}:`, e instanceof Error ? e.message : e);
		}
	}
}

let installed = false;

/** Hooks the steps to adapter-node's shutdown, once, in the built server only (not in dev or while building). */
export function installShutdown() {
	if (installed || dev || building) return;
	installed = true;
	process.once('sveltekit:shutdown', () => void runShutdown());
	// started by `npm start` on an IPC channel: when that parent dies, even by kill -9, the channel closes; shut down
	// as on SIGTERM instead of serving on as an orphan
	if (process.send) {
		process.channel?.unref();
		process.once('disconnect', () => process.kill(process.pid, 'SIGTERM'));
	}
	for (const signal of ['SIGTERM', 'SIGINT'] as const) {
		process.once(signal, () => {
			const backstop = setTimeout(() => {
				console.error(`[shutdown] still running ${SHUTDOWN_LIMIT_MS / 1000} s after ${signal}; exiting`);
				process.exit(1);
			}, SHUTDOWN_LIMIT_MS);
			backstop.unref();
		});
	}
}
