// Processing a scan after its upload: the original is streamed from the bucket into a worker thread
// (scan-worker.ts, bundled by scripts/worker-bundle.mjs), which parses and simplifies it; the preview goes back to
// the bucket and the figures to the row. A failure stores nothing: the original and any preview are deleted and the
// row says why ('failed'). One scan at a time per server process (the machine's cores are shared with the solver).
import { Worker } from 'node:worker_threads';
import code from 'virtual:lw-scan-worker';
import { db } from '$lib/server/db';
import { moveScan, sweepStaleScans } from '$lib/server/db/queries/scans';
import type { Scan } from '$lib/server/db/schema';
import type { ScanStats } from '$lib/mesh/simplify';
import { abortUpload, deleteObjects, getObjectStream, putObject, PART_URL_SECONDS } from './storage';

/** A scan still 'processing' after this long is failed by the sweeper (the worker's own limit is shorter). */
export const PROCESSING_SECONDS = 15 * 60;
/** The worker's limit for one scan (s): a 500 MB file parses in well under a minute here. */
const WORKER_SECONDS = 10 * 60;
/** Chunks posted to the worker and not yet parsed, at most. */
const IN_FLIGHT = 4;

interface Processed {
	stats: ScanStats;
	preview: Uint8Array;
	tiles: Uint8Array;
}

let queue: Promise<unknown> = Promise.resolve();

/** The preview's object key of a scan. */
export function previewKeyOf(scan: Pick<Scan, 'objectKey'>) {
	return `${scan.objectKey}.preview.lwpv`;
}

/** The object key of a scan's full-resolution points, binned for the fits (src/lib/mesh/tiles.ts). */
export function tilesKeyOf(scan: Pick<Scan, 'objectKey'>) {
	return `${scan.objectKey}.points.lwpt`;
}

/** Queues a scan's processing; resolves when it has finished (either way). */
export function processScan(scan: Scan): Promise<void> {
	const run = queue.then(() => processNow(scan));
	queue = run.catch(() => undefined);
	return run;
}

/** Streams the original into a worker; the figures and the preview's bytes, or a message. */
async function inWorker(scan: Scan): Promise<Processed | { error: string }> {
	const object = await getObjectStream(scan.objectKey);
	if (!object) return { error: 'the uploaded file is not in object storage any more' };
	const worker = new Worker(code, { eval: true });
	let acked = 0;
	let sent = 0;
	let wake: (() => void) | null = null;
	const outcome = new Promise<Processed | { error: string }>((resolve) => {
		const timer = setTimeout(() => resolve({ error: `processing took longer than ${WORKER_SECONDS / 60} minutes` }), WORKER_SECONDS * 1000);
		const settle = (v: Processed | { error: string }) => {
			clearTimeout(timer);
			resolve(v);
		};
		worker.on('message', (m: { type: string; stats?: ScanStats; preview?: Uint8Array; tiles?: Uint8Array; message?: string }) => {
			if (m.type === 'ack') {
				acked++;
				wake?.();
			} else if (m.type === 'done') settle({ stats: m.stats!, preview: m.preview!, tiles: m.tiles! });
			else if (m.type === 'failed') settle({ error: m.message! });
		});
		worker.on('error', (e) => settle({ error: `processing failed: ${e.message}` }));
		worker.on('exit', () => settle({ error: 'processing stopped unexpectedly' }));
	});
	let finished = false;
	void outcome.then(() => {
		finished = true;
		wake?.();
	});
	try {
		worker.postMessage({ type: 'start', format: scan.format, size: object.size });
		const reader = object.body.getReader();
		for (;;) {
			const { done, value } = await reader.read();
			if (done || finished) {
				if (!done) await reader.cancel();
				break;
			}
			worker.postMessage({ type: 'chunk', bytes: value }, [value.buffer as ArrayBuffer]);
			sent++;
			while (sent - acked > IN_FLIGHT && !finished) await new Promise<void>((r) => (wake = r));
		}
		if (!finished) worker.postMessage({ type: 'end' });
		return await outcome;
	} finally {
		await worker.terminate();
	}
}

async function processNow(scan: Scan) {
	let result: Awaited<ReturnType<typeof inWorker>>;
	try {
		result = await inWorker(scan);
	} catch (e) {
		result = { error: `processing failed: ${e instanceof Error ? e.message : String(e)}` };
	}
	if ('error' in result) return fail(scan, result.error);
	const previewKey = previewKeyOf(scan);
	try {
		await putObject(tilesKeyOf(scan), result.tiles, 'application/octet-stream');
		await putObject(previewKey, result.preview, 'application/octet-stream');
	} catch (e) {
		return fail(scan, `the preview could not be stored: ${e instanceof Error ? e.message : String(e)}`);
	}
	const row = await moveScan(db, scan.id, ['processing'], {
		status: 'ready',
		previewKey,
		stats: { ...result.stats, previewBytes: result.preview.length, pointsBytes: result.tiles.length } as unknown as Record<string, unknown>,
		unit: result.stats.unitGuess,
		error: null
	});
	// deleted (or swept) meanwhile: drop what this run stored
	if (!row) await deleteObjects([scan.objectKey, previewKey, tilesKeyOf(scan)]);
}

/** Marks the scan failed with a message and deletes its objects: nothing half-stored. */
async function fail(scan: Scan, message: string) {
	await deleteObjects([scan.objectKey, previewKeyOf(scan), tilesKeyOf(scan)]).catch(() => undefined);
	await moveScan(db, scan.id, ['processing'], { status: 'failed', error: message });
}

let lastSweep = 0;

/**
 * Fails scans stuck in 'uploading' (longer than the part URLs live) or 'processing', aborting their uploads and
 * deleting their objects. Runs at most once a minute; called when scans are listed or read.
 */
export async function sweepScans(force = false) {
	if (!force && Date.now() - lastSweep < 60_000) return;
	lastSweep = Date.now();
	const stale = await sweepStaleScans(db, PART_URL_SECONDS + 300, PROCESSING_SECONDS);
	for (const s of stale) {
		if (s.uploadId) await abortUpload(s.objectKey, s.uploadId).catch(() => undefined);
		await deleteObjects([s.objectKey, s.previewKey, previewKeyOf(s), tilesKeyOf(s)]).catch(() => undefined);
	}
}
