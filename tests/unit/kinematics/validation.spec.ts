// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// The shared corner-geometry/1 schema: every bad input gives one line naming its field
// (contract: "Bad input exits 1 with one line on stderr naming the field").

import { describe, expect, it } from 'vitest';
import { parseCornerGeometry, sweepOptionsSchema } from '../../../src/lib/schemas/geometry';
import { CornerGeometryError, solveSweep, SweepOptionsError } from '../../../src/lib/server/kinematics/index';
import { clone, fixture } from './helpers';

type Edit = (c: Record<string, any>) => void;

/** The one-line message for a fixture edited by `edit`, or 'OK'. */
function messageFor(edit: Edit, name = 'club-fwd-front-left'): string {
	const c = clone(fixture(name)) as Record<string, any>;
	c.format = 'corner-geometry/1';
	edit(c);
	const r = parseCornerGeometry(c);
	return r.ok ? 'OK' : r.message;
}

const CASES: [string, Edit, RegExp][] = [
	['unknown kind', (c) => (c.kind = 'trailing_arm'), /^kind: unknown kind "trailing_arm"/],
	['missing point', (c) => delete c.points['upper.outer'], /^points\.upper\.outer: missing$/],
	['non-finite coordinate', (c) => (c.points['lower.front'][1] = Infinity), /^points\.lower\.front\.1: /],
	['coordinate not a number', (c) => (c.points['lower.front'][2] = '12'), /^points\.lower\.front\.2: /],
	['point with two coordinates', (c) => (c.points['steer.inner'] = [1, 2]), /^points\.steer\.inner/],
	['coincident lower pivots', (c) => (c.points['lower.rear'] = [...c.points['lower.front']]), /^points\.lower\.rear: coincides with lower\.front/],
	['coincident upper pivots', (c) => (c.points['upper.front'] = [...c.points['upper.rear']]), /^points\.upper\.rear: coincides/],
	['zero-length lower arm (ball joint on the pivot axis)', (c) => (c.points['lower.outer'] = [0, 339.5, 129.7]), /^points\.lower\.outer: lies on the lower arm pivot axis/],
	['zero-length tie rod', (c) => (c.points['steer.inner'] = [...c.points['steer.outer']]), /^points\.steer\.outer: coincides with steer\.inner/],
	['zero-length upright', (c) => (c.points['upper.outer'] = [...c.points['lower.outer']]), /^points\.upper\.outer: coincides with lower\.outer/],
	['zero-length spin axis', (c) => (c.points['wheel.axis_inner'] = [...c.points['wheel.centre']]), /^points\.wheel\.axis_inner: coincides with wheel\.centre/],
	['spin axis pointing inboard', (c) => (c.points['wheel.axis_inner'][1] = 820), /^points\.wheel\.axis_inner: must lie inboard/],
	['wheel on the centreline', (c) => (c.points['wheel.centre'][1] = 0), /^points\.wheel\.centre: /],
	['tyre radius too small', (c) => (c.tyre.loaded_radius = 20), /^tyre\.loaded_radius: /],
	['tyre radius too large', (c) => (c.tyre.loaded_radius = 5000), /^tyre\.loaded_radius: /],
	['tyre missing', (c) => delete c.tyre, /^tyre: /],
	['unknown spring_on', (c) => (c.spring_on = 'frame'), /^spring_on: /],
	['spring points without spring_on', (c) => delete c.spring_on, /^spring_on: required/],
	['one spring end only', (c) => delete c.points['spring.chassis'], /^points\.spring\.chassis: missing/],
	['zero-length spring', (c) => (c.points['spring.body'] = [...c.points['spring.chassis']]), /^points\.spring\.body: coincides/],
	['vehicle without axle', (c) => delete c.vehicle.axle, /^vehicle\.axle: /],
	['vehicle wheelbase not > 0', (c) => (c.vehicle.wheelbase = 0), /^vehicle\.wheelbase: must be > 0/],
	['vehicle cg height negative', (c) => (c.vehicle.cg_height = -1), /^vehicle\.cg_height: must be > 0/],
	['front axle without brake fraction', (c) => delete c.vehicle.front_brake_fraction, /^vehicle\.front_brake_fraction: required on a front axle/],
	['brake fraction above 1', (c) => (c.vehicle.front_brake_fraction = 1.2), /^vehicle\.front_brake_fraction: /],
	['drive fraction below 0', (c) => (c.vehicle.rear_drive_fraction = -0.1), /^vehicle\.rear_drive_fraction: /],
	['design contact point 10 mm above ground', (c) => (c.points['wheel.centre'][2] += 10) && (c.points['wheel.axis_inner'][2] += 10), /^points\.wheel\.centre: design contact point is 10\.0 mm off/],
	['wrong format', (c) => (c.format = 'corner-geometry/2'), /^format: /]
];

