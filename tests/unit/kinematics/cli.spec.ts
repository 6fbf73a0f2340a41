// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// The solve command as users and outside checks run it (contract: corner-solve/1 output,
// defaults, grid, exit codes 0 / 1 / 2 with one line on stderr).

import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { clone, fixture, ROOT } from './helpers';

interface Run {
	code: number;
	stdout: string;
	stderr: string;
}

/** Run `npx tsx scripts/solve.ts ...args` from the repository root. */
function solve(...args: string[]): Promise<Run> {
	return new Promise((resolve) => {
		execFile('npx', ['tsx', 'scripts/solve.ts', ...args], { cwd: ROOT, timeout: 200_000 }, (err, stdout, stderr) => {
			const code = err ? (typeof err.code === 'number' ? err.code : -1) : 0;
			resolve({ code, stdout, stderr });
		});
	});
}

const KEYS = ['camber', 'toe', 'caster', 'kpi', 'scrub_radius', 'trail', 'half_track_change', 'wheelbase_change', 'fvic', 'fvsa', 'rc_height', 'svic', 'anti_dive', 'anti_squat', 'camber_ground', 'motion_ratio', 'rocker_angle', 'wheel_centre', 'contact_patch'];
const tmp = mkdtempSync(join(tmpdir(), 'linkwright-cli-'));

/** Write a corner (or raw text) to a temporary file; returns its path. */
function tempFile(name: string, content: unknown): string {
	const p = join(tmp, name);
	writeFileSync(p, typeof content === 'string' ? content : JSON.stringify(content));
	return p;
}

