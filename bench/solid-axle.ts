// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Solid rear axle bench (issue 16, item 6): prints figures, asserts nothing about time.
// Run alone: `npx tsx bench/solid-axle.ts`.

import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import { CornerSolver, type CornerInput, type SweepOptions } from '../src/lib/server/kinematics/index';
import { solveSolidAxle, type SolidAxleInput, type SolidSweepOptions, type SolidVehicle } from '../src/lib/server/kinematics/solid-axle';

const ROLL: SolidSweepOptions = { sweep: 'roll', from: -3, to: 3, step: 0.1 };
const HEAVE: SolidSweepOptions = { sweep: 'heave', from: -60, to: 60, step: 2 };
const POSITIONS = 61;

function median(xs: number[]): number {
	const s = xs.slice().sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

function line(label: string, value: string, target: string): void {
	console.log(`  ${label.padEnd(58)} ${value.padStart(14)}   target ${target}`);
}

function fixture(name: string): { solid: SolidAxleInput; vehicle: SolidVehicle | null } {
	const f = JSON.parse(readFileSync(join(import.meta.dirname, '..', 'fixtures', `${name}.json`), 'utf8'));
	return { solid: f.solid as SolidAxleInput, vehicle: (f.vehicle ?? null) as SolidVehicle | null };
}

/** Median wall time (µs) of fn over `runs` runs after `warm` warm-up runs. */
function medianUs(fn: () => void, warm = 300, runs = 1000): number {
	for (let i = 0; i < warm; i++) fn();
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		fn();
		times.push((performance.now() - t0) * 1000);
	}
	return median(times);
}

/** Time one solid-axle sweep (compile, buffers, samples: everything `solveSolidAxle` does). */
function sweepUs(solid: SolidAxleInput, vehicle: SolidVehicle | null, o: SolidSweepOptions): number {
	const check = solveSolidAxle(solid, vehicle, o);
	if (check.error || check.samples.length !== POSITIONS) throw new Error(`bench sweep did not solve: ${check.error?.message ?? check.samples.length}`);
	return medianUs(() => solveSolidAxle(solid, vehicle, o));
}

/** Print the solid axle's sweep times beside one corner's 61-position roll sweep. */
export async function run(): Promise<void> {
	console.log(`solid axle: roll -3..3° by 0.1° and heave -60..60 mm by 2 mm (${POSITIONS} positions), all keys per sample`);
	console.log(`  (load average ${loadavg()[0].toFixed(2)} on ${availableParallelism()} cores: figures are slower on a busy machine)`);
	const panhard = fixture('invented-solid-rear-axle');
	const watt = fixture('invented-solid-rear-axle-watt');
	const roll = sweepUs(panhard.solid, panhard.vehicle, ROLL);
	line('four-link + Panhard, roll sweep, median', `${roll.toFixed(1)} µs`, '(printed)');
	line('four-link + Watt, roll sweep, median', `${sweepUs(watt.solid, watt.vehicle, ROLL).toFixed(1)} µs`, '(printed)');
	line('four-link + Panhard, heave sweep, median', `${sweepUs(panhard.solid, panhard.vehicle, HEAVE).toFixed(1)} µs`, '(printed)');
	// without springs the per-sample motion-ratio solves (±0.01 mm) drop out; roll steer's (±0.01°) stay
	const bare = structuredClone(panhard.solid);
	for (const k of Object.keys(bare.points)) if (k.startsWith('spring_')) delete bare.points[k];
	line('four-link + Panhard, roll sweep without springs, median', `${sweepUs(bare, panhard.vehicle, ROLL).toFixed(1)} µs`, '(printed)');
	// one independent corner's roll sweep of the same 61 positions, for scale
	const corner = JSON.parse(readFileSync(join(import.meta.dirname, '..', 'fixtures', 'club-fwd-front-left.json'), 'utf8')) as CornerInput;
	const solver = new CornerSolver(corner);
	const cornerRoll: SweepOptions = { sweep: 'roll', from: -3, to: 3, step: 0.1 };
	const one = medianUs(() => solver.sweep(cornerRoll));
	line('one corner (double wishbone) roll sweep with samples, median', `${one.toFixed(1)} µs`, '(reference)');
	line('solid axle roll sweep / one corner roll sweep', `${(roll / one).toFixed(2)} x`, '(printed)');
}

if (process.argv[1]?.endsWith('solid-axle.ts')) await run();
