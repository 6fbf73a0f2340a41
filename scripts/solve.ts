// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height.
// The solve command: reads one corner-geometry/1 file, prints corner-solve/1 JSON on stdout.
// Exit 0 solved; 1 bad input (one line on stderr naming the field); 2 cannot assemble
// (one line on stderr naming the link and position; stdout still carries the solved part).

import { readFileSync } from 'node:fs';
import { parseCornerGeometry, SWEEP_DEFAULTS } from '../src/lib/schemas/geometry';
import { CornerGeometryError, solveSweep, SweepOptionsError, type SweepKind, type SweepResult } from '../src/lib/server/kinematics/index';
import { AXLE_SWEEP_DEFAULTS, parseAxleFile } from '../src/lib/schemas/axle';
import { SolidAxleGeometryError, SolidSweepOptionsError, solveSolidAxle } from '../src/lib/server/kinematics/solid-axle';
import { AxleSolver, barFigures } from '../src/lib/server/kinematics/axle';
import { parseCarFile } from '../src/lib/schemas/car-model';
import { carFigures, CarModelError, pitchSweep } from '../src/lib/server/kinematics/car';

const HELP = `Usage: npm run -s solve -- FILE [--sweep heave|roll|steer|pitch] [--from A --to B --step S] [--rack R] [--points]

Solves one suspension corner (a corner-geometry/1 JSON file) through a sweep and prints
corner-solve/1 JSON on stdout: one sample per position with camber, toe, caster, kpi,
scrub_radius, trail, half_track_change, wheelbase_change, fvic, fvsa, rc_height, svic,
anti_dive, anti_squat, camber_ground, motion_ratio, wheel_centre and contact_patch.
Axes are ISO 8855 (x forward, y left, z up), z = 0 the ground at design ride height;
lengths in mm, angles in degrees. A quantity that does not apply is null.

Sweeps (an option left out takes its default):
  --sweep heave   wheel-centre travel in mm, + = bump          default --from -50 --to 50 --step 5
  --sweep roll    body roll in degrees, + = left side down     default --from -3 --to 3 --step 0.5
  --sweep steer   rack travel in mm, + = rack to the left       default --from -40 --to 40 --step 5
  --rack R        hold the rack at R mm during a heave or roll sweep (default 0)
  --points        also give each sample the solved point positions and spring length
                  (an addition to corner-solve/1; leave it out for contract output)
--step must be > 0 and --from <= --to; --to is included when it falls on the step grid.

An axle file (axle-geometry/1: "left", "right" or "mirror", "steering", "vehicle") prints
axle-solve/1: each sample holds "left" and "right" (corner samples) and the axle's rc,
delta_left, delta_right, ackermann, steering_ratio and turning_circle.
  --sweep steer   steering-wheel angle in degrees, + = the driver turns left
                                                                default --from -360 --to 360 --step 30
  --steering-wheel A  hold the steering wheel at A degrees during a heave or roll sweep

A car file (car-model/1 with "corners": { "front_left": corner file, ... }, optional
"front_brake_fraction" and "drive": "fwd" | "rwd" | "awd") prints car-figures/1: mass, CG,
corner weights, wheel rates, ride frequencies, roll stiffness, roll gradient, load transfer.
  --sweep pitch   body pitch in degrees about the CG, + = nose down: each axle's travel,
                  side-view instant centre, anti-dive (front) and anti-squat (rear)
                                                                default --from -3 --to 3 --step 0.25

Exit status, for batch studies and CI jobs:
  0  solved over the whole range
  1  bad input: unreadable file, bad JSON, or a field that fails validation
     (one line on stderr naming the field, e.g. "points.upper.outer: missing")
  2  the corner cannot be assembled at some position: one line on stderr naming the link
     and the position; stdout still carries the solved part with an "error" object

Examples:
  npm run -s solve -- fixtures/club-fwd-front-left.json
  npm run -s solve -- my-corner.json --sweep roll --from -2 --to 2 --step 0.25
  npm run -s solve -- my-corner.json --from -80 --to 80 --step 1 > heave.json || echo "exit $?"
  npm run -s solve -- fixtures/invented-car.json --sweep pitch --from -2 --to 2 --step 0.5
`;

/** Print one line on stderr and exit with `code`. */
function fail(code: number, line: string): never {
	process.stderr.write(line.replace(/\s+/g, ' ').trim() + '\n');
	process.exit(code);
}

interface Args {
	file: string;
	sweep: SweepKind | 'pitch';
	/** whether --sweep was given (a car file prints its figures without it) */
	sweepGiven: boolean;
	from?: number;
	to?: number;
	step?: number;
	rack?: number;
	'steering-wheel'?: number;
	points: boolean;
}

