import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { QUEUED_TOLERANCE_SAMPLES, toleranceStudyInput } from '$lib/schemas/analysis';
import { queuedTolerance } from '$lib/server/analysis/tolerance-queue';
import { runToleranceStudy, toleranceSpec } from '$lib/server/analysis/run';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { db } from '$lib/server/db';
import { saveStudyResults } from '$lib/server/db/queries/studies';
import { RunCancelled } from '$lib/server/studies/parallel';
import { can, requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

/**
 * Tolerance study, streamed as NDJSON: {"type":"progress","done","total"} lines, then one {"type":"result",
 * "result", "studyId"} (or {"type":"error","error"}). Validation and permissions answer before the stream starts
 * (JSON errors). A client that goes away (an aborted fetch) cancels the stream, which terminates the worker
 * threads (or cancels the queued run); nothing is stored then. From QUEUED_TOLERANCE_SAMPLES samples on, the study's
 * chunks go to the job queue (analysis/tolerance-queue.ts) and this request waits for the workers.
 */
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision, corner, role } = await requireRevision(event, event.params.revisionId, 'view');
	const input = await parseBody(event, toleranceStudyInput);
	if (input.study && !can(role, 'edit')) await requireRevision(event, revision.id, 'edit');
	const spec = toleranceSpec(parseWith(cornerGeometrySchema, revision.geometry), input);
	const userId = event.locals.user!.id;
	// Cancelled when the client goes away: the response stream is cancelled (and the request's signal, where it fires).
	const cancel = new AbortController();
	event.request.signal.addEventListener('abort', () => cancel.abort(), { once: true });
	const signal = cancel.signal;
	const encoder = new TextEncoder();
	const stream = new ReadableStream<Uint8Array>({
		async start(controller) {
			const send = (o: unknown) => {
				if (!signal.aborted) controller.enqueue(encoder.encode(JSON.stringify(o) + '\n'));
			};
			let last = 0;
			let sentAt = 0;
			try {
				// a large study goes through the job queue's workers (the same samples, so the same result)
				const queued = spec.samples >= QUEUED_TOLERANCE_SAMPLES ? queuedTolerance({ revisionId: revision.id, userId }) : undefined;
				const result = await runToleranceStudy(
					spec,
					input,
					signal,
					(done) => {
						// at least once a second: the headers go out with the first line, and a client that has gone away is
						// noticed at a write (a queued study may wait for its workers without new samples for a while)
						const now = Date.now();
						if (sentAt && done - last < spec.samples / 50 && done !== spec.samples && now - sentAt < 1000) return;
						send({ type: 'progress', done, total: spec.samples });
						last = done;
						sentAt = now;
					},
					queued
				);
				let studyId: string | null = null;
				if (input.study && !signal.aborted) {
					const { study, ...settings } = input;
					const row = await saveStudyResults(db, corner.id, userId, study, { sweep: 'heave', ...settings.travel, rack: 0, overlays: [], tolerance: { revisionId: revision.id, ...settings } }, { tolerance: { revisionId: revision.id, at: new Date().toISOString(), ...result } });
					studyId = row.id;
				}
				send({ type: 'result', result, studyId });
			} catch (e) {
				if (!(e instanceof RunCancelled)) send({ type: 'error', error: { code: 'error', message: (e as Error).message } });
			} finally {
				try {
					controller.close();
				} catch {
					// the client went away
				}
			}
		},
		cancel() {
			cancel.abort();
		}
	});
	return new Response(stream, { headers: { 'content-type': 'application/x-ndjson', 'cache-control': 'no-store' } });
});
