// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Kinematics bench: prints figures beside their targets (issue 3); asserts nothing about time.

import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { CornerSolver, type CornerInput, type SweepOptions } from '../src/lib/server/kinematics/index';

const FIXTURE = join(import.meta.dirname, '..', 'fixtures', 'club-fwd-front-left.json');
const SWEEP: SweepOptions = { sweep: 'heave', from: -80, to: 80, step: 1 };
const POSITIONS = 161;

/** Median of xs. */
function median(xs: number[]): number {
	const s = xs.slice().sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

/** A gc() function (exposed at run time, since `npm run bench` passes no node flags). */
function gcFunction(): () => void {
	setFlagsFromString('--expose-gc');
	return runInNewContext('gc') as () => void;
}

/** Median wall time (µs) of one 161-position sweep with all measures, into reused buffers. */
function sweepMedianUs(solver: CornerSolver): number {
	for (let i = 0; i < 3000; i++) solver.run(SWEEP); // warm up the JIT (all tiers)
	const times: number[] = [];
	for (let i = 0; i < 3000; i++) {
		const t0 = performance.now();
		solver.run(SWEEP);
		times.push((performance.now() - t0) * 1000);
	}
	return median(times);
}

/** Solved positions per second (all measures) over about one second on this thread. */
function throughput(solver: CornerSolver): number {
	let n = 0;
	const t0 = performance.now();
	let t = t0;
	while (t - t0 < 1000) {
		for (let i = 0; i < 100; i++) solver.run(SWEEP);
		n += 100 * POSITIONS;
		t = performance.now();
	}
	return n / ((t - t0) / 1000);
}

/** Heap bytes retained per sweep across 200 sweeps between full collections. */
function bytesPerSweep(solver: CornerSolver): number {
	const gc = gcFunction();
	solver.run(SWEEP);
	gc();
	const h0 = process.memoryUsage().heapUsed;
	for (let i = 0; i < 200; i++) solver.run(SWEEP);
	const h1 = process.memoryUsage().heapUsed;
	return Math.max(0, (h1 - h0) / 200);
}

/**
 * Median wall time (µs) of the same sweep by the general mathjs route (poses only). mathjs is
 * loaded only here, after the engine has been timed: loading it slows other code in the same
 * process (about 20 % on the engine sweep, measured), and the app itself never loads it.
 */
async function referenceMedianUs(corner: CornerInput): Promise<number> {
	const { referenceSweep } = await import('../src/lib/server/kinematics/reference-solver');
	const positions = Array.from({ length: POSITIONS }, (_, k) => -80 + k);
	const times: number[] = [];
	for (let i = 0; i < 3; i++) {
		const t0 = performance.now();
		referenceSweep(corner, 'heave', positions);
		times.push((performance.now() - t0) * 1000);
	}
	return median(times);
}

/** Print one figure with its target. */
function line(label: string, value: string, target: string): void {
	console.log(`  ${label.padEnd(58)} ${value.padStart(14)}   target ${target}`);
}

/** Run the kinematics bench and print its figures. */
export async function run(): Promise<void> {
	const corner = JSON.parse(readFileSync(FIXTURE, 'utf8')) as CornerInput;
	const solver = new CornerSolver(corner);
	const check = solver.run(SWEEP);
	if (check.failCode !== 0 || check.hi - check.lo + 1 !== POSITIONS) throw new Error('bench sweep did not solve');
	console.log(`kinematics: ${corner.name ?? 'corner'}, heave -80..80 mm by 1 mm (${POSITIONS} positions)`);
	const load = loadavg()[0].toFixed(2);
	console.log(`  (load average ${load} on ${availableParallelism()} cores: figures are slower on a busy machine)`);
	const us = sweepMedianUs(solver);
	line('engine sweep, all measures, median', `${us.toFixed(1)} µs`, '<= 100 µs');
	const rate = throughput(solver);
	line('engine batch throughput, all measures, one core', `${Math.round(rate).toLocaleString('en')} /s`, '>= 1,000,000 /s');
	const bytes = bytesPerSweep(solver);
	line('heap growth per sweep (200 sweeps between full GCs)', `${bytes.toFixed(0)} B`, '~0 B');
	const ref = await referenceMedianUs(corner);
	line('general route (mathjs 6-DOF Newton, numeric Jacobian), median', `${(ref / 1000).toFixed(1)} ms`, '(reference)');
	line('speed ratio, general route / engine', `${(ref / us).toFixed(0)} x`, '>= 50 x');
}
