// Joint misalignment (src/lib/server/kinematics/joint-angles.ts) against hand-computed cases derived here:
// - a ball joint whose arm turns by α about its pivot axis k while the upright only moves along: the stud axis s is
//   turned by α about k, and by Rodrigues' rotation formula (any kinematics text, e.g. Craig, "Introduction to
//   Robotics", §2.8) the angle θ between s and its image has cos θ = cos α + (1 − cos α)(s · k)²;
// - a rod end with its bolt along z on a link raised by β out of the horizontal plane: the link stands β off square
//   to the bolt, so the angle is β; turning the bracket about the link itself changes nothing (b · l is unchanged by
//   a rotation about l);
// - a bolt set along the link's own swing: the angle grows with the square of the motion near design (first-order
//   term zero by construction: a Taylor argument).
import { describe, expect, it } from 'vitest';
import { anglesAt, DEFAULT_LIMIT_DEG, jointAngles, jointsOf, prepareJoints } from '../../../src/lib/server/kinematics/joint-angles';
import type { CornerInput } from '../../../src/lib/server/kinematics/index';
import { DEG, fixture } from './helpers';

type V = [number, number, number];
const sub = (a: number[], b: number[]): V => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: number[], b: number[]) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const unit = (a: number[]): V => {
	const n = Math.hypot(a[0], a[1], a[2]);
	return [a[0] / n, a[1] / n, a[2] / n];
};
/** p turned by angle a about the axis through o along unit k (Rodrigues). */
function turn(p: number[], o: number[], k: V, a: number): V {
	const v = sub(p, o);
	const c = Math.cos(a), s = Math.sin(a);
	const kxv: V = [k[1] * v[2] - k[2] * v[1], k[2] * v[0] - k[0] * v[2], k[0] * v[1] - k[1] * v[0]];
	const kv = dot(k, v);
	return [0, 1, 2].map((i) => o[i] + v[i] * c + kxv[i] * s + k[i] * kv * (1 - c)) as V;
}

const club = fixture('club-fwd-front-left');
const P = club.points as Record<string, V>;
const UPRIGHT = ['lower.outer', 'upper.outer', 'steer.outer', 'wheel.centre', 'wheel.axis_inner'];

describe('the joints of each kind', () => {
	it('a double wishbone has two ball joints, a tie rod and a spring (two rod ends each)', () => {
		const joints = jointsOf(club);
		expect(joints.map((j) => `${j.point}:${j.type}:${j.bracket}`)).toEqual([
			'lower.outer:ball:lower',
			'upper.outer:ball:upper',
			'steer.inner:rod_end:rack',
			'steer.outer:rod_end:upright',
			'spring.chassis:rod_end:chassis',
			'spring.body:rod_end:lower'
		]);
	});

	it('a five-link corner has ten rod ends on its links, a pushrod corner its rod and spring on the rocker', () => {
		expect(jointsOf(fixture('single-seater-rear-left-five-link')).filter((j) => j.type === 'rod_end' && j.link?.endsWith('link'))).toHaveLength(8);
		const pushrod = jointsOf(fixture('single-seater-front-left-pushrod'));
		expect(pushrod.filter((j) => j.bracket === 'rocker').map((j) => j.point)).toEqual(['rocker.rod_end', 'rocker.spring_end']);
	});
});

