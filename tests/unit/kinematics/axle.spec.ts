// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm, angles in degrees.
// Both corners of an axle solved together (contract: "Axle file and axle sweeps"), checked against
// constructions made here: a planar steering linkage solved by hand, the Ackermann condition of a
// vehicle-dynamics textbook, the roll centre of the corner contract and hand-mirrored samples.

import { describe, expect, it } from 'vitest';
import { mirrorCorner, parseAxleGeometry } from '../../../src/lib/schemas/axle';
import { ackermannPercent, AxleSolver, barFigures, leverAngle, rollCentre, turningCircle } from '../../../src/lib/server/kinematics/axle';
import { solveSweep, type CornerInput } from '../../../src/lib/server/kinematics/index';
import { fixture } from './helpers';

const RAD = Math.PI / 180;

/** The club front corner as an axle file object with the right side mirrored. */
function clubAxle(extra: Record<string, unknown> = {}) {
	const left = { format: 'corner-geometry/1', ...fixture('club-fwd-front-left') };
	return { format: 'axle-geometry/1', left, right: 'mirror', steering: { rack_travel_per_turn: 50, rack_left_turn: '-y' }, vehicle: left.vehicle, ...extra };
}

function parsed(input: unknown) {
	const r = parseAxleGeometry(input);
	if (!r.ok) throw new Error(r.message);
	return r.axle;
}

/**
 * A planar steering corner: vertical kingpin through (0, 600) (parallel, equal, horizontal wishbones, so the upright
 * only turns about the kingpin at design height), a horizontal steering arm to steer.outer and a tie rod along y at
 * the same height to the rack end. Zero caster, KPI and camber.
 */
function planarSteer(): CornerInput {
	return {
		kind: 'double_wishbone',
		points: {
			'lower.front': [150, 300, 150],
			'lower.rear': [-150, 300, 150],
			'lower.outer': [0, 600, 150],
			'upper.front': [150, 300, 450],
			'upper.rear': [-150, 300, 450],
			'upper.outer': [0, 600, 450],
			'steer.inner': [-120, 260, 300],
			'steer.outer': [-120, 570, 300],
			'wheel.centre': [0, 700, 300],
			'wheel.axis_inner': [0, 600, 300]
		},
		tyre: { loaded_radius: 300 }
	};
}

/**
 * The planar linkage by hand: the arm end turns on a circle of radius ρ about the kingpin K; the rack end B moves
 * along y; the tie rod keeps its length l. For rack travel r, the turn δ (+ = counter-clockwise seen from above)
 * solves |K + R(δ)(A0 − K) − (B0 + r ŷ)| = l, written as P cos δ + Q sin δ = S and solved in closed form.
 */
function planarTurn(k: [number, number], a0: [number, number], b0: [number, number], rack: number): number {
	const ax = a0[0] - k[0];
	const ay = a0[1] - k[1];
	const bx = b0[0] - k[0];
	const by = b0[1] + rack - k[1];
	const l2 = (a0[0] - b0[0]) ** 2 + (a0[1] - b0[1]) ** 2;
	// |R a − b|² = |a|² + |b|² − 2 (R a)·b = l², (R a)·b = cos δ (a·b) + sin δ (a × b)
	const P = ax * bx + ay * by;
	const Q = ax * by - ay * bx;
	const S = (ax * ax + ay * ay + bx * bx + by * by - l2) / 2;
	const phi = Math.atan2(Q, P);
	const rr = Math.hypot(P, Q);
	// cos(δ − φ) = S / rr; the branch nearest δ = 0
	const c = Math.acos(Math.max(-1, Math.min(1, S / rr)));
	const cands = [phi + c, phi - c].map((d) => Math.atan2(Math.sin(d), Math.cos(d)));
	return cands.reduce((best, d) => (Math.abs(d) < Math.abs(best) ? d : best));
}

