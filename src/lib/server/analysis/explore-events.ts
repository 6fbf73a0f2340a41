// Exploration progress for server-sent events: one LISTEN per app process (the driver's listening connection),
// fanned out to the streams open on that process. Workers NOTIFY when they store a chunk (storeChunk).
import { client } from '$lib/server/db';
import { listenProgress } from '$lib/server/db/queries/explorations';
import { onShutdown } from '$lib/server/lifecycle';

const subscribers = new Map<string, Set<() => void>>();
let listening: Promise<() => Promise<void>> | null = null;

/** Calls `fn` whenever exploration `id` makes progress (or is cancelled); returns the unsubscribe. */
export async function onProgress(id: string, fn: () => void): Promise<() => void> {
	if (!listening) {
		listening = listenProgress(client, (payload) => subscribers.get(payload)?.forEach((f) => f()));
		listening.catch(() => (listening = null));
		onShutdown('exploration progress listener', async () => {
			const stop = await listening?.catch(() => null);
			await stop?.();
		});
	}
	await listening;
	const set = subscribers.get(id) ?? new Set();
	set.add(fn);
	subscribers.set(id, set);
	return () => {
		set.delete(fn);
		if (!set.size) subscribers.delete(id);
	};
}
