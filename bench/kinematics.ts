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

/** A fixture corner. */
function fixture(name: string): CornerInput {
	return JSON.parse(readFileSync(join(import.meta.dirname, '..', 'fixtures', `${name}.json`), 'utf8')) as CornerInput;
}

/** The hand-tuned floor of this sweep in plain JavaScript (issue 14, measured before the general model): 27 µs. */
const FLOOR_US = 27;

/** Median of the 161-position heave sweep, all measures, for each kind through the general model. */
function perKind(dwUs: number): void {
	console.log('  per kind, heave -80..80 mm by 1 mm, all measures (general model: description → plan → chain):');
	const strut = sweepMedianUs(new CornerSolver(fixture('road-strut-front-left')));
	line('  strut (slider chain), median', `${strut.toFixed(1)} µs`, '(no target)');
	const five = sweepMedianUs(new CornerSolver(fixture('single-seater-rear-left-five-link')));
	line('  five-link (rods chain, Newton 6×6), median', `${five.toFixed(1)} µs`, '<= 250 µs');
	const semi = sweepMedianUs(new CornerSolver(fixture('road-rear-left-semi-trailing')));
	line('  semi-trailing arm (revolute chain), median', `${semi.toFixed(1)} µs`, '(no target)');
	// the same single-seater front with its spring on the lower arm, and with the pushrod and rocker instead
	const plain = fixture('single-seater-front-left');
	const pushrod = fixture('single-seater-front-left-pushrod');
	const base = sweepMedianUs(new CornerSolver(plain));
	const rocker = sweepMedianUs(new CornerSolver(pushrod));
	line('  double wishbone without / with a pushrod rocker', `${base.toFixed(1)} / ${rocker.toFixed(1)} µs`, '(rocker adds ≤ 20 %)');
	line('  rocker overhead', `${(((rocker - base) / base) * 100).toFixed(1)} %`, '<= 20 %');
	const fiveBytes = bytesPerSweep(new CornerSolver(fixture('single-seater-rear-left-five-link')));
	const rockerBytes = bytesPerSweep(new CornerSolver(pushrod));
	line('  heap growth per sweep, five-link / pushrod rocker', `${fiveBytes.toFixed(0)} / ${rockerBytes.toFixed(0)} B`, '~0 B');
	line('  double wishbone against the 27 µs hand-tuned floor', `${(dwUs / FLOOR_US).toFixed(2)} x`, '(ratio, printed)');
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
	line('engine sweep (double wishbone), all measures, median', `${us.toFixed(1)} µs`, '<= 100 µs');
	const rate = throughput(solver);
	line('engine batch throughput, all measures, one core', `${Math.round(rate).toLocaleString('en')} /s`, '>= 1,500,000 /s');
	const bytes = bytesPerSweep(solver);
	line('heap growth per sweep (200 sweeps between full GCs)', `${bytes.toFixed(0)} B`, '~0 B');
	perKind(us);
	const ref = await referenceMedianUs(corner);
	line('general route (mathjs 6-DOF Newton, numeric Jacobian), median', `${(ref / 1000).toFixed(1)} ms`, '(reference)');
	line('speed ratio, general route / engine', `${(ref / us).toFixed(0)} x`, '>= 50 x');
}
