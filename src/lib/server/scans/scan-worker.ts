// Worker-thread entry of scan processing: the main thread streams the original from the bucket into this thread
// chunk by chunk; this thread parses it (src/lib/mesh/parse.ts), counts, bounds, guesses the unit and simplifies
// a preview with meshoptimizer and bins every vertex at full resolution for the fits (src/lib/mesh/tiles.ts), then
// sends back the stats, the preview's bytes and the points' bytes. One scan per worker.
// Messages in: { type: 'start', format, size } · { type: 'chunk', bytes } · { type: 'end' };
// out: { type: 'ack' } per chunk, then { type: 'done', stats, preview, tiles } or { type: 'failed', message }.
import { parentPort } from 'node:worker_threads';
import { createParser, MeshParseError, type MeshFormat, type MeshParser } from '../../mesh/parse';
import { simplifyForPreview } from '../../mesh/simplify';
import { encodeTiles } from '../../mesh/tiles';

let parser: MeshParser | null = null;

function fail(e: unknown) {
	const message = e instanceof MeshParseError ? e.message : `processing failed: ${e instanceof Error ? e.message : String(e)}`;
	parentPort!.postMessage({ type: 'failed', message });
	parser = null;
}

parentPort?.on('message', async (msg: { type: 'start'; format: MeshFormat; size: number } | { type: 'chunk'; bytes: Uint8Array } | { type: 'end' }) => {
	try {
		if (msg.type === 'start') parser = createParser(msg.format, msg.size);
		else if (msg.type === 'chunk') {
			parser?.push(msg.bytes);
			// flow control: the main thread keeps only a few chunks in flight
			parentPort!.postMessage({ type: 'ack' });
		}
		else if (parser) {
			const mesh = parser.end();
			parser = null;
			const tiles = encodeTiles(mesh.positions);
			const { stats, preview } = await simplifyForPreview(mesh);
			parentPort!.postMessage({ type: 'done', stats, preview, tiles }, [preview.buffer as ArrayBuffer, tiles.buffer as ArrayBuffer]);
		}
	} catch (e) {
		fail(e);
	}
});