describe('axle file', () => {
	it('mirrors the right side by negating every y, the rocker too (hand-mirrored here)', () => {
		const left = { format: 'corner-geometry/1' as const, ...fixture('single-seater-front-left-pushrod') } as never;
		const m = mirrorCorner(left);
		for (const [name, p] of Object.entries((left as { points: Record<string, number[]> }).points)) expect(m.points[name]).toEqual([p[0], -p[1], p[2]]);
		const r = (left as { rocker: Record<string, number[]> }).rocker;
		expect(m.rocker!.pivot_a).toEqual([r.pivot_a[0], -r.pivot_a[1], r.pivot_a[2]]);
		expect(m.rocker!.rod_outer).toEqual([r.rod_outer[0], -r.rod_outer[1], r.rod_outer[2]]);
	});

	it('names the field of every bad input', () => {
		const msg = (x: unknown) => {
			const r = parseAxleGeometry(x);
			return r.ok ? 'ok' : r.message;
		};
		expect(msg({ ...clubAxle(), format: 'axle/2' })).toMatch(/^format: /);
		expect(msg({ ...clubAxle(), right: undefined })).toMatch(/^right: missing/);
		const left = clubAxle().left as { points: Record<string, number[]> };
		const noLower = { ...left, points: { ...left.points } };
		delete noLower.points['lower.outer'];
		expect(msg({ ...clubAxle(), right: noLower })).toBe('right.points.lower.outer: missing');
		expect(msg({ ...clubAxle(), right: left })).toMatch(/^right\.points\.wheel\.centre: the right corner needs y < 0/);
		expect(msg(clubAxle({ steering: { rack_travel_per_turn: 0, rack_left_turn: '-y' } }))).toMatch(/^steering\.rack_travel_per_turn: must be > 0/);
		expect(msg(clubAxle({ steering: { rack_travel_per_turn: 50, rack_left_turn: 'left' } }))).toMatch(/^steering\.rack_left_turn: /);
		expect(msg(clubAxle({ anti_roll_bar: { pivot: [-200, 300, 200], arm_end: [-200, 300, 200], link_end: [0, 500, 150], link_on: 'lower', torsional_stiffness: 50 } }))).toMatch(
			/^anti_roll_bar\.arm_end: /
		);
		expect(msg(clubAxle({ anti_roll_bar: { pivot: [-200, 300, 200], arm_end: [-20, 300, 200], link_end: [0, 500, 150], link_on: 'lower', torsional_stiffness: -1 } }))).toMatch(
			/^anti_roll_bar\.torsional_stiffness: must be > 0/
		);
	});
});

describe('Ackermann and the turning circle', () => {
	// Gillespie, Fundamentals of Vehicle Dynamics (SAE, 1992), ch. 6 "Low-speed turning": for a turn of radius R
	// about a point on the rear axle line, tan δo = L / (R + t/2) and tan δi = L / (R − t/2); hence
	// cot δo − cot δi = t / L, the Ackermann condition the contract uses.
	const L = 2400;
	const t = 1440;
	it('gives 100 % for the textbook condition and 0 % for parallel steer', () => {
		for (const R of [4000, 8000, 20000]) {
			const dout = Math.atan(L / (R + t / 2)) / RAD;
			const din = Math.atan(L / (R - t / 2)) / RAD;
			expect(1 / Math.tan(dout * RAD) - 1 / Math.tan(din * RAD)).toBeCloseTo(t / L, 12);
			expect(ackermannPercent(din, dout, L, t)).toBeCloseTo(100, 9); // a left turn: the left wheel is inner
			expect(ackermannPercent(-dout, -din, L, t)).toBeCloseTo(100, 9); // a right turn, mirrored
			expect(ackermannPercent(dout, dout, L, t)).toBeCloseTo(0, 9);
			// turning circle of the outer front wheel: its path radius is L / sin δo (same construction)
			expect(turningCircle(din, dout, L)).toBeCloseTo((2 * L) / Math.sin(dout * RAD) / 1000, 9);
		}
		expect(ackermannPercent(0.05, 0.04, L, t)).toBeNull(); // |δo| < 0.1°
	});
});

