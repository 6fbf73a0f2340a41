import { explorationView } from '$lib/server/analysis/explore';
import { onProgress } from '$lib/server/analysis/explore-events';
import { endpoint } from '$lib/server/api';
import { requireExploration } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Progress as server-sent events: the exploration now, then again after each stored chunk (LISTEN/NOTIFY), ending
// when it is no longer running. A comment every 15 s keeps proxies from closing a quiet stream.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	const id = exploration.id;
	const encoder = new TextEncoder();
	let stop = () => {};
	let closed = false;
	let keepAlive: ReturnType<typeof setInterval> | undefined;
	const stream = new ReadableStream<Uint8Array>({
		async start(controller) {
			let sending = false;
			let again = false;
			const close = () => {
				if (closed) return;
				closed = true;
				stop();
				clearInterval(keepAlive);
				controller.close();
			};
			const send = async () => {
				if (sending) return void (again = true);
				sending = true;
				try {
					do {
						again = false;
						const { exploration: row } = await requireExploration(event, id, 'view');
						const view = await explorationView(row);
						if (closed) return;
						controller.enqueue(encoder.encode(`event: progress\ndata: ${JSON.stringify(view)}\n\n`));
						if (view.status !== 'queued') return close();
					} while (again);
				} catch {
					close();
				} finally {
					sending = false;
				}
			};
			keepAlive = setInterval(() => !closed && controller.enqueue(encoder.encode(': keep-alive\n\n')), 15_000);
			stop = await onProgress(id, () => void send());
			await send();
		},
		cancel() {
			closed = true;
			clearInterval(keepAlive);
			stop();
		}
	});
	return new Response(stream, { headers: { 'content-type': 'text/event-stream', 'cache-control': 'no-store', 'x-accel-buffering': 'no' } });
});
