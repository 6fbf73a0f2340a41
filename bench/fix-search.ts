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
	packaging(req);
	perKind();
}

/**
 * The same search with packaging (issue 16): an invented rim barrel and gearbox box, the travel checked at
 * straight ahead and ±1 turn of a 60 mm/turn rack, and this wheel's steering ratio held in 11–14:1.
 */
function packaging(req: FixSearchInput): void {
	const withPack: FixSearchInput = {
		...req,
		packaging: {
			spec: {
				volumes: [
					{ shape: 'rim', name: 'Rim barrel', barrel_radius: 200, clearance: 10, inboard: 90, outboard: 60 },
					{ shape: 'box', name: 'Gearbox', min: [-2400, -170, 120], max: [-2050, 170, 330] }
				],
				racks: [-60, 60],
				moved: ['steer.inner', 'steer.outer'],
				ratio: { perTurn: 60, lockRack: 60 }
			},
			ratioBand: [11, 14],
			ratioWeight: 1
		}
	};
	const { ms, last } = timed(withPack);
	line('  with 2 keep-out volumes at 3 rack positions + ratio band, median', `${ms.toFixed(1)} ms`, '(figure)');
	line('    evaluations per search', `${last.evaluations}`, '(figure)');
	line('    blocked by a volume', last.packaging?.blocked ? last.packaging.blocked.volume : 'no', '(figure)');
}

/** A fix search of one kind: `broken` fitted back to `stock` on `measures`, with `free` coordinates (±15 mm). */
function kindCase(stock: string, broken: string, measures: ('toe' | 'camber' | 'rocker_angle')[], free: [string, 0 | 1 | 2][]): FixSearchInput {
	const read = (n: string) => JSON.parse(readFileSync(join(import.meta.dirname, '..', 'fixtures', `${n}.json`), 'utf8')) as CornerInput;
	const ev = new CornerEvaluator(read(stock), GRID, measures);
	const target = new Float64Array(measures.length * ev.count);
	ev.evaluate([], [], target);
	toChange(target, measures.length, ev.count, ev.design);
	return {
		corner: read(broken),
		grid: GRID,
		free: free.map(([point, axis]) => ({ point, axis, min: -15, max: 15 })),
		measures: measures.map((key, j) => ({ key, weight: 1, target: target.subarray(j * ev.count, (j + 1) * ev.count) })),
		starts: 5
	};
}

/** Median (ms) of 11 searches after 3 warm-ups, and the last result. */
function timed(req: FixSearchInput) {
	for (let i = 0; i < 3; i++) fixSearch(req);
	const times: number[] = [];
	let last = fixSearch(req);
	for (let i = 0; i < 11; i++) {
		const t0 = performance.now();
		last = fixSearch(req);
		times.push(performance.now() - t0);
	}
	return { ms: median(times), last };
}

/** The fix search on the general model's kinds (printed per kind; no target but "not slower"). */
export function perKind(): void {
	console.log('  per kind, 41 positions, 5 starts:');
	const five = timed(kindCase('single-seater-rear-left-five-link', 'single-seater-rear-left-five-link-toe-link-up', ['toe'], [['steer.inner', 1], ['steer.inner', 2]]));
	line('  five-link: toe link up → stock toe, steer.inner y z free', `${five.ms.toFixed(1)} ms`, '(figure)');
	line('    toe: largest error against stock after the search', `${five.last.measures[0].maxAfter.toFixed(4)}°`, '(figure)');
	const rocker = timed(kindCase('single-seater-front-left-pushrod', 'single-seater-front-left-pushrod-softer', ['rocker_angle'], [['rocker.rod_end', 1], ['rocker.rod_end', 2]]));
	line('  pushrod: rod joint out → stock rocker, rocker.rod_end y z', `${rocker.ms.toFixed(1)} ms`, '(figure)');
	line('    rocker angle: largest error against stock after the search', `${rocker.last.measures[0].maxAfter.toFixed(4)}°`, '(figure)');
	const semi = timed(kindCase('road-rear-left-semi-trailing', 'road-rear-left-semi-trailing-inner-pivot-down', ['toe', 'camber'], [['arm.rear', 2], ['arm.front', 2]]));
	line('  semi-trailing: pivot down → stock toe, camber; arm z', `${semi.ms.toFixed(1)} ms`, '(figure)');
	line('    toe: largest error against stock after the search', `${semi.last.measures[0].maxAfter.toFixed(4)}°`, '(figure)');
}
