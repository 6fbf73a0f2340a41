// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// An independent general-purpose route gives the same poses: the reference solver runs a
// full 6-degree-of-freedom Newton on the raw joint constraints with a numerical Jacobian,
// mathjs `expm` for rotations and mathjs `lusolve` for each step. Positions must agree
// within 1e-6 mm with the engine's closed-form chain.

import { describe, expect, it } from 'vitest';
import { solveSweep, type SweepKind } from '../../../src/lib/server/kinematics/index';
import { referenceSweep } from '../../../src/lib/server/kinematics/reference-solver';
import { fixture } from './helpers';

const CASES: [string, SweepKind, number, number, number][] = [
	['club-fwd-front-left', 'heave', -80, 80, 10],
	['club-fwd-front-left', 'roll', -3, 3, 1],
	['club-fwd-front-left', 'steer', -40, 40, 10],
	['club-fwd-front-right', 'roll', -3, 3, 1.5],
	['road-strut-front-left', 'heave', -80, 80, 10],
	['road-strut-front-left', 'roll', -3, 3, 1],
	['road-strut-front-left', 'steer', -40, 40, 10],
	['single-seater-front-left', 'heave', -50, 50, 10],
	['single-seater-rear-left', 'heave', -50, 50, 10],
	['cannot-assemble', 'heave', -50, 25, 5],
	['single-seater-rear-left-five-link', 'heave', -80, 80, 10],
	['single-seater-rear-left-five-link', 'roll', -3, 3, 1],
	['single-seater-rear-left-five-link', 'steer', -20, 20, 10],
	['road-rear-left-semi-trailing', 'heave', -80, 80, 10],
	['road-rear-left-semi-trailing', 'roll', -3, 3, 1],
	['single-seater-front-left-pushrod', 'heave', -50, 50, 10]
];

/** The upright points the reference reports, by kind (lower joint, second point, steer joint). */
const NAMES: Record<string, [string, string, string]> = {
	double_wishbone: ['lower.outer', 'upper.outer', 'steer.outer'],
	strut: ['lower.outer', 'strut.lower', 'steer.outer'],
	multi_link: ['lower_front.outer', 'upper_front.outer', 'steer.outer'],
	semi_trailing: ['arm.front', 'arm.rear', 'wheel.centre']
};

describe('engine poses = general mathjs 6-DOF Newton route (within 1e-6 mm)', () => {
	for (const [name, sweep, from, to, step] of CASES) {
		it(`${name}, ${sweep} ${from}…${to} by ${step}`, () => {
			const corner = fixture(name);
			const { samples, error } = solveSweep(corner, { sweep, from, to, step, points: true });
			expect(error).toBeNull();
			const positions = samples.map((s) => (s.travel ?? s.roll ?? s.rack) as number);
			const ref = referenceSweep(corner, sweep, positions);
			const [lower, second, steer] = NAMES[corner.kind];
			samples.forEach((s, i) => {
				const r = ref.poses[i];
				expect(r).not.toBeNull();
				const pairs: [number[], number[]][] = [
					[s.points![lower], r!.lowerOuter],
					[s.points![second], r!.second],
					[s.points![steer], r!.steerOuter],
					[s.wheel_centre, r!.wheelCentre],
					[s.points!['wheel.axis_inner'], r!.axisInner]
				];
				for (const [a, b] of pairs) for (let k = 0; k < 3; k++) expect(Math.abs(a[k] - b[k])).toBeLessThan(1e-6);
			});
		});
	}

	it('cannot-assemble: the general route also fails beyond the engine’s last solved travel', () => {
		const corner = fixture('cannot-assemble');
		const { samples, error } = solveSweep(corner, { sweep: 'heave', from: 0, to: 50, step: 5 });
		expect(error).not.toBeNull();
		const last = samples[samples.length - 1].travel!;
		const ref = referenceSweep(corner, 'heave', [last, error!.position]);
		expect(ref.poses[0]).not.toBeNull();
		expect(ref.poses[1]).toBeNull();
	});
});
