// Combined-motion maps (src/lib/server/kinematics/maps.ts) against the engine's own single sweeps, reached by another
// route: with no heave the heave × roll map is the roll sweep (the engine drives the contact point onto the rolled
// ground itself; the map finds the wheel travel that puts it there from a heave sweep); at no wheel travel the
// wheel travel × rack travel map is the steer sweep (which walks the rack at a held wheel height).
import { describe, expect, it } from 'vitest';
import { motionMap } from '../../../src/lib/server/kinematics/maps';
import { solveSweep } from '../../../src/lib/server/kinematics/index';
import { fixture } from './helpers';

describe('motion maps', () => {
	for (const name of ['club-fwd-front-left', 'club-fwd-front-right', 'road-strut-front-left', 'single-seater-rear-left-five-link']) {
		it(`${name}: heave × roll at no heave is the roll sweep (toe, camber, camber to the ground)`, () => {
			const corner = fixture(name);
			const map = motionMap(corner, 'heave_roll', { from: -30, to: 30, step: 10 }, { from: -3, to: 3, step: 0.5 });
			const ix = map.x.indexOf(0);
			const roll = solveSweep(corner, { sweep: 'roll', from: -3, to: 3, step: 0.5 }).samples;
			expect(roll).toHaveLength(map.y.length);
			map.y.forEach((phi, iy) => {
				const s = roll.find((r) => Math.abs(r.roll! - phi) < 1e-9)!;
				// linear interpolation on a 0.5 mm grid: well within a thousandth of a degree
				expect(Math.abs(map.values.toe[iy][ix]! - s.toe)).toBeLessThan(1e-3);
				expect(Math.abs(map.values.camber[iy][ix]! - s.camber)).toBeLessThan(1e-3);
				expect(Math.abs(map.values.camber_ground[iy][ix]! - s.camber_ground!)).toBeLessThan(1e-3);
			});
			// heave moves the wheel: the map is not one row repeated
			const iy0 = map.y.indexOf(0);
			expect(Math.abs(map.values.camber[iy0][0]! - map.values.camber[iy0][map.x.length - 1]!)).toBeGreaterThan(0.1);
		});
	}

	it('wheel travel × rack travel at no wheel travel is the steer sweep; each row is a heave sweep at that rack', () => {
		const corner = fixture('club-fwd-front-left');
		const map = motionMap(corner, 'heave_steer', { from: -40, to: 40, step: 10 }, { from: -30, to: 30, step: 10 });
		const ix = map.x.indexOf(0);
		const steer = solveSweep(corner, { sweep: 'steer', from: -30, to: 30, step: 10 }).samples;
		map.y.forEach((r, iy) => {
			const s = steer.find((q) => q.rack === r)!;
			expect(map.values.toe[iy][ix]).toBeCloseTo(s.toe, 6);
			expect(map.values.camber[iy][ix]).toBeCloseTo(s.camber, 6);
		});
		const atLock = solveSweep(corner, { sweep: 'heave', from: -40, to: 40, step: 10, rack: 30 }).samples;
		expect(map.values.toe[map.y.indexOf(30)]).toEqual(atLock.map((s) => s.toe));
	});

	it('a grid point the corner cannot reach is null, not a number', () => {
		const corner = fixture('club-fwd-front-left');
		const map = motionMap(corner, 'heave_steer', { from: -40, to: 40, step: 40 }, { from: -400, to: 0, step: 400 });
		expect(map.values.toe[0].every((v) => v === null)).toBe(true);
		expect(map.values.toe[1].every((v) => typeof v === 'number')).toBe(true);
	});
});
