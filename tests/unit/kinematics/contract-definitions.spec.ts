// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Every measure of the contract table (../shared/geometry-format.md) away from design: at full
// rebound and full bump (the contract's default heave ends, ±50 mm), in roll and in steer. The
// expected values come from an independent construction (independent.ts): the poses of the
// independent general-purpose solver (mathjs 6-DOF Newton on the raw joint constraints), and the
// contract's wording applied to them in plain arithmetic. A routine that measured at the design
// positions would fail: the test also checks that each instant-centre measure moves by far more
// than the tolerance between design and the sweep's ends.

import { describe, expect, it } from 'vitest';
import { solveSweep, type CornerInput, type Sample, type SweepKind } from '../../../src/lib/server/kinematics/index';
import { byContract, meet, type ByHand } from './independent';
import { DEG, fixture, planarCorner } from './helpers';

/** Instant-centre measures: what the issue asks to check away from design. */
const IC_MEASURES = ['caster', 'kpi', 'scrub_radius', 'trail', 'fvic', 'svic', 'rc_height'] as const;
const ANGLES = ['camber', 'toe', 'caster', 'kpi'] as const;
const LENGTHS = ['scrub_radius', 'trail', 'fvsa', 'rc_height', 'anti_dive', 'anti_squat', 'half_track_change', 'wheelbase_change'] as const;

/** |e − x| within tol scaled for far-away instant centres (1e-9 relative): null exactly where x is null. */
function expectClose(e: number | null, x: number | null, tol: number, what: string): void {
	if (x === null) return void expect(e, what).toBeNull();
	expect(e, what).not.toBeNull();
	expect(Math.abs(e! - x), what).toBeLessThan(tol + 1e-9 * Math.abs(x));
}

/** The engine's sample against the independent values, measure by measure. */
function expectSample(e: Sample, x: ByHand, where: string): void {
	for (const k of ANGLES) expectClose(e[k], x[k], 1e-7, `${k} ${where}`);
	for (const k of LENGTHS) expectClose(e[k], x[k], 1e-6, `${k} ${where}`);
	for (const k of ['fvic', 'svic'] as const) {
		if (x[k] === null) expect(e[k], `${k} ${where}`).toBeNull();
		else for (let i = 0; i < 2; i++) expectClose(e[k]![i], x[k]![i], 1e-5, `${k}[${i}] ${where}`);
	}
	for (let i = 0; i < 3; i++) {
		expectClose(e.contact_patch[i], x.contact_patch[i], 1e-7, `contact_patch[${i}] ${where}`);
		expectClose(e.wheel_centre[i], x.wheel_centre[i], 1e-7, `wheel_centre[${i}] ${where}`);
	}
}

/** One engine sample at a sweep position. */
function engineAt(c: CornerInput | string, sweep: SweepKind, pos: number): Sample {
	const r = solveSweep(typeof c === 'string' ? fixture(c) : c, { sweep, from: pos, to: pos, step: 1 });
	expect(r.error).toBeNull();
	return r.samples[0];
}

/** A number for each instant-centre measure (both coordinates of fvic and svic), null where absent. */
function icFigures(x: ByHand): (number | null)[] {
	return IC_MEASURES.flatMap((k) => (k === 'fvic' || k === 'svic' ? (x[k] ? [x[k]![0], x[k]![1]] : [null, null]) : [x[k]]));
}

const KINDS = [
	'club-fwd-front-left', // double wishbone, front axle (anti_dive)
	'club-fwd-front-right', // the same mirrored
	'club-fwd-front-left-rack-moved',
	'road-strut-front-left', // strut: upper line from the strut axis
	'single-seater-front-left',
	'single-seater-rear-left', // rear axle (anti_squat)
	'single-seater-rear-left-five-link', // instant centres from the motion, virtual steering axis
	'road-rear-left-semi-trailing' // instant centres from the motion, no steering axis
];

describe('contract measures at full rebound, design and full bump = independent general-purpose solver (mathjs) + the contract\'s wording', () => {
	for (const name of KINDS) {
		it(name, () => {
			const c = fixture(name);
			const at = new Map<number, ByHand>();
			for (const t of [-50, 0, 50]) {
				const x = byContract(c, 'heave', t);
				at.set(t, x);
				expectSample(engineAt(name, 'heave', t), x, `${name} at travel ${t}`);
			}
			// a routine that used the design positions would fail: every instant-centre figure the kind has moves by
			// at least ten times its tolerance (1e-5 mm + 1e-9 relative) between design and each end
			const d = icFigures(at.get(0)!);
			for (const t of [-50, 50]) {
				icFigures(at.get(t)!).forEach((v, i) => {
					if (v === null) return void expect(d[i]).toBeNull();
					expect(Math.abs(v - d[i]!), `${IC_MEASURES.join(',')}: figure ${i} at ${t}`).toBeGreaterThan(1e-4 + 1e-8 * Math.abs(v));
				});
			}
		});
	}
});

describe('contract measures in roll and steer = independent general-purpose solver (mathjs) + the contract\'s wording', () => {
	const cases: [string, SweepKind, number[]][] = [
		['club-fwd-front-left', 'roll', [-3, 3]],
		['club-fwd-front-right', 'roll', [-3, 3]],
		['road-strut-front-left', 'roll', [-3, 3]],
		['single-seater-rear-left-five-link', 'roll', [-3, 3]],
		['club-fwd-front-left', 'steer', [-40, 40]],
		['road-strut-front-left', 'steer', [-40, 40]],
		['single-seater-rear-left-five-link', 'steer', [-20, 20]]
	];
	for (const [name, sweep, positions] of cases) {
		it(`${name}, ${sweep} at ${positions.join(' and ')}`, () => {
			const c = fixture(name);
			for (const p of positions) expectSample(engineAt(name, sweep, p), byContract(c, sweep, p), `${name} ${sweep} ${p}`);
		});
	}
});

