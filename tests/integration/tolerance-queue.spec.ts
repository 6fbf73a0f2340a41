// Frame: ISO 8855 vehicle axes; tolerances in mm, angles in degrees.
// A large tolerance study (20,000 samples or more) goes through the job queue: chunks on the same pg-boss queue as
// the explorations, solved by real queue workers started here, and its result is the very result of the fast path
// (every sample is solved from the seed and its index alone). A client that goes away cancels the queued run.
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { databaseUrl, testDatabase } from '../../scripts/db.mjs';
import { revisions } from '../../src/lib/server/db/schema';
import { runExploreWorker, type WorkerHandle } from '../../src/lib/server/queue/explore-worker';
import { runTolerance } from '../../src/lib/server/studies/parallel';
import { bands, firstOrder, nominalCurves, type ToleranceSpec } from '../../src/lib/server/studies/tolerance';
import { MOVABLE_POINTS } from '../../src/lib/schemas/analysis';
import { Client, closeDb, testDb } from './helpers';

const CORNER = '00000000-0000-4000-8000-0000000000f1';
const URL = process.env.TEST_DATABASE_URL ?? (databaseUrl(testDatabase) as string);
const engineer = new Client();
let stock = '';

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	const list = (await (await engineer.fetch(`/api/v1/corners/${CORNER}/revisions`)).json()).revisions as { id: string; number: number }[];
	stock = list.find((r) => r.number === 1)!.id;
});
afterAll(closeDb);

async function lines(res: Response) {
	return (await res.text())
		.split('\n')
		.filter(Boolean)
		.map((l) => JSON.parse(l));
}

const queuedJobs = async () => Number(((await testDb().execute(sql`select count(*)::int as n from pgboss.job where name = 'explore-chunk' and data ? 'toleranceId'`)) as unknown as { n: number }[])[0].n);
const runs = async () => Number(((await testDb().execute(sql`select count(*)::int as n from tolerance_runs`)) as unknown as { n: number }[])[0].n);

describe('tolerance study on the job queue', () => {
	test('20,000 samples: solved in chunks by two queue workers, the result identical to the fast path with the same seed', async () => {
		const workers: WorkerHandle[] = [await runExploreWorker(URL, { supervise: true }), await runExploreWorker(URL, { supervise: false })];
		const before = await queuedJobs();
		const runsBefore = await runs();
		let all;
		try {
			const res = await engineer.json(`/api/v1/revisions/${stock}/tolerance-study`, 'POST', { samples: 20000, seed: 7, travel: { from: -20, to: 20, step: 4 } });
			expect(res.status).toBe(200);
			all = await lines(res);
		} finally {
			await Promise.all(workers.map((w) => w.stop()));
		}
		const last = all.at(-1);
		expect(last.type).toBe('result');
		expect(last.result.queuedChunks).toBe(10);
		expect(last.result.threads).toBe(0);
		expect(all.filter((l) => l.type === 'progress').length).toBeGreaterThan(1);
		expect((await queuedJobs()) - before).toBe(10); // the chunks went through pg-boss (completed jobs stay listed)
		expect(await runs()).toBe(runsBefore); // the samples are not kept once read

		// The fast path on this thread with the same spec (the route's: every movable point ±0.5 mm, normal; toe and camber)
		const [rev] = await testDb().select().from(revisions).where(eq(revisions.id, stock));
		const geometry = rev.geometry as unknown as ToleranceSpec['corner'] & { points: Record<string, unknown> };
		const spec: ToleranceSpec = {
			corner: geometry,
			grid: { from: -20, to: 20, step: 4 },
			tolerances: MOVABLE_POINTS.filter((p) => geometry.points[p]).map((point) => ({ point, mm: 0.5, mode: 'axis' as const })),
			measures: ['toe', 'camber'],
			samples: 20000,
			seed: 7,
			distribution: 'normal'
		};
		const run = await runTolerance(spec, { threads: 0, workerCode: null });
		const fast = bands(spec, run.blocks, nominalCurves(spec), firstOrder(spec).total);
		expect(last.result.bands).toEqual(JSON.parse(JSON.stringify(fast)));
		expect(last.result.failed).toBe(run.blocks.reduce((s, b) => s + b.ok.length - b.ok.reduce((a, v) => a + v, 0), 0));
	}, 120_000);

	test('below 20,000 samples the study stays on the fast path (no job queued)', async () => {
		const before = await queuedJobs();
		const res = await engineer.json(`/api/v1/revisions/${stock}/tolerance-study`, 'POST', { samples: 200, threads: 0 });
		const last = (await lines(res)).at(-1);
		expect(last.result.queuedChunks).toBe(0);
		expect(await queuedJobs()).toBe(before);
	});

	test('a client that goes away cancels the queued run: it is deleted and its chunks are skipped', async () => {
		const runsBefore = await runs();
		const ac = new AbortController();
		const res = await engineer.fetch(`/api/v1/revisions/${stock}/tolerance-study`, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify({ samples: 30000 }),
			signal: ac.signal
		});
		expect(res.status).toBe(200);
		for (let t = 0; t < 100 && (await runs()) === runsBefore; t++) await new Promise((r) => setTimeout(r, 50));
		expect(await runs()).toBe(runsBefore + 1); // queued, no worker running
		ac.abort();
		for (let t = 0; t < 100 && (await runs()) > runsBefore; t++) await new Promise((r) => setTimeout(r, 50));
		expect(await runs()).toBe(runsBefore);
		// a worker started now finds nothing of it to solve
		const w = await runExploreWorker(URL, { supervise: true });
		await new Promise((r) => setTimeout(r, 1500));
		const wrote = w.written();
		await w.stop();
		expect(wrote).toBe(0);
	}, 60_000);
});