describe('corner-geometry/1 validation names the field', () => {
	it('every fixture is valid', () => {
		for (const n of ['club-fwd-front-left', 'club-fwd-front-right', 'club-fwd-front-left-rack-moved', 'road-strut-front-left', 'single-seater-front-left', 'single-seater-rear-left', 'cannot-assemble'])
			expect(messageFor(() => {}, n)).toBe('OK');
	});
	for (const [label, edit, re] of CASES) {
		it(label, () => {
			const m = messageFor(edit);
			expect(m).toMatch(re);
			expect(m).not.toContain('\n');
		});
	}
	it('strut: strut points required, upper arm not; spring on the upper arm refused', () => {
		expect(messageFor((c) => delete c.points['strut.top'], 'road-strut-front-left')).toBe('points.strut.top: missing');
		expect(messageFor((c) => (c.spring_on = 'upper'), 'road-strut-front-left')).toMatch(/^spring_on: /);
		expect(messageFor((c) => (c.points['strut.lower'] = [...c.points['strut.top']]), 'road-strut-front-left')).toMatch(/^points\.strut\.lower: coincides with strut\.top/);
	});
	it('vehicle null or absent is allowed', () => {
		expect(messageFor((c) => (c.vehicle = null))).toBe('OK');
		expect(messageFor((c) => delete c.vehicle)).toBe('OK');
	});
	it('sweep options: step > 0 and from <= to', () => {
		expect(sweepOptionsSchema.safeParse({ sweep: 'heave', from: 0, to: 1, step: 0 }).success).toBe(false);
		expect(sweepOptionsSchema.safeParse({ sweep: 'heave', from: 2, to: 1, step: 1 }).success).toBe(false);
		expect(sweepOptionsSchema.safeParse({ sweep: 'pitch', from: 0, to: 1, step: 1 }).success).toBe(false);
		expect(sweepOptionsSchema.safeParse({ sweep: 'roll', from: -1, to: 1, step: 0.5 }).success).toBe(true);
	});
});

describe('engine refuses what it cannot model, with typed errors', () => {
	it('bad sweep options throw SweepOptionsError naming the option', () => {
		const c = fixture('club-fwd-front-left');
		expect(() => solveSweep(c, { sweep: 'heave', from: 0, to: 1, step: 0 })).toThrow(SweepOptionsError);
		expect(() => solveSweep(c, { sweep: 'heave', from: 1, to: 0, step: 1 })).toThrow(/^from: /);
		expect(() => solveSweep(c, { sweep: 'heave', from: 0, to: NaN, step: 1 })).toThrow(/^to: /);
	});
	it('degenerate geometry throws CornerGeometryError naming the field', () => {
		const c = clone(fixture('club-fwd-front-left'));
		c.points['wheel.axis_inner'] = [...c.points['wheel.centre']];
		expect(() => solveSweep(c, { sweep: 'heave', from: 0, to: 1, step: 1 })).toThrow(CornerGeometryError);
		delete c.points['lower.rear'];
		expect(() => solveSweep(c, { sweep: 'heave', from: 0, to: 1, step: 1 })).toThrow(/^points\.lower\.rear: missing/);
	});
});
