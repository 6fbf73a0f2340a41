// Design-space exploration over HTTP against the built app, solved by real queue workers (pg-boss in the test
// database, started here in this process): validation with nothing queued, permissions, the same study with one and
// with two workers giving identical rows, a chunk delivered twice counted once, results, the Pareto front and saving
// a variant as a revision.
import { and, asc, count, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { databaseUrl, testDatabase } from '../../scripts/db.mjs';
import { storeChunk } from '../../src/lib/server/db/queries/explorations';
import { explorations, explorationVariants, revisions } from '../../src/lib/server/db/schema';
import { runExploreWorker, type WorkerHandle } from '../../src/lib/server/queue/explore-worker';
import { Client, closeDb, testDb } from './helpers';

const CORNER = '00000000-0000-4000-8000-0000000000f1';
const URL = process.env.TEST_DATABASE_URL ?? (databaseUrl(testDatabase) as string);
const engineer = new Client();
const viewer = new Client();
let rackMoved = '';

// The tie-rod joints, over ranges that include the rack's move back (20 mm up).
const TIE_ROD = [
	{ point: 'steer.inner', axis: 'z', from: -25, to: 5 },
	{ point: 'steer.outer', axis: 'z', from: -15, to: 15 },
	{ point: 'steer.inner', axis: 'y', from: -5, to: 5 }
];
const start = (client: Client, body: Record<string, unknown>) => client.json(`/api/v1/revisions/${rackMoved}/explore`, 'POST', { coordinates: TIE_ROD, variants: 3000, seed: 11, ...body });

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	const list = (await (await engineer.fetch(`/api/v1/corners/${CORNER}/revisions`)).json()).revisions as { id: string; number: number }[];
	rackMoved = list.find((r) => r.number === 2)!.id;
});
afterAll(closeDb);

/** Explorations and queued jobs in the database. */
async function counts() {
	const db = testDb();
	const [e] = await db.select({ n: count() }).from(explorations);
	const jobs = await db.execute<{ n: number }>(sql`select count(*)::int as n from pgboss.job where name = 'explore-chunk'`).catch(() => [{ n: 0 }]);
	return { explorations: e.n, jobs: Number((jobs as unknown as { n: number }[])[0]?.n ?? 0) };
}

/** Runs `n` queue workers until the exploration is no longer queued; returns the chunks each wrote. */
async function solveWith(n: number, id: string): Promise<number[]> {
	const workers: WorkerHandle[] = [];
	for (let i = 0; i < n; i++) workers.push(await runExploreWorker(URL, { supervise: i === 0 }));
	for (let t = 0; t < 600; t++) {
		const [row] = await testDb().select({ status: explorations.status }).from(explorations).where(eq(explorations.id, id));
		if (row.status !== 'queued') break;
		await new Promise((r) => setTimeout(r, 200));
	}
	const written = workers.map((w) => w.written());
	await Promise.all(workers.map((w) => w.stop()));
	return written;
}

async function rowsOf(id: string) {
	return testDb()
		.select({ idx: explorationVariants.idx, ok: explorationVariants.ok, toe: explorationVariants.toeRms, camber: explorationVariants.camberGain, rc: explorationVariants.rcHeight, mig: explorationVariants.rcMigration, mr: explorationVariants.motionRatio })
		.from(explorationVariants)
		.where(eq(explorationVariants.explorationId, id))
		.orderBy(asc(explorationVariants.idx));
}

