// Workspace figures: the page's initial JavaScript (gzipped) against the lazily loaded 3-D chunk, and the
// time from a point edit to redrawn charts for a 161-position heave sweep, in Chromium on loopback.
// Prints figures only. Uses the built app and the test database (reset and seeded here).
import { gzipSync } from 'node:zlib';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { chromium } from '@playwright/test';
import { ensureBuild, prepareDatabase, waitForHttp } from '../scripts/setup.mjs';
import { startTestServer } from '../scripts/test-server.mjs';

const CLIENT = '.svelte-kit/output/client';
const PAGE = 'src/routes/corners/[cornerId=id]/+page.svelte';
const LAZY = 'src/lib/components/LinkageView.svelte';
const EDITS = 100;

type Manifest = Record<string, { file: string; imports?: string[]; dynamicImports?: string[]; isEntry?: boolean }>;

/** Every chunk key reachable from `keys` through static imports (and dynamic ones when asked). */
function closure(m: Manifest, keys: string[], dynamic = false): Set<string> {
	const seen = new Set<string>();
	const walk = (k: string) => {
		if (seen.has(k) || !m[k]) return;
		seen.add(k);
		for (const i of m[k].imports ?? []) walk(i);
		if (dynamic) for (const i of m[k].dynamicImports ?? []) walk(i);
	};
	keys.forEach(walk);
	return seen;
}

/** Gzipped bytes of the JavaScript files of these chunks. */
function gz(m: Manifest, keys: Iterable<string>) {
	let total = 0;
	for (const k of keys) if (m[k].file.endsWith('.js')) total += gzipSync(readFileSync(path.join(CLIENT, m[k].file))).length;
	return total;
}

/** Initial and lazy gzipped JavaScript of the workspace page. */
function bundleSizes() {
	const m: Manifest = JSON.parse(readFileSync(path.join(CLIENT, '.vite/manifest.json'), 'utf8'));
	// The generated node module of a route imports its page component by path.
	const node = Object.keys(m).find((k) => k.includes('/nodes/') && readFileSync(k, 'utf8').includes(PAGE));
	const layout = Object.keys(m).find((k) => k.endsWith('/nodes/0.js'));
	const roots = Object.keys(m).filter((k) => m[k].isEntry && (k.endsWith('entry.js') || k.endsWith('/app.js')));
	if (!node || !layout) throw new Error('the workspace page is not in the client manifest');
	const initial = closure(m, [...roots, layout, node]);
	const lazy = [...closure(m, [LAZY], true)].filter((k) => !initial.has(k));
	return { initial: gz(m, initial), lazy: gz(m, lazy) };
}

/** The p-th percentile of sorted values. */
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];

/** Milliseconds from each point edit to the redrawn toe curve, and to the redrawn 3-D view, EDITS times. */
async function editToRedraw(baseUrl: string) {
	const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking'] });
	try {
		const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
		await page.goto(`${baseUrl}/signin`);
		await page.getByLabel('E-mail').fill('engineer@linkwright.test');
		await page.getByLabel('Password').fill('linkwright-demo');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL(`${baseUrl}/`);
		await page.goto(`${baseUrl}/corners/00000000-0000-4000-8000-0000000000f1`);
		await page.locator('[data-testid="chart-toe"] path[data-series="draft"]').waitFor();
		await page.locator('[data-testid="linkage-canvas"][data-draws]').waitFor();
		// As an engineer works: the edited row and the toe chart both in view (the page scrolled so the chart's
		// bottom sits at the window's), so the measured frame paints the visible chart.
		await page.evaluate(`(() => {
			const chart = document.querySelector('[data-testid="chart-toe"]').getBoundingClientRect();
			window.scrollBy(0, Math.max(0, chart.bottom + window.scrollY - window.innerHeight + 24) - window.scrollY);
		})()`);
		const inView = await page.evaluate(`(() => {
			const r = (s) => document.querySelector(s).getBoundingClientRect();
			const a = r('input[aria-label="Tie rod, outer joint, z in mm"]');
			const b = r('[data-testid="chart-toe"]');
			return a.top >= 0 && b.bottom <= window.innerHeight;
		})()`);
		if (!inView) throw new Error('the edited input and the toe chart do not fit in the window together');
		await page.waitForTimeout(1000);
		const charts: number[] = [];
		const scene: number[] = [];
		for (let i = 0; i < EDITS; i++) {
			// A string, not a function: tsx would add helpers to a function that the page does not have.
			// "Redrawn" = the frame after the one that first shows the new path (or the new 3-D picture) has begun,
			// so the paint of that frame is counted.
			const [c, s] = (await page.evaluate(`(async (v) => {
				const input = document.querySelector('input[aria-label="Tie rod, outer joint, z in mm"]');
				const canvas = document.querySelector('[data-testid="linkage-canvas"]');
				const path = () => document.querySelector('[data-testid="chart-toe"] path[data-series="draft"]');
				const before = path().getAttribute('d');
				const draws = canvas.dataset.draws;
				const until = (done) => new Promise((resolve) => { const check = () => (done() ? resolve() : requestAnimationFrame(check)); check(); });
				const nextFrame = () => new Promise((r) => requestAnimationFrame(() => r(null)));
				const t0 = performance.now();
				input.focus({ preventScroll: true });
				input.value = v;
				input.dispatchEvent(new Event('input', { bubbles: true }));
				await until(() => path().getAttribute('d') !== before);
				await nextFrame();
				const charts = performance.now() - t0;
				await until(() => canvas.dataset.draws !== draws);
				await nextFrame();
				const scene = performance.now() - t0;
				await new Promise((r) => setTimeout(r, 150));
				return [charts, scene];
			})(${JSON.stringify(String(186 + (i % 5)))})`)) as [number, number];
			charts.push(c);
			scene.push(s);
		}
		return { charts: charts.sort((a, b) => a - b), scene: scene.sort((a, b) => a - b) };
	} finally {
		await browser.close();
	}
}

/** Prints the workspace figures. */
export async function run() {
	ensureBuild();
	prepareDatabase({ test: true });
	const { initial, lazy } = bundleSizes();
	console.log(`  workspace page initial JavaScript, gzipped            ${(initial / 1024).toFixed(1).padStart(8)} KB   target <= 200 KB`);
	console.log(`  lazily loaded 3-D view chunk (three.js), gzipped      ${(lazy / 1024).toFixed(1).padStart(8)} KB   (not counted above)`);
	const port = 3700;
	const server = startTestServer(port);
	try {
		await waitForHttp(`http://127.0.0.1:${port}/signin`);
		const { charts, scene } = await editToRedraw(`http://127.0.0.1:${port}`);
		const row = (what: string, p: number, v: number[], tail = '') => console.log(`  point edit → ${what}, p${p}`.padEnd(55) + `${percentile(v, p).toFixed(1).padStart(8)} ms${tail}`);
		row('redrawn charts, 161-position heave', 50, charts);
		row('redrawn charts, 161-position heave', 95, charts, `   target <= 80 ms (${charts.length} edits)`);
		row('redrawn 3-D view (follows the charts)', 50, scene);
		row('redrawn 3-D view (follows the charts)', 95, scene, '   (software WebGL here: no GPU)');
	} finally {
		server.kill('SIGKILL');
	}
}