describe('axle steer sweep', () => {
	const k: [number, number] = [0, 600];
	const a0: [number, number] = [-120, 570];
	const b0: [number, number] = [-120, 260];
	const axle = () => parsed({ format: 'axle-geometry/1', left: { format: 'corner-geometry/1', ...planarSteer() }, right: 'mirror', steering: { rack_travel_per_turn: 60, rack_left_turn: '-y' }, vehicle: { axle: 'front', wheelbase: 2400, cg_height: 400, front_brake_fraction: 0.6 } });

	it('turns both wheels as the planar linkage solved by hand, with Ackermann, ratio and turning circle from those angles', () => {
		const solver = new AxleSolver(axle());
		const res = solver.sweep({ sweep: 'steer', from: -180, to: 180, step: 45 });
		expect(res.error).toBeNull();
		expect(res.samples.map((s) => s.steering_wheel)).toEqual([-180, -135, -90, -45, 0, 45, 90, 135, 180]);
		const t = solver.track;
		expect(t).toBeCloseTo(1400, 9); // the contact points lie under the wheel centres, y = ±700 in planarSteer
		for (const s of res.samples) {
			const rack = (-s.steering_wheel! / 360) * 60; // rack_left_turn −y
			// left side as built; the right side is its mirror image, so its turn is the mirror of the left's at −rack
			const dl = planarTurn(k, a0, b0, rack) / RAD;
			const dr = -planarTurn(k, a0, b0, -rack) / RAD;
			expect(s.delta_left!).toBeCloseTo(dl, 6);
			expect(s.delta_right!).toBeCloseTo(dr, 6);
			if (s.steering_wheel === 0) {
				expect(s.ackermann).toBeNull();
				expect(s.turning_circle).toBeNull();
			} else {
				const left = dl + dr > 0;
				const din = left ? dl : -dr;
				const dout = left ? dr : -dl;
				const ideal = Math.atan(1 / (1 / Math.tan(dout * RAD) - t / 2400)) / RAD; // Gillespie's condition solved for δi
				expect(s.ackermann!).toBeCloseTo((100 * (din - dout)) / (ideal - dout), 4);
				expect(s.turning_circle!).toBeCloseTo((2 * 2400) / Math.sin(Math.abs(dout) * RAD) / 1000, 6);
			}
			// overall steering ratio by central difference of the hand-solved angles over ±1° of steering wheel
			const mean = (sw: number) => {
				const r = (-sw / 360) * 60;
				return (planarTurn(k, a0, b0, r) - planarTurn(k, a0, b0, -r)) / 2 / RAD;
			};
			expect(s.steering_ratio!).toBeCloseTo(2 / (mean(s.steering_wheel! + 1) - mean(s.steering_wheel! - 1)), 3);
		}
		// the left wheel turns more in a left turn with this arm behind the axle, angled inward: some Ackermann
		const hard = res.samples.at(-1)!;
		expect(hard.delta_left!).toBeGreaterThan(hard.delta_right!);
		expect(hard.ackermann!).toBeGreaterThan(0);
	});

	it('refuses a steer sweep without a steering system, naming it', () => {
		const a = axle();
		a.steering = null;
		expect(() => new AxleSolver(a).sweep({ sweep: 'steer', from: -90, to: 90, step: 30 })).toThrow(/^steering: /);
	});
});

describe('axle heave and roll', () => {
	it('a symmetric axle at zero roll puts the roll centre on the centreline at the corner contract rc_height', () => {
		const a = parsed(clubAxle());
		const solver = new AxleSolver(a);
		const heave = solver.sweep({ sweep: 'heave', from: -40, to: 40, step: 20 });
		const corner = solveSweep(a.left, { sweep: 'heave', from: -40, to: 40, step: 20 });
		heave.samples.forEach((s, i) => {
			expect(s.rc![0]).toBeCloseTo(0, 9);
			expect(s.rc![1]).toBeCloseTo(corner.samples[i].rc_height!, 9);
		});
		const roll0 = solver.sweep({ sweep: 'roll', from: 0, to: 0, step: 1 }).samples[0];
		expect(roll0.rc![1]).toBeCloseTo(corner.samples[2].rc_height!, 2);
	});

	it('the right side in roll is the left side of the opposite roll, hand-mirrored (y negated, camber and toe kept)', () => {
		const solver = new AxleSolver(parsed(clubAxle()));
		const res = solver.sweep({ sweep: 'roll', from: -2, to: 2, step: 1 });
		const left = solveSweep(fixture('club-fwd-front-left'), { sweep: 'roll', from: -2, to: 2, step: 1 }).samples;
		for (const s of res.samples) {
			const mirror = left.find((l) => l.roll === -s.roll!)!;
			expect(s.right.camber).toBeCloseTo(mirror.camber, 9);
			expect(s.right.toe).toBeCloseTo(mirror.toe, 9);
			expect(s.right.wheel_centre[1]).toBeCloseTo(-mirror.wheel_centre[1], 9);
			expect(s.right.contact_patch[2]).toBeCloseTo(mirror.contact_patch[2], 9);
			// the roll centre migrates: mirrored lines meet at the mirrored point
			const back = res.samples.find((o) => o.roll === -s.roll!)!;
			expect(s.rc![0]).toBeCloseTo(-back.rc![0], 6);
			expect(s.rc![1]).toBeCloseTo(back.rc![1], 6);
		}
		// in roll the roll centre leaves the centreline (the symmetric assumption no longer holds)
		expect(Math.abs(res.samples[0].rc![0])).toBeGreaterThan(10);
	});

	it('rollCentre meets two front-view lines as a hand construction does', () => {
		// lines from (700, 0) through (−800, 300) and from (−700, 0) through (900, 200): solved by hand
		const rc = rollCentre([0, 700, 0], [-800, 300], [0, -700, 0], [900, 200])!;
		// left: z = (700 − y) · 300 / 1500; right: z = (y + 700) · 200 / 1600
		const y = (700 / 5 - 700 / 8) / (1 / 5 + 1 / 8);
		expect(rc[0]).toBeCloseTo(y, 9);
		expect(rc[1]).toBeCloseTo((700 - y) / 5, 9);
		expect(rollCentre([0, 700, 0], [-800, 300], [0, -700, 0], null)).toBeNull();
		expect(rollCentre([0, 700, 0], [-800, 300], [0, -700, 0], [-2200, 300])).toBeNull(); // parallel
	});

	it('holds the steering wheel through a heave sweep (bump steer at lock differs from straight ahead)', () => {
		const solver = new AxleSolver(parsed(clubAxle()));
		const straight = solver.sweep({ sweep: 'heave', from: -30, to: 30, step: 30 });
		const lock = solver.sweep({ sweep: 'heave', from: -30, to: 30, step: 30, steering_wheel: 180 });
		const corner = solveSweep(fixture('club-fwd-front-left'), { sweep: 'heave', from: -30, to: 30, step: 30, rack: -25 });
		lock.samples.forEach((s, i) => expect(s.left.toe).toBeCloseTo(corner.samples[i].toe, 9));
		expect(lock.samples[0].left.toe).not.toBeCloseTo(straight.samples[0].left.toe, 1);
	});
});

