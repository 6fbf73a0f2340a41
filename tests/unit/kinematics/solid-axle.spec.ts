// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height;
// lengths in mm, angles in degrees.
// The solid rear axle (issue 16, item 6) against closed forms and an independent numeric route.
// Each check names its source beside it.

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { describe, expect, it } from 'vitest';
import { parseSolidAxle, parseSolidAxleFile, type SolidAxle } from '../../../src/lib/schemas/solid-axle';
import {
	solveSolidAxle,
	SolidSweepOptionsError,
	type SolidAxleInput,
	type SolidPoint,
	type SolidVehicle
} from '../../../src/lib/server/kinematics/solid-axle';
import { ROOT } from './helpers';

const DEG = 180 / Math.PI;
const RAD = Math.PI / 180;

function fixtureFile(name: string): { solid: SolidAxle; vehicle: SolidVehicle | null } {
	const r = parseSolidAxleFile(JSON.parse(readFileSync(join(ROOT, 'fixtures', `${name}.json`), 'utf8')));
	if (!r.ok) throw new Error(r.message);
	return { solid: r.file.solid, vehicle: r.file.vehicle ?? null };
}

/**
 * A four-link whose links all lie in vertical planes parallel to x (parallel in plan view) and
 * form a parallelogram in the side view: lower and upper links equal in length (500 mm) and
 * both inclined at `beta` (rad, chassis end higher when beta > 0). Wheels without camber or toe.
 */
function parallelogram(beta: number, lateral: 'panhard' | 'watt'): SolidAxleInput {
	const rise = 500 * Math.tan(beta);
	const pts: Record<string, SolidPoint> = {
		'lower_left.chassis': [500, 560, 190 + rise],
		'lower_left.axle': [0, 560, 190],
		'lower_right.chassis': [500, -560, 190 + rise],
		'lower_right.axle': [0, -560, 190],
		'upper_left.chassis': [500, 470, 430 + rise],
		'upper_left.axle': [0, 470, 430],
		'upper_right.chassis': [500, -470, 430 + rise],
		'upper_right.axle': [0, -470, 430],
		'wheel_left.centre': [0, 740, 300],
		'wheel_left.axis_inner': [0, 640, 300],
		'wheel_right.centre': [0, -740, 300],
		'wheel_right.axis_inner': [0, -640, 300]
	};
	if (lateral === 'panhard') {
		pts['panhard.chassis'] = [-90, -580, 335];
		pts['panhard.axle'] = [-90, 530, 305];
	} else {
		// Watt's linkage: centre link 160 mm long, pivot on the centreline at wheel-centre height, rods 420 mm, horizontal at design
		pts['watt.pivot'] = [-120, 0, 300];
		pts['watt.upper_end'] = [-120, 0, 380];
		pts['watt.lower_end'] = [-120, 0, 220];
		pts['watt.upper_chassis'] = [-120, -420, 380];
		pts['watt.lower_chassis'] = [-120, 420, 220];
	}
	return { kind: 'solid_axle', lateral, points: pts, tyre: { loaded_radius: 300 } };
}

