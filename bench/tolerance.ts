// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Tolerance-study bench (issue 7): 2000 samples × 41 positions on this thread and on 1 and 2 worker threads.

import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import { bundleWorker } from '../scripts/worker-bundle.mjs';
import { flatPoints, type CornerInput } from '../src/lib/server/kinematics/corner';
import { endIdleWorkers, runTolerance } from '../src/lib/server/studies/parallel';
import { LINKAGE_POINTS } from '../src/lib/server/studies/sensitivity';
import { bands, firstOrder, nominalCurves, type ToleranceSpec } from '../src/lib/server/studies/tolerance';

const STOCK = join(import.meta.dirname, '..', 'fixtures', 'demo', 'front-left-stock.json');

/** Median of xs. */
function median(xs: number[]): number {
	const s = xs.slice().sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

/** Print one figure with its target. */
function line(label: string, value: string, target: string): void {
	console.log(`  ${label.padEnd(58)} ${value.padStart(14)}   target ${target}`);
}

/** Median wall time (ms) of a whole study (samples, first-order model, bands) with `threads` workers (0 = here). */
async function studyMs(spec: ToleranceSpec, threads: number, code: string, runs: number, cold = false): Promise<number> {
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		if (cold) await endIdleWorkers();
		const t0 = performance.now();
		const out = await runTolerance(spec, { threads, workerCode: code });
		if (threads && out.threads !== threads) throw new Error(`workers did not start: ${out.fallback}`);
		bands(spec, out.blocks, nominalCurves(spec), firstOrder(spec).total);
		times.push(performance.now() - t0);
	}
	return median(times);
}

/** Run the tolerance bench and print its figures. */
export async function run(): Promise<void> {
	const corner = JSON.parse(readFileSync(STOCK, 'utf8')) as CornerInput;
	const tolerances = LINKAGE_POINTS.filter((p) => corner.points[p]).map((point) => ({ point, mm: 0.5, mode: 'axis' as const }));
	const spec: ToleranceSpec = { corner, grid: { from: -40, to: 40, step: 2 }, tolerances, measures: ['toe', 'camber'], samples: 2000, seed: 1, distribution: 'normal' };
	const { code } = await bundleWorker();
	console.log(`tolerance study: demo stock, ${tolerances.length} points ±0.5 mm, 2000 samples × 41 positions (toe, camber)`);
	console.log(`  (load average ${loadavg()[0].toFixed(2)} on ${availableParallelism()} cores: figures are slower on a busy machine)`);
	await studyMs(spec, 0, code, 2); // warm up this thread's JIT
	line('tolerance study, this thread, median of 5', `${(await studyMs(spec, 0, code, 5)).toFixed(0)} ms`, '(figure)');
	line('tolerance study, 1 new (cold) worker thread, median of 5', `${(await studyMs(spec, 1, code, 5, true)).toFixed(0)} ms`, '(figure)');
	line('tolerance study, 2 new (cold) worker threads, median of 5', `${(await studyMs(spec, 2, code, 5, true)).toFixed(0)} ms`, '(figure)');
	await studyMs(spec, 2, code, 2); // warm the pool's workers
	line('tolerance study, 1 warm worker thread (reused), median of 5', `${(await studyMs(spec, 1, code, 5)).toFixed(0)} ms`, '(figure)');
	line('tolerance study, 2 warm worker threads (reused), median of 5', `${(await studyMs(spec, 2, code, 5)).toFixed(0)} ms`, '<= 200 ms');
	console.log('  per kind, the same study (every linkage point ±0.5 mm, 2000 samples × 41 positions), 2 warm workers:');
	for (const [name, label] of [
		['single-seater-rear-left-five-link', 'five-link'],
		['road-rear-left-semi-trailing', 'semi-trailing arm'],
		['single-seater-front-left-pushrod', 'wishbone with pushrod rocker']
	] as const) {
		const c = JSON.parse(readFileSync(join(import.meta.dirname, '..', 'fixtures', `${name}.json`), 'utf8')) as CornerInput;
		const all = flatPoints(c);
		const t = LINKAGE_POINTS.filter((p) => all[p]).map((point) => ({ point, mm: 0.5, mode: 'axis' as const }));
		const s: ToleranceSpec = { ...spec, corner: c, tolerances: t };
		await studyMs(s, 2, code, 1);
		line(`  ${label} (${t.length} pts), median of 5`, `${(await studyMs(s, 2, code, 5)).toFixed(0)} ms`, '(figure)');
	}
	await endIdleWorkers();
}