describe('bad input: 400 naming the field, nothing stored or queued', () => {
	test.each([
		[{ coordinates: [{ point: 'steer.inner', axis: 'z', from: 5, to: 5 }] }, 'coordinates.0.to', /empty or inverted range/],
		[{ coordinates: [{ point: 'steer.inner', axis: 'z', from: 5, to: -5 }] }, 'coordinates.0.to', /empty or inverted range/],
		[{ variants: 1_000_001 }, 'variants', /must be ≤ 1,000,000/],
		[{ plan: 'factorial', levels: 200 }, 'levels', /more than 1,000,000/],
		[{ coordinates: [{ point: 'strut.top', axis: 'z', from: -5, to: 5 }] }, 'coordinates.0.point', /has no point strut\.top/],
		[{ coordinates: [{ point: 'steer.middle', axis: 'z', from: -5, to: 5 }] }, 'coordinates.0.point', /must be one of/],
		[{ coordinates: Array.from({ length: 11 }, (_, i) => ({ point: 'steer.inner', axis: 'z', from: -i - 1, to: 1 })) }, 'coordinates', /at most 10/],
		[{ plan: 'halton' }, 'plan', /must be 'lhs', 'sobol' or 'factorial'/]
	])('%#', async (body, field, message) => {
		const before = await counts();
		const res = await start(engineer, body);
		expect(res.status).toBe(400);
		const { error } = await res.json();
		expect(error.field).toBe(field);
		expect(error.message).toMatch(message);
		expect(await counts()).toEqual(before);
	});

	test('a viewer may not start one (403), and nothing is queued', async () => {
		const before = await counts();
		expect((await start(viewer, {})).status).toBe(403);
		expect(await counts()).toEqual(before);
	});
});

describe('through the queue', () => {
	let a = '';
	let b = '';

	test('the same study with one worker and with two workers gives identical rows', async () => {
		const resA = await start(engineer, {});
		expect(resA.status).toBe(201);
		a = (await resA.json()).id;
		const one = await solveWith(1, a);
		expect(one).toEqual([2]);
		const resB = await start(engineer, {});
		b = (await resB.json()).id;
		const two = await solveWith(2, b);
		expect(two.reduce((x, y) => x + y, 0)).toBe(2);
		const ra = await rowsOf(a);
		const rb = await rowsOf(b);
		expect(ra.length).toBe(3000);
		expect(rb).toEqual(ra);
		expect(ra.filter((r) => r.ok).length).toBeGreaterThan(100);
		const status = await (await viewer.fetch(`/api/v1/explorations/${a}`)).json();
		expect(status).toMatchObject({ status: 'done', chunks: 2, chunksDone: 2, variants: 3000, feasible: ra.filter((r) => r.ok).length });
	});

	test('progress reaches the browser as server-sent events after each stored chunk (LISTEN/NOTIFY), ending when done', async () => {
		const res = await start(engineer, { variants: 6000, seed: 12 });
		const id = (await res.json()).id;
		const stream = await viewer.fetch(`/api/v1/explorations/${id}/events`);
		expect(stream.status).toBe(200);
		expect(stream.headers.get('content-type')).toBe('text/event-stream');
		const text = stream.text(); // resolves when the server ends the stream
		await solveWith(1, id);
		const events = (await text).split('\n\n').filter((e) => e.startsWith('event: progress')).map((e) => JSON.parse(e.split('data: ')[1]));
		expect(events.at(-1)).toMatchObject({ status: 'done', chunksDone: 3 });
		expect(events.length).toBeGreaterThanOrEqual(2); // the state at opening, then at least the last chunk's
		const done = events.map((e) => e.chunksDone);
		expect(done).toEqual([...done].sort((x, y) => x - y));
	});

	test('a chunk delivered again (a retried job) adds nothing', async () => {
		const before = await rowsOf(a);
		const wrote = await storeChunk(testDb(), a, 0, 0, { ok: new Uint8Array(2000).fill(1), values: new Float64Array(2000 * 6).fill(9), measures: 6, clear: null });
		expect(wrote).toBe(false);
		expect(await rowsOf(a)).toEqual(before);
	});

	test('variants: paged and sorted in the database; a viewer reads them', async () => {
		const res = await viewer.fetch(`/api/v1/explorations/${a}/variants?sort=toe_rms&dir=asc&limit=5&offset=0`);
		expect(res.status).toBe(200);
		const page = await res.json();
		const all = (await rowsOf(a)).filter((r) => r.ok).map((r) => r.toe!).sort((x, y) => x - y);
		expect(page.total).toBe(all.length);
		expect(page.rows.map((r: { toe_rms: number }) => r.toe_rms)).toEqual(all.slice(0, 5));
		expect(page.rows[0].moves).toHaveLength(3);
		const filtered = await (await viewer.fetch(`/api/v1/explorations/${a}/variants?filter=toe_rms&max=${all[9]}&limit=500`)).json();
		expect(filtered.total).toBe(all.filter((v) => v <= all[9]).length);
		const bad = await viewer.fetch(`/api/v1/explorations/${a}/variants?sort=colour`);
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('sort');
	});

	test('Pareto front of toe RMS and roll-centre migration: no stored variant dominates a front point', async () => {
		const body = await (await viewer.fetch(`/api/v1/explorations/${a}/pareto?x=toe_rms&y=rc_migration`)).json();
		const rows = (await rowsOf(a)).filter((r) => r.ok);
		expect(body.front.length).toBeGreaterThan(0);
		for (const p of body.front) expect(rows.some((r) => r.toe! <= p.x && r.mig! <= p.y && (r.toe! < p.x || r.mig! < p.y))).toBe(false);
	});

	test('saving a front variant makes a revision through the one save path; viewers may not; cancel needs edit', async () => {
		const body = await (await engineer.fetch(`/api/v1/explorations/${a}/pareto?x=toe_rms&y=rc_migration`)).json();
		const idx = body.front[0].idx;
		expect((await viewer.json(`/api/v1/explorations/${a}/save`, 'POST', { index: idx })).status).toBe(403);
		expect((await viewer.fetch(`/api/v1/explorations/${a}/cancel`, { method: 'POST' })).status).toBe(403);
		const res = await engineer.json(`/api/v1/explorations/${a}/save`, 'POST', { index: idx, label: 'explored' });
		expect(res.status).toBe(201);
		const saved = await res.json();
		const [row] = await testDb().select().from(revisions).where(and(eq(revisions.id, saved.id), eq(revisions.cornerId, CORNER)));
		expect(row.parentId).toBe(rackMoved);
		expect(row.note).toMatch(new RegExp(`variant ${idx}: moved steer\\.inner`));
		const [parent] = await testDb().select().from(revisions).where(eq(revisions.id, rackMoved));
		const moved = (row.geometry as { points: Record<string, number[]> }).points['steer.inner'][2];
		const was = (parent.geometry as { points: Record<string, number[]> }).points['steer.inner'][2];
		const z = saved.moves.find((m: { point: string; axis: string }) => m.point === 'steer.inner' && m.axis === 'z').move;
		expect(moved).toBeCloseTo(was + z, 3);
		const no = await engineer.json(`/api/v1/explorations/${a}/save`, 'POST', { index: 999_999 });
		expect(no.status).toBe(400);
		expect((await no.json()).error.field).toBe('index');
	});
});

