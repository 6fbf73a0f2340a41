// Frame: ISO 8855 vehicle axes, x forward, y left, z up; mm, degrees.
// A ride-height change (issue 19, item 5) against the heave sweep: the corner lowered by N mm, solved at its new
// design position, gives the figures the old corner's heave sweep gives at +N mm of bump (issue 19: "the same
// figures"), and every chassis point moves down by N.
import { describe, expect, it } from 'vitest';
import { solveSweep, type CornerInput } from '../../../src/lib/server/kinematics/index';
import { atRideHeight, rakeAngle, wheelbaseOf } from '../../../src/lib/server/kinematics/ride-height';
import { fixture } from './helpers';

// Figures of the wheel against the chassis, the same in both; the ground-referenced ones are checked below.
const KEYS = ['camber', 'toe', 'caster', 'kpi', 'motion_ratio'] as const;
/** The steering axis's two points where a kind has them (the contract: through the ball joints or the strut top). */
const AXIS: Record<string, [string, string]> = { double_wishbone: ['lower.outer', 'upper.outer'], strut: ['lower.outer', 'strut.top'] };

describe('ride height as a new design position', () => {
	it.each([
		['club-fwd-front-left', -20],
		['club-fwd-front-left', 15],
		['single-seater-front-left-pushrod', -12],
		['single-seater-rear-left-five-link', -10],
		['road-strut-front-left', -25]
	])('%s, ride height %d mm: the new design figures are the heave sweep’s at −change', (name, change) => {
		const corner = fixture(name) as unknown as CornerInput;
		const lowered = atRideHeight(corner, change).corner;
		const now = solveSweep(lowered, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		const was = solveSweep(corner, { sweep: 'heave', from: -change, to: -change, step: 1 }).samples[0];
		for (const k of KEYS) {
			if (was[k] === null) expect(now[k], k).toBeNull();
			else expect(now[k] as number, k).toBeCloseTo(was[k] as number, 6);
		}
		// The contract measures heights, scrub and trail against the plane z = 0: in the heave sweep that is the old
		// ground, at the new design the new one, change mm away: the roll centre's height moves with the points by the
		// change; scrub and trail follow the contract's wording at the new ground.
		if (was.rc_height !== null) expect(now.rc_height!).toBeCloseTo(was.rc_height + change, 6);
		const axis = AXIS[corner.kind];
		if (axis) {
			const pts = solveSweep(corner, { sweep: 'heave', from: -change, to: -change, step: 1, points: true }).samples[0].points!;
			const [a, b] = [pts[axis[0]], pts[axis[1]]];
			const z = -change; // the new ground in the old chassis coordinates
			const t = (z - a[2]) / (b[2] - a[2]);
			const G = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
			const C = was.contact_patch;
			const side = Math.sign(was.wheel_centre[1]);
			expect(now.scrub_radius!).toBeCloseTo(side * (C[1] - G[1]), 4);
			expect(now.trail!).toBeCloseTo(G[0] - C[0], 4);
		}
		// the chassis comes down by the change; the wheel centre stays at its height above the ground
		const fixed = ['lower.front', 'spring.chassis'].find((n) => corner.points[n])!; // a point on the chassis
		expect(lowered.points[fixed][2]).toBeCloseTo((corner.points[fixed] as number[])[2] + change, 9);
		expect(now.wheel_centre[2]).toBeCloseTo(was.wheel_centre[2] + change, 6);
		expect(now.contact_patch[2]).toBeCloseTo(was.contact_patch[2] + change, 6);
	});
});

describe('rake of the whole car', () => {
	it('the rear left higher than the front by wheelbase · tan 1° pitches the body 1° nose down (right-angled triangle)', () => {
		expect(rakeAngle(0, 2500 * Math.tan(Math.PI / 180), 2500)).toBeCloseTo(1, 12);
		expect(rakeAngle(-20, -20, 2500)).toBe(0);
		// the front raised more: nose up
		expect(rakeAngle(10, 0, 2500)).toBeLessThan(0);
	});

	it('the wheelbase from the wheel centres: mean front x less mean rear x; none without both axles', () => {
		expect(wheelbaseOf([[1300, 700, 290], [1310, -700, 290]], [[-1295, 690, 300]])).toBe(2600);
		expect(wheelbaseOf([[1300, 700, 290]], [])).toBeNull();
		// axles the wrong way round give no wheelbase
		expect(wheelbaseOf([[-1300, 700, 290]], [[1300, 700, 290]])).toBeNull();
	});
});
