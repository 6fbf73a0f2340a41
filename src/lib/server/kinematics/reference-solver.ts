// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in radians.
// An independent, general-purpose route to the same poses, for checks and the bench only:
// the upright's full 6 degrees of freedom (rotation vector, translation) solved by Newton's
// method on the raw joint constraints, with a central-difference Jacobian, mathjs `expm` for
// the rotation and mathjs `lusolve` for each step. It shares no maths with the engine.

import { expm, lusolve, matrix, type Matrix } from 'mathjs';
import { cross, dot, sub, unit } from '../../vec';
import type { CornerInput, PointTuple } from './corner';

type V = [number, number, number];

/** A reference pose: chassis positions (mm) of the upright's points. */
export interface ReferencePose {
	position: number;
	lowerOuter: V;

	/** upper.outer (double wishbone), strut.lower (strut), upper_front.outer (five-link), arm.rear (semi-trailing) */
	second: V;
	steerOuter: V;
	wheelCentre: V;
	axisInner: V;
}

/** A reference sweep: poses in ascending order, or null where Newton did not converge. */
export interface ReferenceSweep {
	poses: (ReferencePose | null)[];
}


/** Rotation matrix exp([r]x) of rotation vector r (rad), by mathjs `expm`. */
function rotation(r: V): number[][] {
	const k = matrix([
		[0, -r[2], r[1]],
		[r[2], 0, -r[0]],
		[-r[1], r[0], 0]
	]);
	return (expm(k) as Matrix).toArray() as number[][];
}

/** Body point b (design, mm) placed by state x = [rotation vector, translation] about the design origin L0. */
function placeAt(R: number[][], x: number[], L0: V, b: V): V {
	const d = sub(b, L0);
	return [0, 1, 2].map((i) => L0[i] + x[3 + i] + R[i][0] * d[0] + R[i][1] * d[1] + R[i][2] * d[2]) as V;
}

/** Sweep kind: heave travel (mm), roll (deg), or steer rack (mm). */
export type ReferenceSweepKind = 'heave' | 'roll' | 'steer';

/** The upright's names of corner c's kind: its origin, and the points a reference pose reports. */
function namesOf(c: CornerInput): { origin: string; lower: string; second: string; steer: string } {
	if (c.kind === 'multi_link') return { origin: 'wheel.centre', lower: 'lower_front.outer', second: 'upper_front.outer', steer: 'steer.outer' };
	if (c.kind === 'semi_trailing') return { origin: 'arm.front', lower: 'arm.front', second: 'arm.rear', steer: 'wheel.centre' };
	return { origin: 'lower.outer', lower: 'lower.outer', second: c.kind === 'strut' ? 'strut.lower' : 'upper.outer', steer: 'steer.outer' };
}