// Not concurrent: each test already starts its processes together, and a busy 2-core machine
// slows many parallel tsx start-ups past any sensible timeout.
describe('solve command', { timeout: 240_000 }, () => {
	it('heave defaults: -50…50 by 5, contract JSON, every key present, nulls kept, no NaN', async () => {
		const r = await solve('fixtures/club-fwd-front-left.json');
		expect(r.code).toBe(0);
		expect(r.stdout).not.toMatch(/NaN|Infinity/);
		const out = JSON.parse(r.stdout);
		expect(out.format).toBe('corner-solve/1');
		expect(out.sweep).toBe('heave');
		expect(out.kind).toBe('double_wishbone');
		expect(out.error).toBeUndefined();
		expect(out.samples.map((s: { travel: number }) => s.travel)).toEqual(Array.from({ length: 21 }, (_, k) => -50 + 5 * k));
		for (const s of out.samples) {
			for (const k of KEYS) expect(s).toHaveProperty(k);
			expect(s.anti_squat).toBeNull();
			expect(s.camber_ground).toBeNull();
			expect(s).not.toHaveProperty('points');
		}
	});

	it('roll and steer defaults: -3…3 by 0.5 and -40…40 by 5, keyed roll / rack', async () => {
		const [roll, steer] = await Promise.all([
			solve('fixtures/road-strut-front-left.json', '--sweep', 'roll'),
			solve('fixtures/road-strut-front-left.json', '--sweep', 'steer')
		]);
		expect(roll.code).toBe(0);
		expect(steer.code).toBe(0);
		const r = JSON.parse(roll.stdout);
		const s = JSON.parse(steer.stdout);
		expect(r.kind).toBe('strut');
		expect(r.samples.map((x: { roll: number }) => x.roll)).toEqual(Array.from({ length: 13 }, (_, k) => -3 + 0.5 * k));
		expect(s.samples.map((x: { rack: number }) => x.rack)).toEqual(Array.from({ length: 17 }, (_, k) => -40 + 5 * k));
		expect(r.samples.every((x: { camber_ground: number | null; rc_height: number | null }) => x.camber_ground !== null && x.rc_height === null)).toBe(true);
	});

	it('an option left out takes its default; --to included only on the grid; ascending', async () => {
		const [a, b, c] = await Promise.all([
			solve('fixtures/club-fwd-front-left.json', '--from', '0', '--to', '10', '--step', '2.5'),
			solve('fixtures/club-fwd-front-left.json', '--from', '0', '--to', '10', '--step', '3'),
			solve('fixtures/club-fwd-front-left.json', '--from', '20')
		]);
		expect(JSON.parse(a.stdout).samples.map((s: { travel: number }) => s.travel)).toEqual([0, 2.5, 5, 7.5, 10]);
		expect(JSON.parse(b.stdout).samples.map((s: { travel: number }) => s.travel)).toEqual([0, 3, 6, 9]);
		expect(JSON.parse(c.stdout).samples.map((s: { travel: number }) => s.travel)).toEqual([20, 25, 30, 35, 40, 45, 50]);
	});

	it('exit 1 with one line naming the field: missing point, unknown kind', async () => {
		const missing = clone(fixture('club-fwd-front-left'));
		delete missing.points['upper.outer'];
		const kind = { ...clone(fixture('club-fwd-front-left')), kind: 'swing_axle' };
		const [m, k] = await Promise.all([solve(tempFile('missing.json', missing)), solve(tempFile('kind.json', kind))]);
		expect(m.code).toBe(1);
		expect(m.stderr).toBe('points.upper.outer: missing\n');
		expect(k.code).toBe(1);
		expect(k.stderr.trim().split('\n')).toHaveLength(1);
		expect(k.stderr).toMatch(/^kind: /);
		expect(m.stdout).toBe('');
	});

	it('exit 1 for bad options, bad JSON and an unreadable file', async () => {
		const runs = await Promise.all([
			solve('fixtures/club-fwd-front-left.json', '--step', '0'),
			solve('fixtures/club-fwd-front-left.json', '--from', '10', '--to', '0'),
			solve('fixtures/club-fwd-front-left.json', '--sweep', 'pitch'),
			solve('fixtures/club-fwd-front-left.json', '--from', 'abc'),
			solve(tempFile('bad.json', '{"format": ')),
			solve(join(tmp, 'does-not-exist.json'))
		]);
		for (const r of runs) {
			expect(r.code).toBe(1);
			expect(r.stderr.trim().split('\n')).toHaveLength(1);
		}
		expect(runs[0].stderr).toMatch(/^--step/);
		expect(runs[1].stderr).toMatch(/^--from/);
		expect(runs[4].stderr).toMatch(/not valid JSON/);
		expect(runs[5].stderr).toMatch(/cannot read/);
	});

	it('exit 2 when the corner cannot be assembled: link and position named, solved part on stdout', async () => {
		const r = await solve('fixtures/cannot-assemble.json');
		expect(r.code).toBe(2);
		expect(r.stderr).toBe('lower arm: cannot be assembled at travel 30 mm\n');
		const out = JSON.parse(r.stdout);
		expect(out.error).toMatchObject({ link: 'lower arm', position: 30, sweep: 'heave' });
		const t = out.samples.map((s: { travel: number }) => s.travel);
		expect(t).toEqual(Array.from({ length: 16 }, (_, k) => -50 + 5 * k));
	});

	it('--help explains the command and exits 0', async () => {
		const r = await solve('--help');
		expect(r.code).toBe(0);
		expect(r.stdout).toMatch(/Usage: npm run -s solve -- FILE/);
		expect(r.stdout).toMatch(/Exit status/);
	});

	it('--rack holds the rack in heave; refused with --sweep steer', async () => {
		const [a, b] = await Promise.all([
			solve('fixtures/club-fwd-front-left.json', '--rack', '10', '--from', '0', '--to', '0'),
			solve('fixtures/club-fwd-front-left.json', '--sweep', 'steer', '--rack', '10')
		]);
		expect(a.code).toBe(0);
		expect(Math.abs(JSON.parse(a.stdout).samples[0].toe)).toBeGreaterThan(1);
		expect(b.code).toBe(1);
	});
	it('the general model\'s kinds: five-link, semi-trailing arm and a pushrod rocker solve with every key; a steer sweep of a semi-trailing arm exits 1 naming sweep; a rod that cannot reach exits 2 naming pushrod', async () => {
		const [five, semi, push, steer] = await Promise.all([
			solve(join(ROOT, 'fixtures', 'single-seater-rear-left-five-link.json'), '--sweep', 'roll'),
			solve(join(ROOT, 'fixtures', 'road-rear-left-semi-trailing.json')),
			solve(join(ROOT, 'fixtures', 'single-seater-front-left-pushrod.json'), '--from', '-20', '--to', '20', '--step', '10'),
			solve(join(ROOT, 'fixtures', 'road-rear-left-semi-trailing.json'), '--sweep', 'steer')
		]);
		for (const [run, kind] of [[five, 'multi_link'], [semi, 'semi_trailing'], [push, 'double_wishbone']] as const) {
			expect(run.code, run.stderr).toBe(0);
			const out = JSON.parse(run.stdout);
			expect(out.kind).toBe(kind);
			for (const sample of out.samples) for (const key of KEYS) expect(sample).toHaveProperty(key);
		}
		const rocker = JSON.parse(push.stdout).samples.map((s: { rocker_angle: number }) => s.rocker_angle);
		expect(rocker[2]).toBe(0);
		expect(rocker[0]).toBeGreaterThan(0); // rebound turns this rocker positively about pivot_a → pivot_b
		expect(JSON.parse(semi.stdout).samples[0].caster).toBeNull();
		expect(steer.code).toBe(1);
		expect(steer.stderr.trim()).toMatch(/^--sweep: /);
		const c = JSON.parse(JSON.stringify(fixture('single-seater-front-left-pushrod')));
		c.rocker.rod_end = [0, 262, 480]; // a 15 mm lever cannot follow the rod far
		const stuck = await solve(tempFile('pushrod-stuck.json', c), '--from', '-100', '--to', '100');
		expect(stuck.code).toBe(2);
		expect(stuck.stderr.trim()).toMatch(/^pushrod: cannot be assembled at travel -?\d+ mm$/);
	});
});

