// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Contract definitions checked from the outside: roll sign, contact on the rolled ground,
// camber_ground, motion ratio against a finite difference of spring length, nulls.

import { describe, expect, it } from 'vitest';
import { solveSweep, springInstalledLength, type CornerInput } from '../../../src/lib/server/kinematics/index';
import { clone, DEG, dot, fixture, norm, sub } from './helpers';
import { byContract } from './independent';

const NAMES = ['club-fwd-front-left', 'club-fwd-front-right', 'road-strut-front-left', 'single-seater-front-left'];

describe('roll (contract: positive roll puts the left side down)', () => {
	it('left wheel goes into bump and right into rebound for positive roll', () => {
		for (const [name, s] of [['club-fwd-front-left', 1], ['club-fwd-front-right', -1]] as const) {
			const c = fixture(name);
			const z0 = c.points['wheel.centre'][2];
			const { samples } = solveSweep(c, { sweep: 'roll', from: 2, to: 2, step: 1 });
			expect(Math.sign(samples[0].wheel_centre[2] - z0)).toBe(s);
		}
	});

	it('the contact point lies on the rolled ground (normal (0, −sin r, cos r) through the origin)', () => {
		for (const name of NAMES) {
			const { samples } = solveSweep(fixture(name), { sweep: 'roll', from: -3, to: 3, step: 1 });
			for (const s of samples) {
				const r = s.roll! / DEG;
				expect(Math.abs(dot(s.contact_patch, [0, -Math.sin(r), Math.cos(r)]))).toBeLessThan(1e-6);
			}
		}
	});

	it('camber_ground = camber + s · roll in roll, null in heave and steer; rc_height only in heave', () => {
		for (const [name, s] of [['club-fwd-front-left', 1], ['club-fwd-front-right', -1]] as const) {
			const roll = solveSweep(fixture(name), { sweep: 'roll', from: -3, to: 3, step: 1.5 }).samples;
			for (const x of roll) {
				expect(x.camber_ground).toBeCloseTo(x.camber + s * x.roll!, 12);
				expect(x.rc_height).toBeNull();
			}
			for (const sweep of ['heave', 'steer'] as const) {
				const xs = solveSweep(fixture(name), { sweep, from: -10, to: 10, step: 10 }).samples;
				for (const x of xs) expect(x.camber_ground).toBeNull();
				for (const x of xs) expect(x.rc_height === null).toBe(sweep === 'steer');
			}
		}
	});
});

/** Spring length (mm) from a sample's solved points. */
function springLength(s: { points?: Record<string, number[]> }): number {
	return norm(sub(s.points!['spring.body'], s.points!['spring.chassis']));
}

describe('motion ratio = −d(spring length)/d(travel), central difference ±0.01 mm (contract)', () => {
	const variants: [string, CornerInput][] = NAMES.map((n) => [n, fixture(n)]);
	const upper = clone(fixture('club-fwd-front-left'));
	upper.spring_on = 'upper';
	upper.points['spring.body'] = [-10, 560, 455];
	upper.points['spring.chassis'] = [-20, 470, 640];
	variants.push(['club car with the spring on the upper arm', upper]);
	for (const [label, c] of variants) {
		it(label, () => {
			for (const t of [-40, 0, 35]) {
				const h = 0.01;
				const { samples } = solveSweep(c, { sweep: 'heave', from: t - h, to: t + h, step: h, points: true });
				expect(samples).toHaveLength(3);
				const fd = -(springLength(samples[2]) - springLength(samples[0])) / (2 * h);
				expect(samples[1].motion_ratio!).toBeCloseTo(fd, 6);
				expect(samples[1].spring_length!).toBeCloseTo(springLength(samples[1]), 9);
			}
		});
	}

	it('in roll and steer the ratio is still the heave derivative at that pose (rack held)', () => {
		const c = fixture('club-fwd-front-left');
		const roll = solveSweep(c, { sweep: 'roll', from: 2, to: 2, step: 1, points: true }).samples[0];
		const t = roll.wheel_centre[2] - c.points['wheel.centre'][2];
		const h = 0.01;
		const heave = solveSweep(c, { sweep: 'heave', from: t - h, to: t + h, step: h, points: true }).samples;
		expect(roll.motion_ratio!).toBeCloseTo(-(springLength(heave[2]) - springLength(heave[0])) / (2 * h), 6);
	});

	it('null without spring points; installed length by hand', () => {
		const c = clone(fixture('club-fwd-front-left'));
		const [sc, sb] = [c.points['spring.chassis'], c.points['spring.body']];
		expect(springInstalledLength(c)).toBeCloseTo(norm(sub(sb, sc)), 12);
		delete c.points['spring.chassis'];
		delete c.points['spring.body'];
		expect(solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].motion_ratio).toBeNull();
		expect(springInstalledLength(c)).toBeNull();
	});
});

describe('toe and camber across a steer sweep = independent general-purpose solver (mathjs) + the contract\'s formulas', () => {
	// the wheel axis is taken from the reference route's pose (independent.ts), never from the engine's own points
	it('camber = −asin(a_z), toe = atan2(a_x, |a_y|) with a the outboard spin axis of the independent pose', () => {
		for (const name of NAMES) {
			const c = fixture(name);
			const { samples } = solveSweep(c, { sweep: 'steer', from: -40, to: 40, step: 20 });
			for (const s of samples) {
				const x = byContract(c, 'steer', s.rack!);
				expect(Math.abs(s.camber - x.camber), `${name} camber at rack ${s.rack}`).toBeLessThan(1e-7);
				expect(Math.abs(s.toe - x.toe), `${name} toe at rack ${s.rack}`).toBeLessThan(1e-7);
			}
			// away from design the toe really changes (bump steer's steering counterpart), so design values would fail
			expect(Math.abs(samples[0].toe - samples[2].toe)).toBeGreaterThan(1);
		}
	});
});