/** Parse argv (after the script name); exits 1 on a bad option. */
function parseArgs(argv: string[]): Args {
	const files: string[] = [];
	const nums: Record<string, number> = {};
	let sweep: SweepKind | 'pitch' = 'heave';
	let sweepGiven = false;
	let points = false;
	for (let i = 0; i < argv.length; i++) {
		const [flag, inline] = argv[i].startsWith('--') ? argv[i].split(/=(.*)/s, 2) : [argv[i], undefined];
		if (flag === '--help' || flag === '-h') {
			process.stdout.write(HELP);
			process.exit(0);
		}
		if (!flag.startsWith('--') || flag === '--') {
			if (flag !== '--') files.push(flag);
			continue;
		}
		if (flag === '--points') {
			points = true;
			continue;
		}
		const value = inline ?? argv[++i];
		if (value === undefined) fail(1, `${flag}: missing value`);
		if (flag === '--sweep') {
			if (value !== 'heave' && value !== 'roll' && value !== 'steer' && value !== 'pitch') fail(1, `--sweep: must be heave, roll, steer or pitch (pitch: a car file only)`);
			sweep = value;
			sweepGiven = true;
		} else if (['--from', '--to', '--step', '--rack', '--steering-wheel'].includes(flag)) {
			const n = value.trim() === '' ? NaN : Number(value);
			if (!Number.isFinite(n)) fail(1, `${flag}: must be a finite number, got '${value}'`);
			nums[flag.slice(2)] = n;
		} else fail(1, `${flag}: unknown option (see --help)`);
	}
	if (files.length !== 1) fail(1, files.length ? 'FILE: give exactly one corner file' : 'FILE: missing (see --help)');
	return { file: files[0], sweep, sweepGiven, points, ...nums };
}

/** Read a JSON file; exits 1 when it cannot be read or parsed. */
function readJson(file: string): unknown {
	let text: string;
	try {
		text = readFileSync(file, 'utf8');
	} catch (e) {
		fail(1, `FILE: cannot read ${file} (${(e as NodeJS.ErrnoException).code ?? 'error'})`);
	}
	let json: unknown;
	try {
		json = JSON.parse(text);
	} catch (e) {
		fail(1, `FILE: ${file} is not valid JSON (${(e as Error).message})`);
	}
	return json;
}

/**
 * A car file (car-model/1 with its corners inside): prints car-figures/1 (mass, CG, corner weights, rates, roll
 * stiffness, load transfer), or with --sweep pitch car-pitch/1 (degrees of body pitch, + = nose down).
 */
function mainCar(args: Args, json: unknown): void {
	if (args.sweepGiven && args.sweep !== 'pitch') fail(1, '--sweep: a car file takes --sweep pitch (or none for its figures)');
	if (args.rack !== undefined || args['steering-wheel'] !== undefined) fail(1, `--${args.rack !== undefined ? 'rack' : 'steering-wheel'}: not for a car file`);
	const parsed = parseCarFile(json);
	if (!parsed.ok) fail(1, parsed.message);
	const { model, corners, settings } = parsed.car;
	try {
		if (args.sweep === 'pitch') {
			const from = args.from ?? -3;
			const to = args.to ?? 3;
			const step = args.step ?? 0.25;
			if (!(step > 0)) fail(1, '--step: must be > 0');
			if (!(from <= 0 && to >= 0)) fail(1, '--from: the pitch range must include 0 (design)');
			const r = pitchSweep(model, corners, settings, { from, to, step });
			process.stdout.write(JSON.stringify({ format: 'car-pitch/1', ...r }, tidy) + '\n');
			if (r.error) fail(2, `${r.error.axle}: ${r.error.message} at pitch ${r.error.pitch} deg`);
			return;
		}
		process.stdout.write(JSON.stringify({ format: 'car-figures/1', ...carFigures(model, corners) }, tidy) + '\n');
	} catch (e) {
		if (e instanceof CarModelError) fail(1, e.message);
		throw e;
	}
}

/** Solve an axle file (axle-geometry/1) and print axle-solve/1. */
function mainAxle(args: Args, json: unknown): void {
	if (args.sweep === 'pitch') fail(1, '--sweep: pitch is for a car file (car-model/1)');
	if (args.rack !== undefined) fail(1, '--rack: an axle file is steered by --steering-wheel (degrees)');
	if (args['steering-wheel'] !== undefined && args.sweep === 'steer') fail(1, '--steering-wheel: only with --sweep heave or roll');
	const parsed = parseAxleFile(json);
	if (!parsed.ok) fail(1, parsed.message);
	const d = AXLE_SWEEP_DEFAULTS[args.sweep];
	const from = args.from ?? d.from;
	const to = args.to ?? d.to;
	const step = args.step ?? d.step;
	if (!(step > 0)) fail(1, '--step: must be > 0');
	if (!(from <= to)) fail(1, `--from: must be <= --to (got ${from} > ${to})`);
	if (parsed.type === 'solid') return mainSolid(args, parsed.axle, from, to, step);
	let solver: AxleSolver;
	let result: ReturnType<AxleSolver['sweep']>;
	try {
		solver = new AxleSolver(parsed.axle);
		result = solver.sweep({ sweep: args.sweep, from, to, step, steering_wheel: args['steering-wheel'], points: args.points });
	} catch (e) {
		if (e instanceof CornerGeometryError) fail(1, e.message);
		if (e instanceof SweepOptionsError) fail(1, /^(steering|anti_roll_bar)/.test(e.message) ? e.message : `--${e.message}`);
		throw e;
	}
	const out: Record<string, unknown> = { format: 'axle-solve/1', sweep: args.sweep, kinds: [parsed.axle.left.kind, parsed.axle.right.kind], samples: result.samples };
	const bar = barFigures(solver);
	if (bar) out.anti_roll_bar = bar;
	if (result.error) out.error = result.error;
	process.stdout.write(JSON.stringify(out, tidy) + '\n');
	if (result.error) fail(2, result.error.message);
}

