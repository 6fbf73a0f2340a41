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
const EDITS = 60;

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

/** Milliseconds from each point edit to the redrawn toe curve, EDITS times. */
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
		const times: number[] = [];
		for (let i = 0; i < EDITS; i++) {
			// A string, not a function: tsx would add helpers to a function that the page does not have.
			const ms = (await page.evaluate(`(async (v) => {
				const input = document.querySelector('input[aria-label="Tie rod, outer joint, z in mm"]');
				const path = () => document.querySelector('[data-testid="chart-toe"] path[data-series="draft"]');
				const before = path().getAttribute('d');
				const t0 = performance.now();
				input.focus();
				input.value = v;
				input.dispatchEvent(new Event('input', { bubbles: true }));
				await new Promise((resolve) => {
					const check = () => (path().getAttribute('d') !== before ? resolve() : requestAnimationFrame(check));
					check();
				});
				await new Promise((r) => requestAnimationFrame(() => r(null)));
				return performance.now() - t0;
			})(${JSON.stringify(String(186 + (i % 5)))})`)) as number;
			times.push(ms);
		}
		return times.sort((a, b) => a - b);
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
		const times = await editToRedraw(`http://127.0.0.1:${port}`);
		console.log(`  point edit → redrawn charts, 161-position heave, p50  ${percentile(times, 50).toFixed(1).padStart(8)} ms`);
		console.log(`  point edit → redrawn charts, 161-position heave, p95  ${percentile(times, 95).toFixed(1).padStart(8)} ms   target <= 80 ms (${times.length} edits, debounce included)`);
	} finally {
		server.kill('SIGKILL');
	}
}
