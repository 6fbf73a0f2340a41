// Frame: ISO 8855 vehicle axes; lengths in mm. Figures only, never asserted.
// Design-space exploration through the queue (pg-boss in the test database): variants per second with one and with
// two worker processes (`scripts/worker.ts`, one thread each), the solve alone in this process for comparison, and
// the queue's overhead per chunk (many chunks of ten variants, minus their solve time) and the write of one chunk.
// LW_BENCH_EXPLORE_VARIANTS sets the study size (default 20,000 variants × 41 positions).
import { spawn, type ChildProcess } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { and, eq } from 'drizzle-orm';
import { databaseUrl, testDatabase } from '../scripts/db.mjs';
import { connect } from '../src/lib/server/db/connect';
import { createExploration, storeChunk } from '../src/lib/server/db/queries/explorations';
import { explorations, revisions } from '../src/lib/server/db/schema';
import type { CornerInput } from '../src/lib/server/kinematics/corner';
import { enqueueChunks, startQueue } from '../src/lib/server/queue/explore-queue';
import { DEFAULT_CHUNK, EXPLORE_MEASURES, exploreEvaluator, solveChunk, type ExploreSpec } from '../src/lib/server/studies/explore';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const CORNER = '00000000-0000-4000-8000-0000000000f1';

export async function run(): Promise<void> {
	const url = databaseUrl(testDatabase) as string;
	const { db, client } = connect(url, 3);
	const [rev] = await db.select().from(revisions).where(and(eq(revisions.cornerId, CORNER), eq(revisions.number, 2)));
	const variants = Number(process.env.LW_BENCH_EXPLORE_VARIANTS ?? 20_000);
	const spec = (n: number): ExploreSpec => ({
		plan: 'lhs',
		coords: [
			{ point: 'steer.inner', axis: 2, from: -25, to: 5 },
			{ point: 'steer.outer', axis: 2, from: -15, to: 15 },
			{ point: 'steer.inner', axis: 1, from: -5, to: 5 }
		],
		variants: n,
		levels: 5,
		seed: 3,
		grid: { from: -40, to: 40, step: 2 }
	});
	const boss = await startQueue(url);

	async function study(n: number, chunkSize = DEFAULT_CHUNK): Promise<string> {
		const chunks = Math.ceil(n / chunkSize);
		const row = await createExploration(db, { cornerId: CORNER, revisionId: rev.id, spec: spec(n) as unknown as Record<string, unknown>, variants: n, chunkSize, chunks, createdBy: rev.authorId! });
		await enqueueChunks(boss, row.id, chunks);
		return row.id;
	}
	async function until(id: string): Promise<void> {
		for (;;) {
			const [r] = await db.select({ status: explorations.status }).from(explorations).where(eq(explorations.id, id));
			if (r.status !== 'queued') return;
			await new Promise((res) => setTimeout(res, 50));
		}
	}
	function workers(n: number): ChildProcess[] {
		return Array.from({ length: n }, () =>
			spawn(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), 'scripts/worker.ts'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: url, LW_WORKER_THREADS: '1' }, stdio: process.env.LW_WORKER_TIMING ? 'inherit' : 'ignore' })
		);
	}
	async function stop(ws: ChildProcess[]) {
		await Promise.all(ws.map((w) => new Promise((res) => (w.once('exit', res), w.kill('SIGTERM')))));
	}

	// The solve alone, in this process, warm.
	const ev = exploreEvaluator(rev.geometry as unknown as CornerInput, spec(variants));
	solveChunk(ev, spec(variants), 0, 500);
	let t = performance.now();
	const alone = Math.min(variants, 4000);
	solveChunk(ev, spec(variants), 0, alone);
	const solveMs = (performance.now() - t) / alone;
	console.log(`solve alone (this process, warm): ${(1000 / solveMs).toFixed(0)} variants/s = ${((41 * 1000) / solveMs / 1e6).toFixed(2)} M positions/s`);

	// One chunk's write (2,000 rows through unnest, and the chunk's row), on a study of its own.
	const w = await createExploration(db, { cornerId: CORNER, revisionId: rev.id, spec: spec(DEFAULT_CHUNK) as unknown as Record<string, unknown>, variants: DEFAULT_CHUNK, chunkSize: DEFAULT_CHUNK, chunks: 1, createdBy: rev.authorId! });
	const r = solveChunk(ev, spec(DEFAULT_CHUNK), 0, DEFAULT_CHUNK);
	// as a worker writes it: one statement, synchronous_commit off (explore-worker.ts); the median of 5 chunks
	const writer = connect(url, 1, { asyncCommit: true });
	const w5 = await createExploration(db, { cornerId: CORNER, revisionId: rev.id, spec: spec(DEFAULT_CHUNK) as unknown as Record<string, unknown>, variants: 5 * DEFAULT_CHUNK, chunkSize: DEFAULT_CHUNK, chunks: 5, createdBy: rev.authorId! });
	await storeChunk(writer.db, w.id, 0, 0, { ok: r.ok, values: r.values, measures: EXPLORE_MEASURES.length, clear: r.clear });
	const writes: number[] = [];
	for (let c = 0; c < 5; c++) {
		t = performance.now();
		await storeChunk(writer.db, w5.id, c, c * DEFAULT_CHUNK, { ok: r.ok, values: r.values, measures: EXPLORE_MEASURES.length, clear: r.clear });
		writes.push(performance.now() - t);
	}
	await writer.client.end();
	console.log(`store one chunk of ${DEFAULT_CHUNK} variants (one statement, as a worker writes it): median ${writes.sort((a, b) => a - b)[2].toFixed(1)} ms`);

	for (const n of (process.env.LW_BENCH_EXPLORE_WORKERS ?? '1,2').split(',').map(Number)) {
		const ws = workers(n);
		// warm-up: a small study (process start, JIT), not timed
		await until(await study(n * 2 * DEFAULT_CHUNK));
		t = performance.now();
		const id = await study(variants);
		await until(id);
		const s = (performance.now() - t) / 1000;
		console.log(`${n} worker process${n > 1 ? 'es' : ''}: ${variants.toLocaleString('en')} variants × 41 positions in ${s.toFixed(2)} s = ${(variants / s).toFixed(0)} variants/s (${Math.ceil(variants / DEFAULT_CHUNK)} chunks)`);
		if (n === 1) {
			// the queue's overhead per chunk: 200 chunks of 10 variants, less their solve time
			const small = 2000;
			t = performance.now();
			await until(await study(small, 10));
			const total = performance.now() - t;
			console.log(`queue overhead per chunk (1 worker, 200 chunks of 10 variants): ${((total - small * solveMs) / 200).toFixed(1)} ms (fetch, load, write, complete)`);
		}
		await stop(ws);
	}
	console.log(`load average (1 min) at the end: ${os.loadavg()[0].toFixed(2)} on ${os.availableParallelism()} cores (other work on the machine slows every figure)`);
	await boss.stop({ graceful: false, wait: true });
	await client.end();
}