/** Solve a solid axle file (heave or roll) and print axle-solve/1 with the solid axle's keys. */
function mainSolid(args: Args, axle: Extract<ReturnType<typeof parseAxleFile>, { type: 'solid' }>['axle'], from: number, to: number, step: number): void {
	if (args.sweep === 'steer' || args.sweep === 'pitch') fail(1, `--sweep: a solid axle ${args.sweep === 'steer' ? 'does not steer' : 'file is not a car'} (use heave or roll)`);
	if (args['steering-wheel'] !== undefined) fail(1, '--steering-wheel: a solid axle does not steer');
	const v = axle.vehicle;
	if (v && v.axle !== 'rear') fail(1, "vehicle.axle: a solid axle is analysed as the rear axle ('rear')");
	let result: ReturnType<typeof solveSolidAxle>;
	try {
		result = solveSolidAxle(axle.solid, v ? { wheelbase: v.wheelbase, cg_height: v.cg_height, axle: 'rear', rear_drive_fraction: v.rear_drive_fraction } : null, { sweep: args.sweep, from, to, step, points: args.points });
	} catch (e) {
		if (e instanceof SolidAxleGeometryError) fail(1, e.message);
		if (e instanceof SolidSweepOptionsError) fail(1, `--${e.message}`);
		throw e;
	}
	const out: Record<string, unknown> = { format: 'axle-solve/1', sweep: args.sweep, kinds: ['solid_axle'], lateral: axle.solid.lateral, samples: result.samples };
	if (result.error) out.error = result.error;
	process.stdout.write(JSON.stringify(out, tidy) + '\n');
	if (result.error) fail(2, result.error.message);
}

/** Validate a corner file's object; exits 1 with the field on failure. */
function readCorner(json: unknown) {
	const parsed = parseCornerGeometry(json);
	if (!parsed.ok) fail(1, parsed.message);
	return parsed.corner;
}

/** Round to 1e-6 (mm or degrees) for printing; never -0. */
function tidy(_key: string, v: unknown): unknown {
	if (typeof v !== 'number') return v;
	const r = Math.round(v * 1e6) / 1e6;
	return r === 0 ? 0 : r;
}

/** Entry point. */
function main(): void {
	const args = parseArgs(process.argv.slice(2));
	const json = readJson(args.file);
	if (json && typeof json === 'object' && (json as { format?: unknown }).format === 'axle-geometry/1') return mainAxle(args, json);
	if (json && typeof json === 'object' && (json as { format?: unknown }).format === 'car-model/1') return mainCar(args, json);
	if (args.sweep === 'pitch') fail(1, '--sweep: pitch is for a car file (car-model/1)');
	if (args['steering-wheel'] !== undefined) fail(1, '--steering-wheel: only for an axle file (axle-geometry/1)');
	const d = SWEEP_DEFAULTS[args.sweep];
	const from = args.from ?? d.from;
	const to = args.to ?? d.to;
	const step = args.step ?? d.step;
	if (!(step > 0)) fail(1, '--step: must be > 0');
	if (!(from <= to)) fail(1, `--from: must be <= --to (got ${from} > ${to})`);
	if (args.rack !== undefined && args.sweep === 'steer') fail(1, '--rack: only with --sweep heave or roll');
	const corner = readCorner(json);
	let result: SweepResult;
	try {
		result = solveSweep(corner, { sweep: args.sweep, from, to, step, rack: args.rack, points: args.points });
	} catch (e) {
		if (e instanceof CornerGeometryError) fail(1, e.message);
		if (e instanceof SweepOptionsError) fail(1, `--${e.message}`);
		throw e;
	}
	const out: Record<string, unknown> = { format: 'corner-solve/1', sweep: args.sweep, kind: corner.kind, samples: result.samples };
	if (result.error) out.error = result.error;
	process.stdout.write(JSON.stringify(out, tidy) + '\n');
	if (result.error) fail(2, `${result.error.link}: cannot be assembled at ${args.sweep === 'heave' ? 'travel' : args.sweep === 'roll' ? 'roll' : 'rack'} ${result.error.position}${args.sweep === 'roll' ? ' deg' : ' mm'}`);
}

main();
