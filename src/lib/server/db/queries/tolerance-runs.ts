// Large tolerance studies through the job queue: the run's row, and each chunk's solved samples (written once).
import { and, asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../connect';
import { toleranceChunks, toleranceRuns } from '../schema';

export interface NewToleranceRun {
	revisionId: string;
	spec: Record<string, unknown>;
	samples: number;
	chunkSize: number;
	chunks: number;
	createdBy: string;
}

/**
 * Deletes runs older than `hours` (their request died with its server before it could delete them; a run is read
 * within minutes). Their chunks still queued are then skipped by the workers.
 */
export async function deleteStaleToleranceRuns(db: Database, hours = 1) {
	await db.execute(sql`delete from tolerance_runs where created_at < now() - make_interval(hours => ${hours})`);
}

export async function createToleranceRun(db: Database, r: NewToleranceRun) {
	const [row] = await db.insert(toleranceRuns).values(r).returning();
	return row;
}

/** Removes a run and its chunks (read, cancelled, or its jobs could not be queued). */
export async function deleteToleranceRun(db: Database, id: string) {
	await db.delete(toleranceRuns).where(eq(toleranceRuns.id, id));
}

/** Marks a queued run cancelled (its remaining chunks are skipped by the workers). */
export async function cancelToleranceRun(db: Database, id: string) {
	await db.update(toleranceRuns).set({ status: 'cancelled' }).where(and(eq(toleranceRuns.id, id), eq(toleranceRuns.status, 'queued')));
}

/** Marks a run failed with a reason. */
export async function failToleranceRun(db: Database, id: string, error: string) {
	await db.update(toleranceRuns).set({ status: 'failed', error }).where(and(eq(toleranceRuns.id, id), eq(toleranceRuns.status, 'queued')));
}

/** The run's state; with `full` its spec too (workers). */
export async function toleranceRunOf(db: Database, id: string, full = false) {
	const [row] = await db
		.select({ status: toleranceRuns.status, error: toleranceRuns.error, chunks: toleranceRuns.chunks, chunksDone: toleranceRuns.chunksDone, chunkSize: toleranceRuns.chunkSize, samples: toleranceRuns.samples, ...(full ? { spec: toleranceRuns.spec } : {}) })
		.from(toleranceRuns)
		.where(eq(toleranceRuns.id, id));
	return (row as typeof row & { spec?: Record<string, unknown> }) ?? null;
}

/**
 * Stores one solved chunk in one transaction: its row (keyed by run + chunk; a chunk solved twice adds nothing the
 * second time), then the run's counter, which marks it done at the last chunk. True when this call wrote it.
 */
export async function storeToleranceChunk(db: Database, id: string, chunk: number, ok: Uint8Array, values: Float64Array) {
	return db.transaction(async (tx) => {
		const inserted = await tx
			.insert(toleranceChunks)
			.values({ runId: id, chunk, ok: Buffer.from(ok.buffer, ok.byteOffset, ok.byteLength), values: Buffer.from(values.buffer, values.byteOffset, values.byteLength) })
			.onConflictDoNothing()
			.returning({ chunk: toleranceChunks.chunk });
		if (inserted.length === 0) return false;
		await tx.execute(sql`update tolerance_runs set chunks_done = chunks_done + 1,
				status = case when status = 'queued' and chunks_done + 1 >= chunks then 'done' else status end
			where id = ${id}::uuid`);
		return true;
	});
}

/** The run's chunks in order: ok flags and values as the engine's typed arrays (float64 as written). */
export async function toleranceChunksOf(db: Database, id: string) {
	const rows = await db.select().from(toleranceChunks).where(eq(toleranceChunks.runId, id)).orderBy(asc(toleranceChunks.chunk));
	return rows.map((r) => {
		// copied into aligned buffers (a Buffer from the driver may sit at any offset of a shared pool)
		const values = new Float64Array(r.values.byteLength / 8);
		new Uint8Array(values.buffer).set(r.values);
		return { chunk: r.chunk, ok: new Uint8Array(r.ok), values };
	});
}