const dist = (a: number[], b: number[]): number => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('parallelogram four-link with a Panhard rod in heave', () => {
	const beta = 4 * RAD;
	const axle = parallelogram(beta, 'panhard');
	const P = axle.points;
	const L = dist(P['lower_left.chassis'], P['lower_left.axle']);
	const rod = dist(P['panhard.chassis'], P['panhard.axle']);
	const res = solveSolidAxle(axle, null, { sweep: 'heave', from: -60, to: 60, step: 20 });

	/**
	 * The axle's translation (dx, dy) for heave dz, from the closed-form arcs: each link keeps its
	 * length (its end on a circle in the side view of radius sqrt(L² − dy²)) and the Panhard rod
	 * keeps its (its axle end on a circle in the front view); the two are coupled only through
	 * squares of the small shifts, so a few substitutions settle them to round-off.
	 */
	function arcs(dz: number): { dx: number; dy: number; theta: number; theta0: number; side: number } {
		const d0x = P['lower_left.axle'][0] - P['lower_left.chassis'][0];
		const d0z = P['lower_left.axle'][2] - P['lower_left.chassis'][2];
		const p0y = P['panhard.axle'][1] - P['panhard.chassis'][1];
		const p0z = P['panhard.axle'][2] - P['panhard.chassis'][2];
		let dx = 0;
		let dy = 0;
		for (let i = 0; i < 60; i++) {
			dy = Math.sqrt(rod * rod - dx * dx - (p0z + dz) ** 2) - p0y;
			const side = Math.sqrt(L * L - dy * dy);
			dx = -Math.sqrt(side * side - (d0z + dz) ** 2) - d0x;
		}
		const side = Math.sqrt(L * L - dy * dy);
		return { dx, dy, side, theta: Math.asin((d0z + dz) / side), theta0: Math.asin(d0z / L) };
	}

	it('solves every position', () => {
		expect(res.error).toBeNull();
		expect(res.samples.map((s) => s.travel)).toEqual([-60, -40, -20, 0, 20, 40, 60]);
	});

	it('the axle does not pitch: a parallelogram linkage keeps its coupler parallel to the ground link (Norton, Design of Machinery, ch. 2–3, the parallelogram four-bar)', () => {
		for (const s of res.samples) {
			expect(Math.abs(s.pinion_angle)).toBeLessThan(1e-9);
			expect(Math.abs(s.axle_roll)).toBeLessThan(1e-9);
			expect(Math.abs(s.axle_yaw)).toBeLessThan(1e-9);
		}
		// with a pinion point the pinion axis keeps its angle too
		const withPinion = structuredClone(axle);
		withPinion.points['pinion.front'] = [250, 0, 320];
		for (const s of solveSolidAxle(withPinion, null, { sweep: 'heave', from: -60, to: 60, step: 30 }).samples)
			expect(Math.abs(s.pinion_angle)).toBeLessThan(1e-9);
	});

	it("the axle's x follows the links' arc Δx = L (cos θ − cos θ0) (closed form of a link turning about its chassis end; L the side-view length)", () => {
		for (const s of res.samples) {
			const a = arcs(s.travel!);
			const expected = a.side * Math.cos(a.theta) - L * Math.cos(a.theta0);
			expect(s.left.wheel_centre[0] - 0).toBeCloseTo(-expected, 6); // the axle end trails the chassis end: x = Cx − L cos θ
			expect(s.right.wheel_centre[0] - 0).toBeCloseTo(-expected, 6);
			expect(s.left.wheel_centre[2]).toBeCloseTo(300 + s.travel!, 9);
		}
		// a real arc: 60 mm of bump moves the axle by tenths of a millimetre, not zero
		expect(Math.abs(res.samples[6].left.wheel_centre[0])).toBeGreaterThan(0.3);
	});

	it("lateral_shift equals the closed-form arc of the Panhard rod (its axle end on a circle about its chassis end in the front view)", () => {
		for (const s of res.samples) expect(s.lateral_shift).toBeCloseTo(arcs(s.travel!).dy, 6);
		expect(Math.abs(res.samples[0].lateral_shift)).toBeGreaterThan(0.5); // about 2 mm at −60 mm: the check has teeth
	});

	it('Panhard roll centre: rc_height is where the rod crosses the centreline in the front view (common practice, no source: marked as such)', () => {
		const c = P['panhard.chassis'];
		const a0 = P['panhard.axle'];
		for (const s of res.samples) {
			const a = arcs(s.travel!);
			const ay = a0[1] + a.dy;
			const az = a0[2] + s.travel!;
			const expected = c[2] + ((0 - c[1]) * (az - c[2])) / (ay - c[1]);
			expect(s.rc_height).toBeCloseTo(expected, 6);
		}
		// at design: 335 + 580 · (305 − 335) / 1110, by hand
		expect(res.samples[3].rc_height).toBeCloseTo(335 - (580 * 30) / 1110, 9);
	});
});