describe('planar double wishbone solved by hand as a four-bar in the front view (helpers.ts planarCorner)', () => {
	// Every pivot axis is parallel to x and every upright point lies in x = 0 or moves parallel to it, so the
	// front view is a four-bar: chassis, lower arm, upright, upper arm. Its instant centre is where the two arm
	// lines meet (Aronhold–Kennedy theorem of three centres; Milliken & Milliken, Race Car Vehicle Dynamics,
	// ch. 17, the front-view swing arm). Solved here by circle intersections and bisection, no solver involved.
	const c = planarCorner();
	const P = c.points;
	const yz = (n: string): [number, number] => [P[n][1], P[n][2]];
	const [Pl, Lo0, Pu, Uo0, W0, A0] = ['lower.front', 'lower.outer', 'upper.front', 'upper.outer', 'wheel.centre', 'wheel.axis_inner'].map(yz);
	const d = (a: number[], b: number[]) => Math.hypot(a[0] - b[0], a[1] - b[1]);
	const turn = (p: number[], o: number[], t: number): [number, number] => [
		o[0] + (p[0] - o[0]) * Math.cos(t) - (p[1] - o[1]) * Math.sin(t),
		o[1] + (p[0] - o[0]) * Math.sin(t) + (p[1] - o[1]) * Math.cos(t)
	];
	/** The front-view pose for lower-arm angle t (rad): lower and upper ball joints and the upright's turn. */
	function pose(t: number) {
		const Lo = turn(Lo0, Pl, t);
		// upper ball joint: on the circle about Pu (upper arm) and the circle about Lo (upright), the branch near design
		const [r1, r2, D] = [d(Uo0, Pu), d(Uo0, Lo0), d(Lo, Pu)];
		const along = (r1 * r1 - r2 * r2 + D * D) / (2 * D);
		const off = Math.sqrt(r1 * r1 - along * along);
		const e = [(Lo[0] - Pu[0]) / D, (Lo[1] - Pu[1]) / D];
		const cands = [1, -1].map((k) => [Pu[0] + along * e[0] - k * off * e[1], Pu[1] + along * e[1] + k * off * e[0]]);
		const Uo = cands.sort((a, b) => d(a, Uo0) - d(b, Uo0))[0];
		const psi = Math.atan2(Uo[1] - Lo[1], Uo[0] - Lo[0]) - Math.atan2(Uo0[1] - Lo0[1], Uo0[0] - Lo0[0]);
		const carry = (p: number[]) => turn([p[0] - Lo0[0] + Lo[0], p[1] - Lo0[1] + Lo[1]], Lo, psi);
		return { Lo, Uo, W: carry(W0), A: carry(A0) };
	}
	/** The pose whose wheel centre is `travel` mm above design (bisection on the lower arm's angle). */
	function atTravel(travel: number) {
		let [lo, hi] = [-0.5, 0.5];
		for (let i = 0; i < 200; i++) {
			const mid = (lo + hi) / 2;
			if (pose(mid).W[1] - W0[1] < travel) lo = mid;
			else hi = mid;
		}
		return pose((lo + hi) / 2);
	}

	for (const travel of [-50, 50]) {
		it(`fvic, rc_height, KPI, scrub, camber at ${travel > 0 ? 'full bump' : 'full rebound'} (${travel} mm); caster and trail 0, svic null`, () => {
			const { Lo, Uo, W, A } = atTravel(travel);
			const fvic = meet([Lo[1] - Pl[1], -(Lo[0] - Pl[0]), (Lo[1] - Pl[1]) * Pl[0] - (Lo[0] - Pl[0]) * Pl[1]], [Uo[1] - Pu[1], -(Uo[0] - Pu[0]), (Uo[1] - Pu[1]) * Pu[0] - (Uo[0] - Pu[0]) * Pu[1]])!;
			// contact point: the wheel circle's lowest point, R along the wheel plane's downward direction (a in the y-z plane)
			const a = [(W[0] - A[0]) / d(W, A), (W[1] - A[1]) / d(W, A)];
			const C = [W[0] + 300 * a[1] * Math.sign(a[0]), W[1] - 300 * Math.abs(a[0])];
			const Gy = Lo[0] - (Lo[1] * (Uo[0] - Lo[0])) / (Uo[1] - Lo[1]);
			const e = engineAt(c, 'heave', travel);
			expect(Math.abs(e.fvic![0] - fvic[0])).toBeLessThan(1e-6);
			expect(Math.abs(e.fvic![1] - fvic[1])).toBeLessThan(1e-6);
			expect(Math.abs(e.rc_height! - (C[1] + ((fvic[1] - C[1]) * (0 - C[0])) / (fvic[0] - C[0])))).toBeLessThan(1e-6);
			expect(Math.abs(e.kpi! - Math.atan2(-(Uo[0] - Lo[0]), Uo[1] - Lo[1]) * DEG)).toBeLessThan(1e-9);
			expect(Math.abs(e.scrub_radius! - (C[0] - Gy))).toBeLessThan(1e-6);
			expect(Math.abs(e.camber - -Math.asin(a[1]) * DEG)).toBeLessThan(1e-9);
			expect(Math.abs(e.caster!)).toBeLessThan(1e-9);
			expect(Math.abs(e.trail!)).toBeLessThan(1e-9);
			expect(e.svic).toBeNull(); // both arm planes hold the x direction: the side-view lines are parallel
			// the design instant centre was built at (-1500, 0): far from where it is now
			expect(Math.hypot(fvic[0] + 1500, fvic[1])).toBeGreaterThan(100);
		});
	}
});