describe('anti-roll bar', () => {
	// A bar along y at (x, z) = (−200, 150); a 200 mm lever forward to (0, ·, 150); a vertical drop link down to the
	// lower arm of the planar corner. For a small wheel travel the link end on the arm rises by (its arm radius /
	// the wheel's arm radius) per mm, and the lever end follows it: dθ/dz = that ratio / lever length.
	const bar = { pivot: [-200, 450, 150], arm_end: [0, 450, 150], link_end: [0, 450, 50], link_on: 'lower', torsional_stiffness: 40 };
	it('lever rate, installation ratio, twist per mm and roll stiffness follow the hand construction', () => {
		const corner = planarSteer();
		corner.points['lower.outer'] = [0, 600, 50];
		corner.points['lower.front'] = [150, 300, 50];
		corner.points['lower.rear'] = [-150, 300, 50];
		const axle = parsed({ format: 'axle-geometry/1', left: { format: 'corner-geometry/1', ...corner }, right: 'mirror', anti_roll_bar: bar });
		const solver = new AxleSolver(axle);
		const f = barFigures(solver)!;
		// a parallelogram: the wheel centre rises as the outer joint (radius 300 about y = 300); the link end
		// at y = 450 on the lower arm rises 150 / 300 as much
		const ratio = 150 / 300;
		const thetaPerMm = ratio / 200; // rad per mm: the lever end rises with the link end, sin θ ≈ θ
		expect(f.installation_ratio).toBeCloseTo(ratio, 4);
		expect(Math.abs(f.lever_rate_left)).toBeCloseTo(thetaPerMm / RAD, 5);
		expect(f.lever_rate_left).toBeCloseTo(f.lever_rate_right, 9); // mirrored sides turn the same way about +y
		expect(f.twist_per_mm).toBeCloseTo((2 * thetaPerMm) / RAD, 5);
		// virtual work: roll moment per rad = K_bar · (dθ/dz · t)², t = 1400 mm
		const kRad = 40 / RAD;
		expect(f.roll_stiffness).toBeCloseTo(kRad * (thetaPerMm * 1400) ** 2 * RAD, 1);
		// in roll the two levers turn opposite ways: the twist grows with roll
		const roll = solver.sweep({ sweep: 'roll', from: -1, to: 1, step: 1 });
		expect(roll.samples[1].bar_twist!).toBeCloseTo(0, 6);
		expect(Math.sign(roll.samples[0].bar_twist!)).toBe(-Math.sign(roll.samples[2].bar_twist!));
	});

	it('refuses a drop link on a rocker the corner does not have, naming the field', () => {
		const axle = parsed({ format: 'axle-geometry/1', left: { format: 'corner-geometry/1', ...planarSteer() }, right: 'mirror', anti_roll_bar: { ...bar, link_on: 'rocker' } });
		expect(() => new AxleSolver(axle)).toThrow(/^anti_roll_bar\.link_on: the left corner has no rocker/);
	});

	it('leverAngle keeps the drop link at its length (checked by recomputing the distance)', () => {
		const pivot = [-200, 450, 150];
		const arm = [0, 450, 150];
		for (const link of [[10, 452, 60], [-5, 448, 40]]) {
			const th = leverAngle(pivot, arm, 100, link, 0);
			const end = [pivot[0] + 200 * Math.cos(th), 450, pivot[2] - 200 * Math.sin(th)];
			expect(Math.hypot(end[0] - link[0], end[1] - link[1], end[2] - link[2])).toBeCloseTo(100, 9);
		}
		expect(leverAngle(pivot, arm, 100, [0, 450, -400], 0)).toBeNaN(); // cannot reach
	});

});