describe("Watt's linkage with its pivot on the centreline", () => {
	it("keeps the axle on the centreline through ±50 mm of heave (Watt's straight-line linkage: Norton, Design of Machinery, ch. 3, straight-line mechanisms)", () => {
		const axle = parallelogram(0, 'watt');
		const res = solveSolidAxle(axle, null, { sweep: 'heave', from: -50, to: 50, step: 5 });
		expect(res.error).toBeNull();
		expect(res.samples).toHaveLength(21);
		// What is left, by our own leading-order expansion of this symmetric Watt's linkage (rods r,
		// half centre link b, rods horizontal at design): the centre link turns by φ ≈ dz² / (2 r b),
		// its ends drop by c = b (1 − cos φ) ≈ b φ² / 2, and the pivot moves sideways by about
		// c dz / r = dz⁵ / (8 r³ b): 0.0066 mm at 50 mm here. The next terms are of relative order
		// dz² / (2 r²) (0.7 %) and the links' own arc tilting the rods; we allow 5 %.
		const r = 420;
		const b = 80;
		for (const s of res.samples) {
			const dz = s.travel!;
			const lead = dz ** 5 / (8 * r ** 3 * b);
			expect(Math.abs(s.lateral_shift - lead)).toBeLessThanOrEqual(0.05 * Math.abs(lead) + 1e-12);
			expect(Math.abs(s.lateral_shift)).toBeLessThan(0.01); // a hundredth of a millimetre through ±50 mm
			// roll centre: the centre link pivot's height (common practice, marked as such); the pivot rides on the axle
			expect(s.rc_height).toBeCloseTo(300 + dz, 9);
		}
		// a Panhard rod as long as both Watt rods together (840 mm, horizontal at design) moves the
		// axle by its arc, 840 − √(840² − 50²) ≈ 1.49 mm at 50 mm (plus a few µm from the links' own
		// arc tilting the rod); the Watt's linkage does a hundred times better
		const panhard = parallelogram(0, 'panhard');
		panhard.points['panhard.chassis'] = [-90, -420, 300];
		panhard.points['panhard.axle'] = [-90, 420, 300];
		const p = solveSolidAxle(panhard, null, { sweep: 'heave', from: 50, to: 50, step: 1 }).samples[0];
		expect(Math.abs(p.lateral_shift)).toBeCloseTo(840 - Math.sqrt(840 ** 2 - 50 ** 2), 1);
	});
});

describe('roll steer', () => {
	it("equals the tangent of the axle's roll-axis inclination, the roll axis lying parallel to the links in the side view (taken from memory: the rule as usually stated for trailing-link axles, e.g. Gillespie, Fundamentals of Vehicle Dynamics, ch. 8; checked here also by a velocity analysis)", () => {
		// Velocity analysis (ours): links along u = (−cos β, 0, −sin β) allow axle motions with
		// ω · (r × u) + u · v = 0 at every bracket r = (0, y, z); brackets at ±y need
		// ω_z cos β = ω_x sin β, so the axle turns about an axis inclined at β: yaw / roll = tan β.
		for (const betaDeg of [6, -4]) {
			const beta = betaDeg * RAD;
			const res = solveSolidAxle(parallelogram(beta, 'panhard'), null, { sweep: 'roll', from: -1, to: 1, step: 0.5 });
			expect(res.error).toBeNull();
			const s0 = res.samples.find((s) => s.roll === 0)!;
			expect(s0.roll_steer).toBeCloseTo(Math.tan(beta), 6);
			for (const s of res.samples) {
				// axle_roll equals body roll: both contact points on the rolled ground with camber-free wheels
				expect(s.axle_roll).toBeCloseTo(s.roll!, 9);
				// sign: chassis ends higher (β > 0), the left side down: the axle steers left (+z)
				if (s.roll! !== 0) expect(Math.sign(s.axle_yaw)).toBe(Math.sign(s.roll!) * Math.sign(betaDeg));
			}
		}
		// heave sweeps carry no roll steer
		expect(solveSolidAxle(parallelogram(0.1, 'panhard'), null, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].roll_steer).toBeNull();
	});
});

describe('least squares on a compatible layout', () => {
	it('keeps every link at its length (1e-6 mm, recomputed from the output points): five links whose chassis ends lie on one transverse line let the axle turn about that line (a rigid body turning about a fixed axis keeps its distance to every point of the axis)', () => {
		const axle = parallelogram(0, 'panhard');
		const P = axle.points;
		const hinge = (y: number): SolidPoint => [600, y, 250];
		for (const l of ['lower_left', 'lower_right', 'upper_left', 'upper_right', 'panhard'])
			P[`${l}.chassis`] = hinge(P[`${l}.chassis`][1]);
		const rods = ['lower_left', 'lower_right', 'upper_left', 'upper_right', 'panhard'];
		const design = Object.fromEntries(rods.map((l) => [l, dist(P[`${l}.chassis`], P[`${l}.axle`])]));
		const res = solveSolidAxle(axle, null, { sweep: 'heave', from: -60, to: 60, step: 10, points: true });
		expect(res.error).toBeNull();
		expect(res.samples).toHaveLength(13);
		for (const s of res.samples) {
			const pts = s.points!;
			for (const l of rods) expect(Math.abs(dist(pts[`${l}.chassis`], pts[`${l}.axle`]) - design[l])).toBeLessThan(1e-6);
			// the wheel centre stays on its circle about the hinge line (x = 600, z = 250)
			const w = pts['wheel_left.centre'];
			expect(Math.hypot(w[0] - 600, w[2] - 250)).toBeCloseTo(Math.hypot(600, 50), 6);
			expect(s.bind_rms).toBeLessThan(1e-6);
		}
	});
});

