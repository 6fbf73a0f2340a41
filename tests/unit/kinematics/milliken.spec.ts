// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Front-view geometry checks from W. F. Milliken & D. L. Milliken, "Race Car Vehicle
// Dynamics" (SAE, 1995), ch. 17 (suspension geometry): equal parallel arms keep camber
// constant; camber gain is 1/fvsa rad per unit of travel; parallel horizontal arms put the
// roll centre on the ground.

import { describe, expect, it } from 'vitest';
import { solveSweep, type CornerInput } from '../../../src/lib/server/kinematics/index';
import { clone, DEG, planarCorner } from './helpers';

/** A parallelogram corner: upper arm = lower arm shifted by the upright vector (mm); optionally horizontal. */
function parallelCorner(horizontal: boolean): CornerInput {
	const c = planarCorner();
	const P = c.points;
	const lowerPivotZ = horizontal ? 120 : 100;
	P['lower.front'] = [150, 250, lowerPivotZ];
	P['lower.rear'] = [-150, 250, lowerPivotZ];
	const up = [-0, -10, 300]; // upright vector lower.outer → upper.outer
	P['upper.outer'] = [0, 650 + up[1], 120 + up[2]];
	P['upper.front'] = [150, 250 + up[1], lowerPivotZ + up[2]];
	P['upper.rear'] = [-150, 250 + up[1], lowerPivotZ + up[2]];
	P['steer.inner'] = [-120, 250, lowerPivotZ];
	return c;
}

describe('front-view geometry (Milliken & Milliken, Race Car Vehicle Dynamics, ch. 17)', () => {
	it('equal, parallel arms: no camber change over ±60 mm of travel', () => {
		const { samples, error } = solveSweep(parallelCorner(false), { sweep: 'heave', from: -60, to: 60, step: 10 });
		expect(error).toBeNull();
		for (const s of samples) expect(Math.abs(s.camber - 0)).toBeLessThan(1e-9);
		// the same arms, shortened upper arm: camber does change (the check can fail)
		const short = parallelCorner(false);
		short.points['upper.front'][1] += 60;
		short.points['upper.rear'][1] += 60;
		const r = solveSweep(short, { sweep: 'heave', from: 40, to: 40, step: 1 });
		expect(Math.abs(r.samples[0].camber)).toBeGreaterThan(0.1);
	});

	it('camber gain at design = 1/fvsa rad per mm of travel (fvic at ground height, zero camber)', () => {
		const corner = planarCorner();
		const h = 0.01;
		const { samples } = solveSweep(corner, { sweep: 'heave', from: -h, to: h, step: h });
		expect(samples.map((s) => s.travel)).toEqual([-h, 0, h]);
		const design = samples[1];
		// arm lines were drawn through (y, z) = (-1500, 0): fvsa = 740 + 1500 by hand
		expect(design.fvic![0]).toBeCloseTo(-1500, 6);
		expect(design.fvic![1]).toBeCloseTo(0, 6);
		expect(design.fvsa).toBeCloseTo(2240, 6);
		const gainRadPerMm = (samples[2].camber - samples[0].camber) / DEG / (2 * h);
		// negative: in bump the top of a left wheel swings inboard about an inboard fvic
		expect(gainRadPerMm / (-1 / 2240) - 1).toBeCloseTo(0, 5);
	});

	it('parallel horizontal arms: fvic at infinity (null) and the roll centre on the ground', () => {
		const { samples } = solveSweep(parallelCorner(true), { sweep: 'heave', from: 0, to: 0, step: 1 });
		expect(samples[0].fvic).toBeNull();
		expect(samples[0].fvsa).toBeNull();
		expect(samples[0].rc_height).not.toBeNull();
		expect(Math.abs(samples[0].rc_height!)).toBeLessThan(1e-9);
	});

	it('inclined arms: fvic and roll centre where the lines drawn by hand meet', () => {
		const c = clone(planarCorner());
		// raise the lower arm's inner pivots 30 mm; the upper arm line is unchanged
		for (const k of ['lower.front', 'lower.rear', 'steer.inner']) c.points[k][2] += 30;
		const s = solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		// by hand, in the front view (y, z): lower line through the pivot and lower.outer,
		// upper line through (-1500, 0) and upper.outer; C = (740, 0) with zero camber
		const [py, pz] = [250, c.points['lower.front'][2]];
		const m1 = (120 - pz) / (650 - py);
		const m2 = 420 / 2140;
		const fy = (pz - m1 * py - 1500 * m2) / (m2 - m1);
		const fz = m2 * (fy + 1500);
		expect(s.fvic![0]).toBeCloseTo(fy, 6);
		expect(s.fvic![1]).toBeCloseTo(fz, 6);
		const rc = (fz * (0 - 740)) / (fy - 740);
		expect(s.rc_height).toBeCloseTo(rc, 6);
		expect(rc).toBeGreaterThan(0);
	});
});
