// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, anti in percent.
// Anti-dive / anti-squat against the textbook side-view formulas computed by hand here
// (W. F. Milliken & D. L. Milliken, "Race Car Vehicle Dynamics", ch. 17, outboard brakes and
// independent drive through half-shafts), from a side-view instant centre drawn by hand.

import { describe, expect, it } from 'vitest';
import { solveSweep, type CornerInput } from '../../../src/lib/server/kinematics/index';
import { clone } from './helpers';

/**
 * A corner whose arm planes each contain the pivot axis and the y direction, so in the side
 * view (y = wheel-centre y) the lower line is z = 110 − 0.05 x and the upper z = 391 + 0.05 x:
 * they meet at x = −2810, z = 250.5 (by hand). Zero camber: C = (0, 740, 0).
 */
function sideViewCorner(vehicle: CornerInput['vehicle']): CornerInput {
	return {
		kind: 'double_wishbone',
		points: {
			'lower.front': [200, 300, 100],
			'lower.rear': [-200, 300, 120],
			'lower.outer': [0, 650, 110],
			'upper.front': [180, 380, 400],
			'upper.rear': [-220, 380, 380],
			'upper.outer': [0, 620, 391],
			'steer.inner': [-120, 320, 185],
			'steer.outer': [-120, 660, 180],
			'wheel.centre': [0, 740, 300],
			'wheel.axis_inner': [0, 640, 300]
		},
		tyre: { loaded_radius: 300 },
		vehicle
	};
}

const SVIC: [number, number] = [-2810, 250.5];
const design = (c: CornerInput) => solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];

describe('anti-dive / anti-squat (Milliken & Milliken, RCVD ch. 17)', () => {
	it('svic where the hand-drawn side-view lines meet', () => {
		const s = design(sideViewCorner(null));
		expect(s.svic![0]).toBeCloseTo(SVIC[0], 6);
		expect(s.svic![1]).toBeCloseTo(SVIC[1], 6);
		expect(s.anti_dive).toBeNull();
		expect(s.anti_squat).toBeNull();
	});

	it('front axle: anti-dive = fbf · (wheelbase / cg height) · tan(svic angle from C), percent', () => {
		const v = { axle: 'front' as const, wheelbase: 2500, cg_height: 500, front_brake_fraction: 0.7 };
		const s = design(sideViewCorner(v));
		const C = [0, 740, 0];
		const byHand = 100 * 0.7 * (2500 / 500) * ((SVIC[1] - C[2]) / (C[0] - SVIC[0]));
		expect(byHand).toBeCloseTo(31.2011, 3); // 350 · 250.5 / 2810
		expect(s.anti_dive).toBeCloseTo(byHand, 6);
		expect(s.anti_squat).toBeNull();
	});

	it('rear axle: anti-squat = rdf · (wheelbase / cg height) · slope from the wheel centre, percent', () => {
		const v = { axle: 'rear' as const, wheelbase: 2500, cg_height: 500, rear_drive_fraction: 0.8 };
		const s = design(sideViewCorner(v));
		const W = [0, 740, 300];
		const byHand = 100 * 0.8 * (2500 / 500) * ((SVIC[1] - W[2]) / (SVIC[0] - W[0]));
		expect(s.anti_squat).toBeCloseTo(byHand, 6);
		expect(s.anti_dive).toBeNull();
		// rear_drive_fraction defaults to 1
		const d = design(sideViewCorner({ axle: 'rear', wheelbase: 2500, cg_height: 500 }));
		expect(d.anti_squat).toBeCloseTo(byHand / 0.8, 6);
	});

	it('parallel side-view lines: svic null and so anti-dive null', () => {
		const c = clone(sideViewCorner({ axle: 'front', wheelbase: 2500, cg_height: 500, front_brake_fraction: 0.6 }));
		c.points['upper.front'] = [180, 380, 382];
		c.points['upper.rear'] = [-220, 380, 402];
		c.points['upper.outer'] = [0, 620, 391];
		const s = design(c);
		expect(s.svic).toBeNull();
		expect(s.anti_dive).toBeNull();
	});
});