/** The six constraint residuals of corner c at state x for sweep position `pos`. */
function residuals(c: CornerInput, kind: ReferenceSweepKind, pos: number, rack: number, x: number[]): number[] {
	const P = (n: string): V => c.points[n] as PointTuple as V;
	const L0 = P(namesOf(c).origin);
	const R = rotation([x[0], x[1], x[2]]);
	const at = (n: string): V => placeAt(R, x, L0, P(n));
	const d2 = (a: V, b: V): number => dot(sub(a, b), sub(a, b));
	const drive = driver(c, kind, pos, at('wheel.centre'), at('wheel.axis_inner'));
	const rackAt = (n: string): V => [P(n)[0], P(n)[1] + (kind === 'steer' ? pos : rack), P(n)[2]];
	if (c.kind === 'multi_link') {
		// five rods, each keeping its length between its chassis (or rack) joint and its upright joint
		const rods = ['upper_front', 'upper_rear', 'lower_front', 'lower_rear'].map((k) => [`${k}.inner`, `${k}.outer`]);
		const out = rods.map(([i, o]) => d2(at(o), P(i)) - d2(P(o), P(i)));
		out.push(d2(at('steer.outer'), rackAt('steer.inner')) - d2(P('steer.outer'), P('steer.inner')));
		return [...out, drive];
	}
	if (c.kind === 'semi_trailing') {
		// the upright turns about the fixed axis arm.front–arm.rear: the front pivot stays, the rear stays on the axis
		const F = P('arm.front');
		const axis = unit(sub(P('arm.rear'), F));
		const e1 = unit(cross(axis, Math.abs(axis[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0]));
		const e2 = cross(axis, e1);
		const f = sub(at('arm.front'), F);
		const r = sub(at('arm.rear'), P('arm.rear'));
		return [f[0], f[1], f[2], dot(r, e1), dot(r, e2), drive];
	}
	const L = at('lower.outer');
	const out = [d2(L, P('lower.front')) - d2(L0, P('lower.front')), d2(L, P('lower.rear')) - d2(L0, P('lower.rear'))];
	if (c.kind === 'strut') {
		const top = P('strut.top');
		const axis0 = unit(sub(top, P('strut.lower')));
		const e1 = unit(cross(axis0, Math.abs(axis0[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0]));
		const e2 = cross(axis0, e1);
		const rot = (v: V): V => [0, 1, 2].map((i) => R[i][0] * v[0] + R[i][1] * v[1] + R[i][2] * v[2]) as V;
		const rel = sub(top, at('strut.lower'));
		out.push(dot(rel, rot(e1)), dot(rel, rot(e2)));
	} else {
		const U = at('upper.outer');
		const U0 = P('upper.outer');
		out.push(d2(U, P('upper.front')) - d2(U0, P('upper.front')), d2(U, P('upper.rear')) - d2(U0, P('upper.rear')));
	}
	out.push(d2(at('steer.outer'), rackAt('steer.inner')) - d2(P('steer.outer'), P('steer.inner')));
	out.push(drive);
	return out;
}

/** The sweep's driving condition (mm): wheel-centre height, or contact point on the rolled ground. */
function driver(c: CornerInput, kind: ReferenceSweepKind, pos: number, W: V, A: V): number {
	const W0 = c.points['wheel.centre'];
	if (kind === 'heave') return W[2] - (W0[2] + pos);
	if (kind === 'steer') return W[2] - W0[2];
	const r = (pos * Math.PI) / 180;
	const n: V = [0, -Math.sin(r), Math.cos(r)];
	const a = unit(sub(W, A));
	const na = dot(n, a);
	return dot(n, W) - c.tyre.loaded_radius * Math.sqrt(1 - na * na);
}

/** Newton from x0 at one position; the converged state, or null. */
function newton(c: CornerInput, kind: ReferenceSweepKind, pos: number, rack: number, x0: number[]): number[] | null {
	const x = x0.slice();
	const h = 1e-6;
	for (let iter = 0; iter < 50; iter++) {
		const f = residuals(c, kind, pos, rack, x);
		const J: number[][] = f.map(() => new Array(6).fill(0));
		for (let j = 0; j < 6; j++) {
			const xp = x.slice();
			const xm = x.slice();
			xp[j] += h;
			xm[j] -= h;
			const fp = residuals(c, kind, pos, rack, xp);
			const fm = residuals(c, kind, pos, rack, xm);
			for (let i = 0; i < 6; i++) J[i][j] = (fp[i] - fm[i]) / (2 * h);
		}
		let dx: number[];
		try {
			dx = (lusolve(J, f.map((v) => -v)) as number[][]).map((r) => r[0]);
		} catch {
			return null;
		}
		let big = 0;
		for (let j = 0; j < 6; j++) {
			x[j] += dx[j];
			big = Math.max(big, Math.abs(dx[j]));
		}
		if (!x.every(Number.isFinite)) return null;
		if (big < 1e-13) return x;
	}
	const f = residuals(c, kind, pos, rack, x);
	return f.every((v) => Math.abs(v) < 1e-8) ? x : null;
}

/** The pose record of state x at `pos`. */
function poseOf(c: CornerInput, x: number[], pos: number): ReferencePose {
	const names = namesOf(c);
	const L0 = c.points[names.origin] as V;
	const R = rotation([x[0], x[1], x[2]]);
	const at = (n: string): V => placeAt(R, x, L0, c.points[n] as V);
	return {
		position: pos,
		lowerOuter: at(names.lower),
		second: at(names.second),
		steerOuter: at(names.steer),
		wheelCentre: at('wheel.centre'),
		axisInner: at('wheel.axis_inner')
	};
}

/** Solve ascending `positions` of a sweep by continuation from design outward (steps ≤ 5 mm / 0.5°). */
export function referenceSweep(
	c: CornerInput,
	kind: ReferenceSweepKind,
	positions: number[],
	rack = 0
): ReferenceSweep {
	const poses: (ReferencePose | null)[] = positions.map(() => null);
	const maxStep = kind === 'roll' ? 0.5 : 5;
	const walk = (order: number[]): void => {
		let x: number[] | null = [0, 0, 0, 0, 0, 0];
		let at = 0;
		for (const k of order) {
			const target = positions[k];
			const n = Math.max(1, Math.ceil(Math.abs(target - at) / maxStep - 1e-9));
			for (let i = 1; i <= n && x; i++) x = newton(c, kind, at + ((target - at) * i) / n, rack, x);
			if (!x) return;
			poses[k] = poseOf(c, x, target);
			at = target;
		}
	};
	const up = positions.map((_, k) => k).filter((k) => positions[k] >= 0);
	const down = positions.map((_, k) => k).filter((k) => positions[k] < 0).reverse();
	walk(up);
	walk(down);
	return { poses };
}
