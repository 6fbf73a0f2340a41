// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Sweep mechanics of the contract: grid, ascending order, continuation from design in both
// directions (no branch jumps), partial results with the error, heave at a chosen rack.

import { describe, expect, it } from 'vitest';
import { CornerSolver, solveSweep } from '../../../src/lib/server/kinematics/index';
import { fixture } from './helpers';

describe('sweeps', () => {
	it('a range away from design gives the same poses as the full sweep (continuation from design)', () => {
		const c = fixture('club-fwd-front-left');
		const full = solveSweep(c, { sweep: 'heave', from: -80, to: 80, step: 10 }).samples;
		const far = solveSweep(c, { sweep: 'heave', from: 60, to: 80, step: 10 }).samples;
		expect(far.map((s) => s.travel)).toEqual([60, 70, 80]);
		far.forEach((s, i) => {
			const f = full[14 + i];
			expect(f.travel).toBe(s.travel);
			for (let k = 0; k < 3; k++) expect(s.wheel_centre[k]).toBeCloseTo(f.wheel_centre[k], 8);
			expect(s.toe).toBeCloseTo(f.toe, 8);
		});
	});

	it('samples ascend and the wheel centre follows the travel exactly', () => {
		const c = fixture('single-seater-front-left');
		const z0 = c.points['wheel.centre'][2];
		const { samples } = solveSweep(c, { sweep: 'heave', from: -80, to: 80, step: 1 });
		expect(samples).toHaveLength(161);
		samples.forEach((s, i) => {
			if (i > 0) expect(s.travel!).toBeGreaterThan(samples[i - 1].travel!);
			expect(s.wheel_centre[2] - z0).toBeCloseTo(s.travel!, 8);
		});
	});

	it('steer: the wheel-centre height is held at design', () => {
		const c = fixture('road-strut-front-left');
		for (const s of solveSweep(c, { sweep: 'steer', from: -40, to: 40, step: 10 }).samples)
			expect(s.wheel_centre[2]).toBeCloseTo(c.points['wheel.centre'][2], 8);
	});

	it('heave at a chosen rack position equals the steer sweep at that rack for travel 0', () => {
		const c = fixture('club-fwd-front-left');
		const steer = solveSweep(c, { sweep: 'steer', from: 15, to: 15, step: 1 }).samples[0];
		const heave = solveSweep(c, { sweep: 'heave', from: -10, to: 10, step: 10, rack: 15 }).samples;
		expect(heave[1].toe).toBeCloseTo(steer.toe, 8);
		expect(heave[1].camber).toBeCloseTo(steer.camber, 8);
		expect(Math.abs(heave[1].toe - solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].toe)).toBeGreaterThan(1);
	});

	it('cannot assemble: the solved part is returned with the link and the position', () => {
		const { samples, error } = solveSweep(fixture('cannot-assemble'), { sweep: 'heave', from: -50, to: 50, step: 5 });
		// the lower arm carries the wheel over its highest point at about 28.9 mm of bump
		expect(error).toEqual({ link: 'lower arm', position: 30, sweep: 'heave', message: 'lower arm cannot be assembled at travel 30 mm' });
		expect(samples[0].travel).toBe(-50);
		expect(samples[samples.length - 1].travel).toBe(25);
		for (const s of samples) for (const v of Object.values(s)) expect(JSON.stringify(v)).not.toMatch(/NaN|Infinity/);
	});

	it('a too-short tie rod binds in steer and names the tie rod', () => {
		const { error, samples } = solveSweep(fixture('club-fwd-front-left'), { sweep: 'steer', from: -200, to: 0, step: 10 });
		expect(error?.link).toBe('tie rod');
		expect(error!.position).toBeLessThan(0);
		expect(samples.length).toBeGreaterThan(0);
		expect(samples[0].rack).toBeGreaterThan(error!.position);
	});

	it('optional points per sample only when asked; a reused solver gives the same numbers', () => {
		const c = fixture('road-strut-front-left');
		const plain = solveSweep(c, { sweep: 'heave', from: -10, to: 10, step: 10 }).samples;
		expect(plain[0]).not.toHaveProperty('points');
		const solver = new CornerSolver(c);
		solver.sweep({ sweep: 'roll', from: -3, to: 3, step: 1 });
		const again = solver.sweep({ sweep: 'heave', from: -10, to: 10, step: 10, points: true }).samples;
		expect(Object.keys(again[0].points!).sort()).toEqual(
			['lower.front', 'lower.rear', 'lower.outer', 'strut.top', 'strut.lower', 'steer.inner', 'steer.outer', 'wheel.centre', 'wheel.axis_inner', 'spring.chassis', 'spring.body'].sort()
		);
		again.forEach((s, i) => expect(s.camber).toBe(plain[i].camber));
	});
});