describe('measures chosen per study, keep-out volumes and the steering ratio from the car model, three objectives, the matrix', () => {
	const SINGLE_SEATER_FRONT_LEFT = '00000000-0000-4000-8000-0000000002f1';

	test('only the chosen measures are stored; sorting, filtering or a front on another is refused naming the field', async () => {
		const res = await start(engineer, { variants: 2000, seed: 21, measures: ['toe_rms', 'rc_migration'] });
		expect(res.status).toBe(201);
		const view = await res.json();
		expect(view.measures).toEqual(['toe_rms', 'rc_migration']);
		await solveWith(1, view.id);
		const rows = (await rowsOf(view.id)).filter((r) => r.ok);
		expect(rows.length).toBeGreaterThan(50);
		expect(rows.every((r) => r.toe !== null && r.mig !== null && r.camber === null && r.rc === null && r.mr === null)).toBe(true);
		for (const [path, field] of [
			[`variants?sort=camber_gain`, 'sort'],
			[`variants?filter=motion_ratio&max=1`, 'filter'],
			[`pareto?x=toe_rms&y=camber_gain`, 'y']
		]) {
			const bad = await viewer.fetch(`/api/v1/explorations/${view.id}/${path}`);
			expect(bad.status).toBe(400);
			expect((await bad.json()).error.field).toBe(field);
		}
		const m = await (await viewer.fetch(`/api/v1/explorations/${view.id}/matrix?sample=100`)).json();
		expect(m.measures).toEqual(['toe_rms', 'rc_migration']);
		expect(m.total).toBe(rows.length);
		expect(m.rows.length).toBeLessThanOrEqual(100);
		expect(m.rows.length).toBeGreaterThan(50);
		const byIdx = new Map(rows.map((r) => [r.idx, r]));
		for (const r of m.rows) expect(Math.fround(r.toe_rms)).toBe(Math.fround(byIdx.get(r.idx)!.toe!));
	});

	test.each([
		[{ measures: [] }, 'measures', /at least one/],
		[{ measures: ['toe_rms', 'toe_rms'] }, 'measures.1', /listed twice/],
		[{ measures: ['bump_steer'] }, 'measures.0', /must be one of/],
		[{ measures: ['steer_ratio'] }, 'measures.0', /car model's steering/]
	])('bad measures %#: 400 naming the field, nothing queued', async (body, field, message) => {
		const before = await counts();
		const res = await start(engineer, body);
		expect(res.status).toBe(400);
		const { error } = await res.json();
		expect(error.field).toBe(field);
		expect(error.message).toMatch(message);
		expect(await counts()).toEqual(before);
	});

	test("a corner of a car with a model: its keep-out volumes mark variants, and the steering ratio agrees with the solver's steer sweep", async () => {
		const list = (await (await engineer.fetch(`/api/v1/corners/${SINGLE_SEATER_FRONT_LEFT}/revisions`)).json()).revisions as { id: string; number: number }[];
		const rev = list.find((r) => r.number === 1)!.id;
		// 3 levels over ±2 mm: the middle level is no move at all, so variant 4 (digits 1, 1) is the corner as it is
		const res = await engineer.json(`/api/v1/revisions/${rev}/explore`, 'POST', {
			coordinates: [
				{ point: 'steer.inner', axis: 'z', from: -2, to: 2 },
				{ point: 'steer.outer', axis: 'z', from: -2, to: 2 }
			],
			plan: 'factorial',
			levels: 3,
			measures: ['toe_rms', 'steer_ratio'],
			travel: { from: -20, to: 20, step: 4 }
		});
		expect(res.status).toBe(201);
		const view = await res.json();
		expect(view.keepOut).toEqual(['Front rim barrel', 'Gearbox casing']);
		await solveWith(1, view.id);
		const page = await (await viewer.fetch(`/api/v1/explorations/${view.id}/variants?ok=all&limit=500`)).json();
		expect(page.total).toBe(9);
		const ok = page.rows.filter((r: { ok: boolean }) => r.ok);
		expect(ok.length).toBeGreaterThan(0);
		for (const r of ok) expect(typeof r.clear).toBe('boolean');
		const clear = (await (await viewer.fetch(`/api/v1/explorations/${view.id}/variants?ok=clear`)).json()).total;
		const blocked = (await (await viewer.fetch(`/api/v1/explorations/${view.id}/variants?ok=blocked`)).json()).total;
		expect(clear + blocked).toBe(ok.length);
		// The steering ratio by its definition (steering-wheel angle over road-wheel angle, SAE J670 "overall steering
		// ratio"), derived here from the revision's own steer sweep: rack ±1 mm is ±6° of steering wheel at 60 mm a turn.
		const sweep = await (await viewer.fetch(`/api/v1/revisions/${rev}/solve?sweep=steer&from=-1&to=1&step=1`)).json();
		const toe = (rack: number) => sweep.samples.find((x: { rack: number }) => x.rack === rack).toe;
		const expected = 12 / Math.abs(toe(1) - toe(-1));
		const unmoved = page.rows.find((r: { idx: number }) => r.idx === 4);
		expect(unmoved.ok).toBe(true);
		expect(unmoved.steer_ratio).toBeGreaterThan(expected * 0.99);
		expect(unmoved.steer_ratio).toBeLessThan(expected * 1.01);
	});

	test('the front of three objectives: no variant dominates a front point, and every other variant is dominated (brute force, derived here)', async () => {
		const res = await start(engineer, { variants: 1500, seed: 31, measures: ['toe_rms', 'rc_height', 'rc_migration'] });
		const id = (await res.json()).id;
		await solveWith(1, id);
		const body = await (await viewer.fetch(`/api/v1/explorations/${id}/pareto?x=toe_rms&y=rc_migration&z=rc_height&zSense=max&cloud=0`)).json();
		expect(body.z).toBe('rc_height');
		const rows = (await rowsOf(id)).filter((r) => r.ok).map((r) => ({ idx: r.idx, o: [r.toe!, r.mig!, -r.rc!] }));
		const dominates = (a: number[], b: number[]) => a.every((v, k) => v <= b[k]) && a.some((v, k) => v < b[k]);
		const onFront = new Set(body.front.map((p: { idx: number }) => p.idx));
		expect(onFront.size).toBeGreaterThan(2);
		for (const r of rows) expect(rows.some((q) => dominates(q.o, r.o))).toBe(!onFront.has(r.idx));
		const bad = await viewer.fetch(`/api/v1/explorations/${id}/pareto?x=toe_rms&y=rc_migration&z=toe_rms`);
		expect((await bad.json()).error.field).toBe('z');
	});
});

describe('faults', () => {
	test('kill -9 of a worker process mid-run: another worker finishes the study and every row equals an uninterrupted solve', async () => {
		const { spawn } = await import('node:child_process');
		const { createExploration } = await import('../../src/lib/server/db/queries/explorations');
		const { startQueue, enqueueChunks } = await import('../../src/lib/server/queue/explore-queue');
		const { exploreEvaluator, solveChunk } = await import('../../src/lib/server/studies/explore');
		const [rev] = await testDb().select().from(revisions).where(eq(revisions.id, rackMoved));
		const spec = { plan: 'sobol' as const, coords: [{ point: 'steer.inner', axis: 2 as const, from: -25, to: 5 }, { point: 'steer.outer', axis: 2 as const, from: -15, to: 15 }], variants: 12_000, levels: 5, seed: 5, grid: { from: -40, to: 40, step: 2 } };
		const row = await createExploration(testDb(), { cornerId: CORNER, revisionId: rackMoved, spec, variants: 12_000, chunkSize: 1000, chunks: 12, createdBy: rev.authorId! });
		const boss = await startQueue(URL);
		// a 2 s expiry, so the killed worker's chunk comes back within seconds (the product's default is 120 s)
		await enqueueChunks(boss, row.id, 12, 2);
		await boss.stop({ graceful: false, wait: true });

		const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], { env: { ...process.env, DATABASE_URL: URL, LW_WORKER_THREADS: '1', LW_WORKER_VERBOSE: '1' }, stdio: ['ignore', 'pipe', 'inherit'] });
		await new Promise<void>((resolve) => child.stdout!.on('data', (d: Buffer) => d.toString().includes(`${row.id} chunk`) && resolve()));
		child.kill('SIGKILL');
		await new Promise((r) => child.once('exit', r));
		const [mid] = await testDb().select({ status: explorations.status }).from(explorations).where(eq(explorations.id, row.id));
		expect(mid.status).toBe('queued'); // killed before the end

		process.env.LW_QUEUE_MAINTENANCE_S = '1';
		const written = await solveWith(1, row.id);
		expect(written[0]).toBeGreaterThan(0);

		const ev = exploreEvaluator(rev.geometry as never, spec);
		const expected: unknown[] = [];
		for (let c = 0; c < 12; c++) {
			const r = solveChunk(ev, spec, c * 1000, 1000);
			for (let v = 0; v < 1000; v++) {
				const f = (k: number) => (Number.isNaN(r.values[v * 6 + k]) ? null : Math.fround(r.values[v * 6 + k]));
				expected.push({ idx: c * 1000 + v, ok: r.ok[v] === 1, toe: f(0), camber: f(1), rc: f(2), mig: f(3), mr: f(4) });
			}
		}
		// PostgreSQL prints a real in its shortest exact form; back to float32 it is the very value written
		const f32 = (v: number | null) => (v === null ? null : Math.fround(v));
		const got = (await rowsOf(row.id)).map((r) => ({ ...r, toe: f32(r.toe), camber: f32(r.camber), rc: f32(r.rc), mig: f32(r.mig), mr: f32(r.mr) }));
		expect(got).toEqual(expected);
		const [done] = await testDb().select({ status: explorations.status }).from(explorations).where(eq(explorations.id, row.id));
		expect(done.status).toBe('done');
	}, 120_000);
});