describe('an independent numeric route (ml-levenberg-marquardt) for one binding pose', () => {
	it('finds the same least-squares pose within 1e-3 mm and 1e-3 deg', () => {
		const { solid, vehicle } = fixtureFile('invented-solid-rear-axle');
		const roll = 3;
		const res = solveSolidAxle(solid, vehicle, { sweep: 'roll', from: roll, to: roll, step: 1 });
		expect(res.error).toBeNull();
		const s = res.samples[0];
		expect(s.bind_rms).toBeGreaterThan(0.05); // a pose that really binds: the minimum is not zero

		// The same problem written afresh: pose = translation + rotation vector (Rodrigues), residuals =
		// the five link-length errors and the two contact heights above the rolled ground, the latter
		// weighted 1e4 so they hold to well below 1e-6 mm at the optimum.
		const P = solid.points;
		const wl = P['wheel_left.centre'];
		const wr = P['wheel_right.centre'];
		const O = [(wl[0] + wr[0]) / 2, (wl[1] + wr[1]) / 2, (wl[2] + wr[2]) / 2];
		const rot = (p: number[], v: number[]): number[] => {
			const th = Math.hypot(p[3], p[4], p[5]);
			if (th === 0) return v.slice();
			const k = [p[3] / th, p[4] / th, p[5] / th];
			const c = Math.cos(th);
			const sn = Math.sin(th);
			const kv = k[0] * v[0] + k[1] * v[1] + k[2] * v[2];
			const kx = [k[1] * v[2] - k[2] * v[1], k[2] * v[0] - k[0] * v[2], k[0] * v[1] - k[1] * v[0]];
			return [0, 1, 2].map((i) => v[i] * c + kx[i] * sn + k[i] * kv * (1 - c));
		};
		const place = (p: number[], q: number[]): number[] => {
			const r = rot(p, [q[0] - O[0], q[1] - O[1], q[2] - O[2]]);
			return [O[0] + p[0] + r[0], O[1] + p[1] + r[1], O[2] + p[2] + r[2]];
		};
		const links = ['lower_left', 'lower_right', 'upper_left', 'upper_right', 'panhard'];
		const n = [0, -Math.sin(roll * RAD), Math.cos(roll * RAD)];
		const height = (p: number[], side: 'left' | 'right'): number => {
			const w = place(p, P[`wheel_${side}.centre`]);
			const inner = place(p, P[`wheel_${side}.axis_inner`]);
			const a = [w[0] - inner[0], w[1] - inner[1], w[2] - inner[2]];
			const la = Math.hypot(a[0], a[1], a[2]);
			const na = (n[0] * a[0] + n[1] * a[1] + n[2] * a[2]) / la;
			return n[0] * w[0] + n[1] * w[1] + n[2] * w[2] - solid.tyre.loaded_radius * Math.sqrt(1 - na * na);
		};
		const residuals = (p: number[]): number[] => [
			...links.map((l) => dist(place(p, P[`${l}.axle`]), P[`${l}.chassis`]) - dist(P[`${l}.axle`], P[`${l}.chassis`])),
			1e4 * height(p, 'left'),
			1e4 * height(p, 'right')
		];
		const data = { x: [0, 1, 2, 3, 4, 5, 6], y: [0, 0, 0, 0, 0, 0, 0] };
		let p = [0, 0, 0, 0, 0, 0];
		for (let round = 0; round < 4; round++) {
			const fit = levenbergMarquardt(data, (q: number[]) => (i: number) => residuals(q)[i], {
				initialValues: p,
				damping: 1e-6,
				gradientDifference: 1e-7,
				maxIterations: 400,
				errorTolerance: 1e-24
			});
			p = fit.parameterValues;
		}
		const wL = place(p, wl);
		const wR = place(p, wr);
		for (let i = 0; i < 3; i++) {
			expect(Math.abs(s.left.wheel_centre[i] - wL[i])).toBeLessThan(1e-3);
			expect(Math.abs(s.right.wheel_centre[i] - wR[i])).toBeLessThan(1e-3);
		}
		const ey = rot(p, [0, 1, 0]);
		expect(Math.abs(s.axle_roll - Math.atan2(ey[2], ey[1]) * DEG)).toBeLessThan(1e-3);
		expect(Math.abs(s.axle_yaw - Math.atan2(-ey[0], ey[1]) * DEG)).toBeLessThan(1e-3);
		const rms = Math.sqrt(residuals(p).slice(0, 5).reduce((t, r) => t + r * r, 0) / 5);
		expect(Math.abs(s.bind_rms - rms)).toBeLessThan(1e-4);
	});
});