describe('hand-computed angles', () => {
	it('a ball joint: the arm turned by α about its pivot axis, the upright only moved along (Rodrigues)', () => {
		const k = unit(sub(P['lower.rear'], P['lower.front']));
		const s = unit(sub(P['upper.outer'], P['lower.outer']));
		const joints = prepareJoints(club, P, {}, { heave: null, steer: null });
		const i = joints.findIndex((j) => j.point === 'lower.outer');
		for (const alphaDeg of [2, 7.5, 15]) {
			const a = alphaDeg / DEG;
			const outer = turn(P['lower.outer'], P['lower.front'], k, a);
			const shift = sub(outer, P['lower.outer']);
			// the spring's moving end is on the lower arm: it turns with it
			const pose: Record<string, number[]> = { ...P, 'lower.outer': outer, 'spring.body': turn(P['spring.body'], P['lower.front'], k, a) };
			for (const n of UPRIGHT) pose[n] = [0, 1, 2].map((c) => P[n][c] + shift[c]);
			const expected = Math.acos(Math.cos(a) + (1 - Math.cos(a)) * dot(s, k) ** 2) * DEG;
			expect(anglesAt(club, joints, P, pose)[i]).toBeCloseTo(expected, 9);
		}
	});

	it('a rod end with its bolt along z: a link raised β out of the level is β off square; turning about the link changes nothing', () => {
		const level: CornerInput = structuredClone(club);
		const inner = P['steer.inner'];
		const L = Math.hypot(...sub(P['steer.outer'], inner));
		// a level tie rod across the car at design
		level.points['steer.outer'] = [inner[0], inner[1] + L, inner[2]];
		const D = level.points as Record<string, V>;
		const joints = prepareJoints(level, D, { 'steer.inner': { axis: 'z' }, 'steer.outer': { axis: 'z' } }, { heave: null, steer: null });
		const ii = joints.findIndex((j) => j.point === 'steer.inner');
		const io = joints.findIndex((j) => j.point === 'steer.outer');
		expect(anglesAt(level, joints, D, D)[ii]).toBeCloseTo(0, 12);
		for (const betaDeg of [3, 10, 20]) {
			const b = betaDeg / DEG;
			const outer: V = [inner[0], inner[1] + L * Math.cos(b), inner[2] + L * Math.sin(b)];
			const shift = sub(outer, D['steer.outer']);
			const pose: Record<string, number[]> = { ...D };
			for (const n of UPRIGHT) pose[n] = [0, 1, 2].map((c) => D[n][c] + shift[c]);
			expect(anglesAt(level, joints, D, pose)[ii]).toBeCloseTo(betaDeg, 9);
			expect(anglesAt(level, joints, D, pose)[io]).toBeCloseTo(betaDeg, 9);
			// the upright also turned 25° about the link itself: the outer rod end's angle is the same
			const l = unit(sub(outer, inner));
			const spun: Record<string, number[]> = { ...pose };
			for (const n of UPRIGHT) spun[n] = turn(pose[n], outer, l, 25 / DEG);
			expect(anglesAt(level, joints, D, spun)[io]).toBeCloseTo(betaDeg, 9);
		}
	});
});

describe('through the sweeps', () => {
	it('a bolt set along the link’s swing: the angle is second order in the motion near design', () => {
		const result = jointAngles(club, {}, { heave: { from: -10, to: 10, step: 1 } });
		for (const name of ['spring.chassis', 'spring.body']) {
			const j = result.find((r) => r.point === name)!;
			const heave = j.sweeps.find((s) => s.sweep === 'heave')!;
			const at = (x: number) => heave.angles[heave.positions.indexOf(x)];
			expect(j.atDesign).toBeCloseTo(0, 9);
			// quadratic: ten times the travel, about a hundred times the angle (well over the linear ten)
			expect(at(10) / at(1)).toBeGreaterThan(50);
		}
	});

	it('each joint is judged against its limit: the engineer’s, else the default (common practice)', () => {
		const loose = jointAngles(club);
		const upper = loose.find((r) => r.point === 'upper.outer')!;
		expect(upper.limit).toBe(DEFAULT_LIMIT_DEG.ball);
		expect(upper.limitSet).toBe(false);
		const tight = jointAngles(club, { 'upper.outer': { limit: upper.max / 2 } }).find((r) => r.point === 'upper.outer')!;
		expect(tight.limitSet).toBe(true);
		expect(tight.pass).toBe(false);
		expect(tight.max).toBeCloseTo(upper.max, 12);
		// the largest angle is one of the sweep's own values, where it says
		const s = tight.sweeps.find((x) => x.sweep === tight.maxAt.sweep)!;
		expect(s.angles[s.positions.indexOf(tight.maxAt.position)]).toBe(tight.max);
	});
});
