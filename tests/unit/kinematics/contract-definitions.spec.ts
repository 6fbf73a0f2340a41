// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Every measure of the contract table (../shared/geometry-format.md) recomputed here, in plain
// arithmetic written from the contract's wording, on the design pose (the file's own points,
// so no solver is involved), and compared with the engine's design sample.

import { describe, expect, it } from 'vitest';
import { solveSweep, type CornerInput } from '../../../src/lib/server/kinematics/index';
import { DEG, dot, fixture, norm, sub } from './helpers';

type V = number[];
const cross = (a: V, b: V): V => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const scale = (a: V, k: number): V => a.map((v) => v * k);
const add = (a: V, b: V): V => a.map((v, i) => v + b[i]);

/** Line {u: a·u + b·z = c} cut from the plane through points p, q, r by the plane coord[axis] = at. */
function cut(p: V, q: V, r: V, axis: 0 | 1, at: number): [number, number, number] {
	const n = cross(sub(q, p), sub(r, p));
	const u = axis === 0 ? 1 : 0; // front view keeps y, side view keeps x
	return [n[u], n[2], dot(n, p) - n[axis] * at];
}

/** Meet of two lines a u + b z = c, or null when parallel. */
function meet(l1: number[], l2: number[]): [number, number] | null {
	const det = l1[0] * l2[1] - l2[0] * l1[1];
	if (Math.abs(det) < 1e-12) return null;
	return [(l1[2] * l2[1] - l2[2] * l1[1]) / det, (l1[0] * l2[2] - l2[0] * l1[2]) / det];
}

/** The contract's measures of corner c at design (heave, travel 0). */
function byContract(c: CornerInput) {
	const P = c.points;
	const W = P['wheel.centre'];
	const s = Math.sign(W[1]);
	const a = scale(sub(W, P['wheel.axis_inner']), 1 / norm(sub(W, P['wheel.axis_inner'])));
	const Lp = P['lower.outer'];
	const Up = c.kind === 'strut' ? P['strut.top'] : P['upper.outer'];
	// C: lowest point of the wheel circle (radius R, normal a) toward -z
	const z: V = [0, 0, 1];
	const down = sub(z, scale(a, a[2]));
	const C = sub(W, scale(down, c.tyre.loaded_radius / norm(down)));
	const ax = sub(Up, Lp);
	const G = add(Lp, scale(ax, -Lp[2] / ax[2]));
	const lowerFront = cut(P['lower.front'], P['lower.rear'], Lp, 0, W[0]);
	const lowerSide = cut(P['lower.front'], P['lower.rear'], Lp, 1, W[1]);
	let upperFront: number[];
	let upperSide: number[];
	if (c.kind === 'strut') {
		const d = sub(P['strut.top'], P['strut.lower']);
		const T = P['strut.top'];
		upperFront = [d[1], d[2], d[1] * T[1] + d[2] * T[2]];
		upperSide = [d[0], d[2], d[0] * T[0] + d[2] * T[2]];
	} else {
		upperFront = cut(P['upper.front'], P['upper.rear'], Up, 0, W[0]);
		upperSide = cut(P['upper.front'], P['upper.rear'], Up, 1, W[1]);
	}
	const fvic = meet(lowerFront, upperFront);
	const svic = meet(lowerSide, upperSide);
	const v = c.vehicle;
	return {
		camber: -Math.asin(a[2]) * DEG,
		toe: Math.atan2(a[0], Math.abs(a[1])) * DEG,
		caster: Math.atan2(-(Up[0] - Lp[0]), Up[2] - Lp[2]) * DEG,
		kpi: Math.atan2(-s * (Up[1] - Lp[1]), Up[2] - Lp[2]) * DEG,
		scrub_radius: s * (C[1] - G[1]),
		trail: G[0] - C[0],
		fvic,
		fvsa: fvic && Math.hypot(C[1] - fvic[0], C[2] - fvic[1]),
		rc_height: fvic && C[2] + ((fvic[1] - C[2]) * (0 - C[1])) / (fvic[0] - C[1]),
		svic,
		anti_dive: v && v.axle === 'front' && svic ? (100 * v.front_brake_fraction! * (v.wheelbase / v.cg_height) * (svic[1] - C[2])) / (C[0] - svic[0]) : null,
		anti_squat: v && v.axle === 'rear' && svic ? (100 * (v.rear_drive_fraction ?? 1) * (v.wheelbase / v.cg_height) * (svic[1] - W[2])) / (svic[0] - W[0]) : null,
		contact_patch: C
	};
}

const NAMES = ['club-fwd-front-left', 'club-fwd-front-right', 'club-fwd-front-left-rack-moved', 'road-strut-front-left', 'single-seater-front-left', 'single-seater-rear-left'];

describe('contract measures at design, recomputed from the contract text', () => {
	for (const name of NAMES) {
		it(name, () => {
			const c = fixture(name);
			const e = solveSweep(c, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
			const x = byContract(c);
			for (const k of ['camber', 'toe', 'caster', 'kpi'] as const) expect(Math.abs(e[k]! - x[k])).toBeLessThan(1e-9);
			for (const k of ['scrub_radius', 'trail', 'fvsa', 'rc_height', 'anti_dive', 'anti_squat'] as const) {
				if (x[k] === null) expect(e[k]).toBeNull();
				else expect(Math.abs((e[k] as number) - (x[k] as number))).toBeLessThan(1e-6);
			}
			for (const k of ['fvic', 'svic'] as const) {
				for (let i = 0; i < 2; i++) expect(Math.abs(e[k]![i] - x[k]![i])).toBeLessThan(1e-6);
			}
			for (let i = 0; i < 3; i++) expect(Math.abs(e.contact_patch[i] - x.contact_patch[i])).toBeLessThan(1e-9);
			expect(Math.abs(e.half_track_change)).toBeLessThan(1e-9);
			expect(Math.abs(e.wheelbase_change)).toBeLessThan(1e-9);
		});
	}
});