describe('anti-squat of a live axle (Milliken & Milliken, Race Car Vehicle Dynamics, ch. 17)', () => {
	it('matches the hand-computed figure of the fixture at design', () => {
		// By hand: lower link line z = 190 + 0.075 x (axle end [0, 190], chassis end [500, 227.5]);
		// upper link line z = 430 + 0.06 (x + 10) (axle end [−10, 430], chassis end [320, 449.8]).
		// They meet where 0.015 x = 240.6: svic = [16040, 1393]. C = [0, 740, 0] (left contact point).
		// anti_squat = 100 · (2600 / 500) · (1393 − 0) / (16040 − 0) = 45.1596 %.
		const { solid, vehicle } = fixtureFile('invented-solid-rear-axle');
		const s = solveSolidAxle(solid, vehicle, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect(s.svic![0]).toBeCloseTo(16040, 6);
		expect(s.svic![1]).toBeCloseTo(1393, 6);
		expect(s.anti_squat).toBeCloseTo(45.1596, 3);
		const half = solveSolidAxle(solid, { ...vehicle!, rear_drive_fraction: 0.5 }, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect(half.anti_squat).toBeCloseTo(45.1596 / 2, 3);
		expect(solveSolidAxle(solid, null, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].anti_squat).toBeNull();
		// parallel lower and upper links in the side view: no instant centre, no anti-squat
		const par = solveSolidAxle(parallelogram(0.05, 'panhard'), vehicle, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect(par.svic).toBeNull();
		expect(par.anti_squat).toBeNull();
	});
});

describe('contract signs on the fixtures', () => {
	it('roll: the left wheel in bump, camber in chassis axes −roll, against the rolled ground 0; motion ratio about 1 with the spring over the axle', () => {
		for (const name of ['invented-solid-rear-axle', 'invented-solid-rear-axle-watt']) {
			const { solid, vehicle } = fixtureFile(name);
			const res = solveSolidAxle(solid, vehicle, { sweep: 'roll', from: -3, to: 3, step: 0.5 });
			expect(res.error).toBeNull();
			expect(res.samples).toHaveLength(13);
			const s = res.samples[12];
			expect(s.roll).toBe(3);
			expect(s.left.wheel_centre[2]).toBeGreaterThan(330); // left side down: the left wheel rises towards the body
			expect(s.right.wheel_centre[2]).toBeLessThan(270);
			// camber −asin(a_z): the axle tilts with the ground (to 0.001°: it also yaws a little, which takes some of a_z)
			expect(s.left.camber).toBeCloseTo(-3, 3);
			expect(s.right.camber).toBeCloseTo(3, 3);
			// the contact points lie on the rolled ground n · C = 0
			for (const side of [s.left, s.right]) {
				const c = side.contact_patch;
				expect(-Math.sin(3 * RAD) * c[1] + Math.cos(3 * RAD) * c[2]).toBeCloseTo(0, 6);
			}
			// spring straight above the axle pad, 140 mm inboard of the wheel: about 1 (a lever, common practice)
			const h = solveSolidAxle(solid, vehicle, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
			expect(h.left.motion_ratio!).toBeGreaterThan(0.95);
			expect(h.left.motion_ratio!).toBeLessThan(1.05);
		}
	});
});

describe('bad input names the field', () => {
	const base = () => structuredClone(fixtureFile('invented-solid-rear-axle').solid) as unknown as Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
	const cases: [string, (a: Record<string, any>) => void, string][] = [ // eslint-disable-line @typescript-eslint/no-explicit-any
		['missing Panhard end', (a) => delete a.points['panhard.axle'], 'solid.points.panhard.axle: missing'],
		['zero tyre radius', (a) => (a.tyre.loaded_radius = 0), 'solid.tyre.loaded_radius: must be > 0'],
		['zero-length link', (a) => (a.points['upper_left.axle'] = [...a.points['upper_left.chassis']]), 'solid.points.upper_left.axle: link upper_left has zero length'],
		['left wheel on the right', (a) => (a.points['wheel_left.centre'][1] = -740), 'solid.points.wheel_left.centre: y must be > 0'],
		['right wheel off the ground', (a) => (a.points['wheel_right.centre'][2] = a.points['wheel_right.axis_inner'][2] = 320), 'solid.points.wheel_right.centre: design contact point is 20.0 mm off the ground'],
		['Watt without its points', (a) => (a.lateral = 'watt'), 'solid.points.watt.pivot: missing'],
		['unknown locator', (a) => (a.lateral = 'torque_tube'), "solid.lateral: must be 'panhard' or 'watt'"],
		['wrong kind', (a) => (a.kind = 'double_wishbone'), "solid.kind: must be 'solid_axle'"],
		['non-finite coordinate', (a) => (a.points['lower_left.chassis'][2] = Infinity), 'solid.points.lower_left.chassis'],
		['text coordinate', (a) => (a.points['lower_left.axle'][0] = '12'), 'solid.points.lower_left.axle'],
		['half a spring', (a) => delete a.points['spring_left.chassis'], 'solid.points.spring_left.chassis: missing (spring_left.axle is given)'],
		['pinion behind the axle', (a) => (a.points['pinion.front'] = [-200, 0, 300]), 'solid.points.pinion.front: must lie ahead'],
		['no tyre', (a) => delete a.tyre, 'solid.tyre']
	];
	it.each(cases)('%s', (_, mutate, message) => {
		const a = base();
		mutate(a);
		const r = parseSolidAxle(a);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.message.startsWith(message)).toBe(true);
	});

	it("a Watt's centre link end on its pivot axis", () => {
		const a = structuredClone(fixtureFile('invented-solid-rear-axle-watt').solid) as SolidAxle;
		a.points['watt.upper_end'] = [-200, 0, 300];
		const r = parseSolidAxle(a);
		expect(r.ok ? '' : r.message).toMatch(/^solid\.points\.watt\.upper_end: lies on the centre link pivot axis/);
	});

	it('the fixtures are valid', () => {
		expect(parseSolidAxle(fixtureFile('invented-solid-rear-axle').solid).ok).toBe(true);
		expect(parseSolidAxle(fixtureFile('invented-solid-rear-axle-watt').solid).ok).toBe(true);
	});

	it('sweep options name the field', () => {
		const { solid } = fixtureFile('invented-solid-rear-axle');
		expect(() => solveSolidAxle(solid, null, { sweep: 'heave', from: 0, to: 10, step: 0 })).toThrow(/^step: must be > 0$/);
		expect(() => solveSolidAxle(solid, null, { sweep: 'heave', from: 10, to: 0, step: 1 })).toThrow(/^from: must be <= to$/);
		expect(() => solveSolidAxle(solid, null, { sweep: 'steer' as 'heave', from: 0, to: 1, step: 1 })).toThrow(SolidSweepOptionsError);
	});

	it('a link that cannot reach stops the sweep naming the link and the position', () => {
		// a Panhard rod 220 mm long, horizontal at design: its axle end cannot rise past 220 mm
		const a = parallelogram(0, 'panhard');
		a.points['panhard.chassis'] = [-90, 310, 305];
		a.points['panhard.axle'] = [-90, 530, 305];
		const res = solveSolidAxle(a, null, { sweep: 'heave', from: 0, to: 300, step: 20 });
		expect(res.error).not.toBeNull();
		expect(res.error!.link).toBe('panhard');
		expect(res.error!.sweep).toBe('heave');
		expect(res.error!.position).toBeGreaterThan(200);
		expect(res.error!.position).toBeLessThanOrEqual(240);
		expect(res.error!.message).toMatch(/^panhard cannot be assembled at travel \d+ mm/);
		// the samples before it are kept, ascending
		expect(res.samples.map((s) => s.travel)).toEqual(res.samples.map((_, i) => 20 * i));
		expect(res.samples.at(-1)!.travel).toBe(res.error!.position - 20);
	});
});
