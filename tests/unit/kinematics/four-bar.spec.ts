// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians.
// A planar double wishbone is a four-bar linkage: lower arm = crank, upright = coupler,
// upper arm = rocker, chassis = ground link. The coupler angle against the crank angle must
// match the closed-form four-bar position solution from Freudenstein's equation
// (R. L. Norton, "Design of Machinery", ch. 4, position analysis of the fourbar linkage).

import { describe, expect, it } from 'vitest';
import { solveSweep } from '../../../src/lib/server/kinematics/index';
import { planarCorner } from './helpers';

type P2 = [number, number];

/** Angle (rad) of vector v measured from the ground-link direction g, in the front view. */
function angleFrom(g: P2, v: P2): number {
	return Math.atan2(g[0] * v[1] - g[1] * v[0], g[0] * v[0] + g[1] * v[1]);
}

/** Norton's closed-form coupler angle θ3 for crank angle θ2 (both from the ground link); both roots. */
function freudensteinCoupler(a: number, b: number, c: number, d: number, t2: number): [number, number] {
	const K1 = d / a;
	const K4 = d / b;
	const K5 = (c * c - d * d - a * a - b * b) / (2 * a * b);
	const D = Math.cos(t2) - K1 + K4 * Math.cos(t2) + K5;
	const E = -2 * Math.sin(t2);
	const F = K1 + (K4 - 1) * Math.cos(t2) + K5;
	const r = Math.sqrt(E * E - 4 * D * F);
	return [2 * Math.atan((-E - r) / (2 * D)), 2 * Math.atan((-E + r) / (2 * D))];
}

/** Wrap an angle difference into (-π, π]. */
const wrap = (x: number): number => Math.atan2(Math.sin(x), Math.cos(x));

describe('planar double wishbone = four-bar linkage (Freudenstein; Norton, Design of Machinery)', () => {
	it('coupler (upright) angle follows the closed-form position solution over ±60 mm', () => {
		const corner = planarCorner();
		const P = corner.points;
		const O2: P2 = [P['lower.front'][1], P['lower.front'][2]];
		const O4: P2 = [P['upper.front'][1], P['upper.front'][2]];
		const A0: P2 = [P['lower.outer'][1], P['lower.outer'][2]];
		const B0: P2 = [P['upper.outer'][1], P['upper.outer'][2]];
		const len = (u: P2, v: P2) => Math.hypot(u[0] - v[0], u[1] - v[1]);
		const a = len(A0, O2);
		const b = len(B0, A0);
		const c = len(B0, O4);
		const d = len(O4, O2);
		const g: P2 = [O4[0] - O2[0], O4[1] - O2[1]];
		// branch chosen from the design drawing, not from the solver
		const designT2 = angleFrom(g, [A0[0] - O2[0], A0[1] - O2[1]]);
		const designT3 = angleFrom(g, [B0[0] - A0[0], B0[1] - A0[1]]);
		const roots0 = freudensteinCoupler(a, b, c, d, designT2);
		const branch = Math.abs(wrap(roots0[0] - designT3)) < Math.abs(wrap(roots0[1] - designT3)) ? 0 : 1;
		expect(Math.abs(wrap(roots0[branch] - designT3))).toBeLessThan(1e-9);

		const { samples, error } = solveSweep(corner, { sweep: 'heave', from: -60, to: 60, step: 5, points: true });
		expect(error).toBeNull();
		expect(samples).toHaveLength(25);
		for (const s of samples) {
			const L = s.points!['lower.outer'];
			const U = s.points!['upper.outer'];
			expect(Math.abs(L[0])).toBeLessThan(1e-9); // ball joints stay in the plane x = 0
			const t2 = angleFrom(g, [L[1] - O2[0], L[2] - O2[1]]);
			const t3 = angleFrom(g, [U[1] - L[1], U[2] - L[2]]);
			const expected = freudensteinCoupler(a, b, c, d, t2)[branch];
			expect(Math.abs(wrap(t3 - expected))).toBeLessThan(1e-9);
		}
	});
});
