// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Fix-search bench (issue 7): 4 free coordinates over 41 travel positions, 5 starting points; prints figures only.

import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import type { CornerInput } from '../src/lib/server/kinematics/corner';
import { CornerEvaluator, toChange } from '../src/lib/server/studies/evaluate';
import { fixSearch, type FixSearchInput } from '../src/lib/server/studies/fix-search';

const DEMO = join(import.meta.dirname, '..', 'fixtures', 'demo');
const GRID = { from: -40, to: 40, step: 2 }; // 41 positions

/** Median of xs. */
function median(xs: number[]): number {
	const s = xs.slice().sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

/** Print one figure with its target. */
function line(label: string, value: string, target: string): void {
	console.log(`  ${label.padEnd(58)} ${value.padStart(14)}   target ${target}`);
}

/** The demo's rack-moved corner fitted back to stock toe (camber kept), tie-rod joints free. */
function input(): FixSearchInput {
	const read = (n: string) => JSON.parse(readFileSync(join(DEMO, `${n}.json`), 'utf8')) as CornerInput;
	const ev = new CornerEvaluator(read('front-left-stock'), GRID, ['toe', 'camber']);
	const target = new Float64Array(2 * ev.count);
	ev.evaluate([], [], target);
	toChange(target, 2, ev.count, ev.design);
	return {
		corner: read('front-left-rack-moved'),
		grid: GRID,
		free: [
			{ point: 'steer.inner', axis: 1, min: -15, max: 15 },
			{ point: 'steer.inner', axis: 2, min: -15, max: 15 },
			{ point: 'steer.outer', axis: 0, min: -15, max: 15 },
			{ point: 'steer.outer', axis: 2, min: -15, max: 30 }
		],
		measures: [
			{ key: 'toe', weight: 1, target: target.subarray(0, ev.count) },
			{ key: 'camber', weight: 0.2, target: target.subarray(ev.count) }
		],
		starts: 5
	};
}

/** Run the fix-search bench and print its figures. */
export function run(): void {
	const req = input();
	console.log('fix search: demo rack moved → stock toe, steer.inner y z and steer.outer x z free, 41 positions, 5 starts');
	console.log(`  (load average ${loadavg()[0].toFixed(2)} on ${availableParallelism()} cores: figures are slower on a busy machine)`);
	for (let i = 0; i < 5; i++) fixSearch(req); // warm up
	const times: number[] = [];
	let last = fixSearch(req);
	for (let i = 0; i < 21; i++) {
		const t0 = performance.now();
		last = fixSearch(req);
		times.push(performance.now() - t0);
	}
	const perEval = (median(times) * 1000) / last.evaluations;
	line('fix search, 4 coordinates × 41 positions, 5 starts, median', `${median(times).toFixed(1)} ms`, '<= 50 ms');
	line('  sweep evaluations per search', `${last.evaluations}`, '(figure)');
	line('  time per evaluation (41-position sweep, incl. the fit)', `${perEval.toFixed(1)} µs`, '(figure)');
	line('  toe: largest error against stock after the search', `${last.measures[0].maxAfter.toFixed(4)}°`, '<= 0.05°');
}
