// The corner page at a team's scale (issue 19): a corner with 500 revisions, seeded here in the test database on a
// car of its own, then the page's server time (HTML over loopback, signed in) and, in Chromium at 1440 × 900, the
// time from navigation to the page being interactive (its scripts ran: the mark `corner:interactive` set in the
// page's onMount, and the main thread's long tasks by then finished) and to the first chart drawn.
// Prints figures only, never asserts on them.
import { chromium } from '@playwright/test';
import { eq } from 'drizzle-orm';
import { readFileSync } from 'node:fs';
import os from 'node:os';
import { databaseUrl, testDatabase } from '../scripts/db.mjs';
import { ensureBuild, prepareDatabase, waitForHttp } from '../scripts/setup.mjs';
import { startTestServer } from '../scripts/test-server.mjs';
import { connect } from '../src/lib/server/db/connect';
import { appendRevision, setBaseline } from '../src/lib/server/db/queries/corners';
import { cars, corners, revisions, users } from '../src/lib/server/db/schema';

export const SCALE_CAR = '00000000-0000-4000-8000-0000000c5ca1';
export const SCALE_CORNER = '00000000-0000-4000-8000-0000000c5cf1';
const DEMO_TEAM = '00000000-0000-4000-8000-00000000d3e0';
const REVISIONS = 500;
const RUNS = 7;

/** The p-th percentile of sorted values. */
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
const fmt = (v: number[]) => `p50 ${percentile(v, 50).toFixed(0).padStart(5)} ms   max ${v.at(-1)!.toFixed(0).padStart(5)} ms   (${v.length} runs)`;

/** A corner of the demo team with `count` revisions (the invented demo front left, its rack moved a little each time). */
export async function seedScaleCorner(url: string, count = REVISIONS) {
	const { db, client } = connect(url, 2);
	try {
		const [engineer] = await db.select({ id: users.id }).from(users).where(eq(users.email, 'engineer@linkwright.test'));
		const [owner] = await db.select({ id: users.id }).from(users).where(eq(users.email, 'owner@linkwright.test'));
		await db.insert(cars).values({ id: SCALE_CAR, teamId: DEMO_TEAM, name: 'Scale check (500 revisions)', wheelbaseMm: 2500 }).onConflictDoNothing();
		await db.insert(corners).values({ id: SCALE_CORNER, carId: SCALE_CAR, position: 'front_left', kind: 'double_wishbone' }).onConflictDoNothing();
		const have = (await db.select({ id: revisions.id }).from(revisions).where(eq(revisions.cornerId, SCALE_CORNER))).length;
		const stock = JSON.parse(readFileSync(new URL('../fixtures/demo/front-left-stock.json', import.meta.url), 'utf8'));
		let parentId: string | null = null;
		for (let i = have; i < count; i++) {
			const points = { ...stock.points, 'steer.inner': [stock.points['steer.inner'][0], stock.points['steer.inner'][1], stock.points['steer.inner'][2] + (i % 21) - 10] };
			const row = await appendRevision(db, {
				cornerId: SCALE_CORNER,
				kind: 'double_wishbone',
				geometry: { ...stock, points },
				label: i === 0 ? 'stock' : `rack ${(i % 21) - 10 >= 0 ? '+' : ''}${(i % 21) - 10} mm, run ${i}`,
				note: i % 10 === 0 ? `Test day ${1 + Math.floor(i / 10)}: rack height sweep for bump steer.` : '',
				parentId,
				authorId: i % 3 === 0 ? (owner?.id ?? null) : (engineer?.id ?? null)
			});
			parentId = row.id;
			if (i === 0) await setBaseline(db, SCALE_CORNER, row.id);
		}
	} finally {
		await client.end();
	}
}

export async function run() {
	ensureBuild();
	const url = prepareDatabase({ test: true }) as string;
	const t0 = performance.now();
	await seedScaleCorner(url ?? databaseUrl(testDatabase));
	console.log(`  seeded a corner with ${REVISIONS} revisions in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
	const port = Number(process.env.LW_TEST_PORT ?? 3700) + 12;
	const base = `http://127.0.0.1:${port}`;
	const server = startTestServer(port);
	const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking'] });
	try {
		await waitForHttp(`${base}/signin`);
		const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
		// the main thread's long tasks (over 50 ms, W3C Long Tasks API) from the navigation on
		await page.addInitScript(`window.__longTasks = []; try { new PerformanceObserver((l) => window.__longTasks.push(...l.getEntries().map((e) => ({ startTime: e.startTime, duration: e.duration })))).observe({ type: 'longtask', buffered: true }); } catch {}`);
		await page.goto(`${base}/signin`);
		await page.getByLabel('E-mail').fill('engineer@linkwright.test');
		await page.getByLabel('Password').fill('linkwright-demo');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL(`${base}/`);
		const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
		const path = `/corners/${SCALE_CORNER}`;

		// server time: the whole HTML of the page (load: the revisions' first page, the newest revision solved)
		const server: number[] = [];
		let bytes = 0;
		for (let i = 0; i < RUNS + 1; i++) {
			const s = performance.now();
			const res = await fetch(`${base}${path}`, { headers: { cookie } });
			const html = await res.text();
			if (res.status !== 200) throw new Error(`the corner page answered ${res.status}`);
			if (i > 0) server.push(performance.now() - s);
			bytes = html.length;
		}
		server.sort((a, b) => a - b);

		const interactive: number[] = [];
		const chart: number[] = [];
		let height = 0;
		let chartTop = 0;
		for (let i = 0; i < RUNS + 1; i++) {
			await page.goto(`${base}/`);
			await page.evaluate(`new Promise((r) => setTimeout(r, 300))`);
			const start = performance.now();
			await page.goto(`${base}${path}`, { waitUntil: 'commit' });
			await page.locator('[data-testid="chart-toe"] path[data-series="draft"]').waitFor();
			const drawn = performance.now() - start;
			await page.waitForFunction(`performance.getEntriesByName('corner:interactive').length > 0`);
			// a quiet second, then: interactive = the mark, or the end of the last long task before it if later
			await page.waitForTimeout(1000);
			const [tti, h, top] = (await page.evaluate(`(() => {
				const mark = performance.getEntriesByName('corner:interactive')[0].startTime;
				const longTasks = window.__longTasks || [];
				const busyUntil = Math.max(0, ...longTasks.filter((t) => t.startTime <= mark).map((t) => t.startTime + t.duration));
				const chart = document.querySelector('figure.lw-chart');
				return [Math.max(mark, busyUntil), document.documentElement.scrollHeight, chart.getBoundingClientRect().top + scrollY];
			})()`)) as number[];
			if (i > 0) {
				interactive.push(tti);
				chart.push(drawn);
			}
			height = h;
			chartTop = top;
		}
		interactive.sort((a, b) => a - b);
		chart.sort((a, b) => a - b);
		console.log(`  corner page with ${REVISIONS} revisions, HTML (${(bytes / 1024).toFixed(0)} KB) over loopback   ${fmt(server)}`);
		console.log(`  navigation → interactive in Chromium (1440 × 900)      ${fmt(interactive)}   target ≤ 1000 ms → ${percentile(interactive, 50) <= 1000 ? 'within target' : 'OVER target'}`);
		console.log(`  navigation → the toe chart's curve drawn                 ${fmt(chart)}`);
		console.log(`  page height ${height} px, the first chart's top at ${chartTop.toFixed(0)} px (window 900 px); load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')} on ${os.cpus().length} cores`);
	} finally {
		await browser.close();
		server.kill('SIGKILL');
	}
}
