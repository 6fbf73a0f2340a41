// Frame: ISO 8855 vehicle axes; lengths in mm.
// The database restarting during an exploration: the test's own PostgreSQL (scripts/db.mjs, this checkout's cluster)
// is stopped and started again while two queue workers run. The workers reconnect (the driver's pools and the
// listening connection by themselves; a chunk caught mid-write is retried once its job expires), and the study
// completes with every row equal to an uninterrupted solve: none lost, none twice.
import { asc, eq } from 'drizzle-orm';
import { afterAll, expect, test } from 'vitest';
import { databaseUrl, start, stop, testDatabase } from '../../scripts/db.mjs';
import { createExploration } from '../../src/lib/server/db/queries/explorations';
import { explorations, explorationVariants, revisions } from '../../src/lib/server/db/schema';
import { enqueueChunks, startQueue } from '../../src/lib/server/queue/explore-queue';
import { runExploreWorker } from '../../src/lib/server/queue/explore-worker';
import { EXPLORE_MEASURES, exploreEvaluator, solveChunk, type ExploreSpec } from '../../src/lib/server/studies/explore';
import { closeDb, testDb } from './helpers';

const CORNER = '00000000-0000-4000-8000-0000000000f1';
const URL = process.env.TEST_DATABASE_URL ?? (databaseUrl(testDatabase) as string);
afterAll(closeDb);

/** Retries a read while the database is down or starting. */
async function settled<T>(read: () => Promise<T>): Promise<T> {
	for (let t = 0; ; t++) {
		try {
			return await read();
		} catch (e) {
			if (t > 100) throw e;
			await new Promise((r) => setTimeout(r, 200));
		}
	}
}
const state = (id: string) => settled(async () => (await testDb().select({ status: explorations.status, done: explorations.chunksDone }).from(explorations).where(eq(explorations.id, id)))[0]);

test('PostgreSQL stopped and started mid-run: the workers reconnect and the study completes with identical rows', async () => {
	// a 2 s expiry and maintenance every second, so a chunk cut off by the restart comes back within seconds
	process.env.LW_QUEUE_MAINTENANCE_S = '1';
	const [rev] = await testDb().select().from(revisions).where(eq(revisions.cornerId, CORNER)).orderBy(asc(revisions.number)).limit(1);
	const spec: ExploreSpec = {
		plan: 'lhs',
		coords: [
			{ point: 'steer.inner', axis: 2, from: -10, to: 10 },
			{ point: 'steer.outer', axis: 2, from: -10, to: 10 }
		],
		variants: 16_000,
		levels: 5,
		seed: 9,
		grid: { from: -40, to: 40, step: 2 },
		measures: ['toe_rms', 'camber_gain', 'rc_migration']
	};
	const row = await createExploration(testDb(), { cornerId: CORNER, revisionId: rev.id, spec: spec as unknown as Record<string, unknown>, variants: 16_000, chunkSize: 1000, chunks: 16, createdBy: rev.authorId! });
	const boss = await startQueue(URL);
	await enqueueChunks(boss, row.id, 16, 2);
	await boss.stop({ graceful: false, wait: true });

	const workers = [await runExploreWorker(URL, { supervise: true }), await runExploreWorker(URL, { supervise: false })];
	try {
		for (let t = 0; t < 600 && (await state(row.id)).done < 3; t++) await new Promise((r) => setTimeout(r, 50));
		const before = await state(row.id);
		expect(before.status).toBe('queued'); // stopped mid-run
		stop();
		await new Promise((r) => setTimeout(r, 1500));
		start();
		for (let t = 0; t < 600 && (await state(row.id)).status === 'queued'; t++) await new Promise((r) => setTimeout(r, 200));
	} finally {
		await Promise.all(workers.map((w) => w.stop().catch(() => {})));
	}
	const after = await state(row.id);
	expect(after).toEqual({ status: 'done', done: 16 });

	const ev = exploreEvaluator(rev.geometry as never, spec);
	const m = EXPLORE_MEASURES.length;
	const f = (v: number) => (Number.isNaN(v) ? null : Math.fround(v));
	const expected: unknown[] = [];
	for (let c = 0; c < 16; c++) {
		const r = solveChunk(ev, spec, c * 1000, 1000);
		for (let v = 0; v < 1000; v++) expected.push({ idx: c * 1000 + v, ok: r.ok[v] === 1, toe: f(r.values[v * m]), camber: f(r.values[v * m + 1]), mig: f(r.values[v * m + 3]), mr: null });
	}
	const rows = await testDb()
		.select({ idx: explorationVariants.idx, ok: explorationVariants.ok, toe: explorationVariants.toeRms, camber: explorationVariants.camberGain, mig: explorationVariants.rcMigration, mr: explorationVariants.motionRatio })
		.from(explorationVariants)
		.where(eq(explorationVariants.explorationId, row.id))
		.orderBy(asc(explorationVariants.idx));
	// PostgreSQL prints a real in its shortest exact form; back to float32 it is the very value written
	const f32 = (v: number | null) => (v === null ? null : Math.fround(v));
	expect(rows.map((r) => ({ ...r, toe: f32(r.toe), camber: f32(r.camber), mig: f32(r.mig) }))).toEqual(expected);
	expect((expected as { ok: boolean }[]).filter((e) => e.ok).length).toBeGreaterThan(1000);
}, 180_000);