// Axle files (contract: "Axle file and axle sweeps"): axle-solve/1, the default steer grid, exit codes.
describe('solve command with an axle file', { timeout: 240_000 }, () => {
	it('prints axle-solve/1 on the default steer grid with both sides and the axle keys', async () => {
		const r = await solve('fixtures/club-front-axle.json', '--sweep', 'steer');
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(out.format).toBe('axle-solve/1');
		expect(out.samples.map((s: { steering_wheel: number }) => s.steering_wheel)).toEqual(Array.from({ length: 25 }, (_, i) => -360 + 30 * i));
		for (const s of out.samples) {
			for (const k of ['left', 'right', 'rc', 'delta_left', 'delta_right', 'ackermann', 'steering_ratio', 'turning_circle']) expect(s).toHaveProperty(k);
			for (const k of KEYS) expect(s.left).toHaveProperty(k);
		}
		// rack_left_turn '-y': at +90° of steering wheel the rack has moved 12.5 mm toward −y
		expect(out.samples.find((s: { steering_wheel: number }) => s.steering_wheel === 90).left.rack).toBeCloseTo(-12.5, 9);
	});

	it('refuses bad input naming the field (exit 1), and a steer sweep of a solid axle', async () => {
		const axle = JSON.parse(readFileSync(join(ROOT, 'fixtures/club-front-axle.json'), 'utf8'));
		axle.steering.rack_left_turn = 'left';
		const [bad, solid] = await Promise.all([solve(tempFile('bad-axle.json', axle)), solve('fixtures/invented-solid-rear-axle.json', '--sweep', 'steer')]);
		expect(bad.code).toBe(1);
		expect(bad.stderr).toMatch(/^steering\.rack_left_turn: /);
		expect(solid.code).toBe(1);
		expect(solid.stderr).toMatch(/^--sweep: a solid axle does not steer/);
	});
});

// Car files (car-model/1 with its corners inside): the figures and the pitch sweep, checked by statics written here.
describe('solve command with a car file', { timeout: 240_000 }, () => {
	const car = JSON.parse(readFileSync(join(ROOT, 'fixtures/invented-car.json'), 'utf8'));
	it('prints car-figures/1: the mass is the items plus four unsprung corners; the CG x by moments', async () => {
		const r = await solve('fixtures/invented-car.json');
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(out.format).toBe('car-figures/1');
		const items = car.mass_items as { mass: number; x: number }[];
		const mass = items.reduce((s, i) => s + i.mass, 0) + 2 * car.front.unsprung_mass + 2 * car.rear.unsprung_mass;
		expect(out.mass).toBeCloseTo(mass, 6);
		// unsprung masses at the wheel centres (the file's own points: front at x = 0)
		const rearX = car.corners.rear_left.points['wheel.centre'][0];
		const frontX = car.corners.front_left.points['wheel.centre'][0];
		const moment = items.reduce((s, i) => s + i.mass * i.x, 0) + 2 * car.rear.unsprung_mass * rearX + 2 * car.front.unsprung_mass * frontX;
		expect(out.cg[0]).toBeCloseTo(moment / mass, 3);
	});
	it('--sweep pitch: each axle travels by its distance from the CG × tan(pitch), front in bump when the nose goes down', async () => {
		const r = await solve('fixtures/invented-car.json', '--sweep', 'pitch', '--from', '-1', '--to', '1', '--step', '1');
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(out.format).toBe('car-pitch/1');
		const one = out.samples.find((s: { pitch: number }) => s.pitch === 1);
		expect(one.front.travel).toBeCloseTo((0 - out.pivot_x) * Math.tan(Math.PI / 180), 4);
		expect(one.rear.travel).toBeCloseTo((-out.wheelbase - out.pivot_x) * Math.tan(Math.PI / 180), 2);
		expect(typeof one.front.anti).toBe('number'); // anti-dive: the file gives a front brake share
	});
	it('refuses a negative mass and a bad corner naming the field (exit 1), and pitch for a corner file', async () => {
		const negative = structuredClone(car);
		negative.mass_items[1].mass = -105;
		const badCorner = structuredClone(car);
		delete badCorner.corners.front_left.points['lower.front'];
		const [a, b, c] = await Promise.all([solve(tempFile('neg-car.json', negative)), solve(tempFile('bad-corner-car.json', badCorner)), solve('fixtures/club-fwd-front-left.json', '--sweep', 'pitch')]);
		expect(a.code).toBe(1);
		expect(a.stderr).toMatch(/^mass_items\.1\.mass: must be > 0 kg/);
		expect(b.code).toBe(1);
		expect(b.stderr).toMatch(/^corners\.front_left\.points\.lower\.front: /);
		expect(c.code).toBe(1);
		expect(c.stderr).toMatch(/^--sweep: pitch is for a car file/);
	});
});
