// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Bump steer: a tie rod whose line passes through the front-view instant centre gives
// near-zero toe change for small travel. This is common practice in suspension layout
// (no single published source is cited here); to first order it follows from the upright
// turning about the instant centre in the front view.

import { describe, expect, it } from 'vitest';
import { solveSweep } from '../../../src/lib/server/kinematics/index';
import { clone, planarCorner } from './helpers';

/** The planar corner with a steering arm 120 mm behind the axle at (y, z) = (660, 200). */
function withTieRodInnerAt(y: number, z: number) {
	const c = clone(planarCorner());
	c.points['steer.outer'] = [-120, 660, 200];
	c.points['steer.inner'] = [-120, y, z];
	return c;
}

/** Toe slope at design, degrees per mm, by central difference over ±0.5 mm. */
function toeSlope(c: ReturnType<typeof withTieRodInnerAt>): number {
	const { samples } = solveSweep(c, { sweep: 'heave', from: -0.5, to: 0.5, step: 0.5 });
	return (samples[2].toe - samples[0].toe) / 1;
}

describe('bump steer (common practice: tie-rod line through the front-view instant centre)', () => {
	// fvic of planarCorner is (y, z) = (-1500, 0); the inner joint goes on the line to it
	const onLine = (y: number): number => (200 * (y + 1500)) / (660 + 1500);

	it('tie rod pointing at the fvic: toe slope at design below 1e-6 °/mm', () => {
		expect(Math.abs(toeSlope(withTieRodInnerAt(300, onLine(300))))).toBeLessThan(1e-6);
	});

	it('the same tie rod raised 20 mm at the rack: clearly more bump steer', () => {
		expect(Math.abs(toeSlope(withTieRodInnerAt(300, onLine(300) + 20)))).toBeGreaterThan(1e-3);
	});

	it('stock fixture vs rack-moved fixture: toe change over ±40 mm, about 0.1° against 1–2°', async () => {
		const { fixture } = await import('./helpers');
		const spread = (name: string): number => {
			const t = solveSweep(fixture(name), { sweep: 'heave', from: -40, to: 40, step: 5 }).samples.map((s) => s.toe);
			return Math.max(...t) - Math.min(...t);
		};
		expect(spread('club-fwd-front-left')).toBeLessThan(0.1);
		const moved = spread('club-fwd-front-left-rack-moved');
		expect(moved).toBeGreaterThan(1);
		expect(moved).toBeLessThan(4);
	});
});
