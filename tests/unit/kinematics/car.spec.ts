// Frame: ISO 8855 vehicle axes, x forward, y left, z up; mm, kg, N, N/mm, N·m/deg.
// The car's statics (vehicle.ts, car.ts) against equilibrium, textbook formulas written out here and
// finite differences of the solver's own spring lengths. All numbers are invented.

import { describe, expect, it } from 'vitest';
import { carModelSchema, type CarModel } from '../../../src/lib/schemas/car-model';
import { parseCornerGeometry, type CornerGeometry } from '../../../src/lib/schemas/geometry';
import { carFigures, CarModelError, pitchSweep } from '../../../src/lib/server/kinematics/car';
import { pitchSweepQuery } from '../../../src/lib/schemas/axle';
import { solveSweep } from '../../../src/lib/server/kinematics/index';
import * as V from '../../../src/lib/server/kinematics/vehicle';
import { fixture } from './helpers';

const RAD = Math.PI / 180;

function corner(name: string): CornerGeometry {
	const r = parseCornerGeometry({ format: 'corner-geometry/1', ...fixture(name) });
	if (!r.ok) throw new Error(r.message);
	return r.corner;
}

/** An invented single-seater: pushrod front, five-link rear (the demo's corners), masses made up here. */
function model(): CarModel {
	return carModelSchema.parse({
		mass_items: [
			{ name: 'Chassis', mass: 180, x: -1300, y: 0, z: 280 },
			{ name: 'Engine', mass: 110, x: -1900, y: 0, z: 260 },
			{ name: 'Driver', mass: 72, x: -1100, y: 0, z: 250 },
			{ name: 'Fuel', mass: 30, x: -1500, y: 0, z: 200 },
			{ name: 'Ballast', mass: 10, x: -800, y: 80, z: 60 }
		],
		front: { unsprung_mass: 14, spring_rate: 90, tyre_rate: 250, right: 'mirror', steering: { rack_travel_per_turn: 60, rack_left_turn: '-y' } },
		rear: { unsprung_mass: 16, spring_rate: 110, tyre_rate: 260, right: 'mirror' }
	});
}
const corners = () => ({ front_left: corner('single-seater-front-left-pushrod'), rear_left: corner('single-seater-rear-left-five-link') });

describe('mass and corner weights', () => {
	it('corner weights hold the car in equilibrium: forces and both moments about the CG', () => {
		const wb: V.WheelBase = { front: { x: 0, yLeft: 700, yRight: -690 }, rear: { x: -2600, yLeft: 720, yRight: -720 } };
		const cg = [-1150, 25, 450];
		const w = V.cornerWeights(800, cg, wb);
		expect(w.fl + w.fr + w.rl + w.rr).toBeCloseTo(800, 9);
		// statics: Σ W_i x_i = W x_cg and Σ W_i y_i = W y_cg (the CG is the weights' centre)
		expect(w.fl * 0 + w.fr * 0 + (w.rl + w.rr) * -2600).toBeCloseTo(800 * cg[0], 6);
		expect(w.fl * 700 + w.fr * -690 + w.rl * 720 + w.rr * -720).toBeCloseTo(800 * cg[1], 6);
	});

	it('the centre of gravity of invented items by hand', () => {
		const m = V.massCentre([
			{ name: 'a', mass: 100, x: 0, y: 0, z: 300 },
			{ name: 'b', mass: 300, x: -2000, y: 100, z: 500 }
		])!;
		expect(m.mass).toBe(400);
		expect(m.cg[0]).toBeCloseTo(-1500, 12);
		expect(m.cg[1]).toBeCloseTo(75, 12);
		expect(m.cg[2]).toBeCloseTo(450, 12);
	});
});

describe('springs', () => {
	it('ride frequency f = √(k/m) / 2π (Thomson, Theory of Vibration with Applications, ch. 2)', () => {
		expect(V.rideFrequency(30, 250)).toBeCloseTo(Math.sqrt(30000 / 250) / (2 * Math.PI), 12);
		// springs in series: 1/k = 1/k_wheel + 1/k_tyre (same source)
		expect(V.rideRate(30, 200)).toBeCloseTo(1 / (1 / 30 + 1 / 200), 12);
	});

	it('wheel rate = spring rate × MR² at design, MR by finite differences of the solved spring length', () => {
		const c = corner('single-seater-rear-left-five-link');
		const h = 0.5;
		const res = solveSweep(c, { sweep: 'heave', from: -h, to: h, step: h, points: true });
		const mr = -(res.samples[2].spring_length! - res.samples[0].spring_length!) / (2 * h);
		const f = carFigures(model(), corners());
		expect(f.axles.rear.motion_ratio_left!).toBeCloseTo(mr, 4);
		expect(f.axles.rear.wheel_rate_left).toBeCloseTo(110 * mr * mr, 3);
	});

	it('spring roll stiffness: each wheel moves t/2 per radian of roll, so K = k t² / 2 (Milliken & Milliken, RCVD, ch. 16, quoted from memory)', () => {
		const k = 40; // N/mm
		const t = 1400;
		// one degree of roll: each wheel ±(t/2)·(π/180) mm; moment = 2 · k · (t/2 · π/180) · t/2 (N·mm)
		const moment = 2 * k * ((t / 2) * RAD) * (t / 2);
		expect(V.springRollStiffness(k, k, t)).toBeCloseTo(moment / 1000, 9);
	});
});

describe('lateral load transfer', () => {
	// Invented axle figures; the split formula written out as Milliken & Milliken, RCVD, ch. 18 gives it
	// (quoted from memory): ΔW_geometric = W_s · (b/l) · z_rf / t_f; the elastic part shared in proportion to
	// roll stiffness; the roll gradient φ/a_y = W_s H / (K_f + K_r − W_s H) (also Gillespie, Fundamentals of
	// Vehicle Dynamics, ch. 8, quoted from memory).
	const front: V.AxleStatics = { track: 1500, rcHeight: 40, x: 0, rollStiffness: 900, unsprungMass: 60, unsprungHeight: 300 };
	const rear: V.AxleStatics = { track: 1480, rcHeight: 110, x: -2600, rollStiffness: 600, unsprungMass: 80, unsprungHeight: 310 };
	const ms = 1100;
	const cg = [-1170, 0, 520];
	const lt = V.lateralLoadTransfer(ms, cg, front, rear, 1);
	const Ws = ms * V.G;
	const b = (cg[0] - rear.x) / 2600; // share of the sprung weight on the front axle

	it('geometric part through each roll centre', () => {
		expect(lt.front.geometric).toBeCloseTo((Ws * b * 40) / 1500, 6);
		expect(lt.rear.geometric).toBeCloseTo((Ws * (1 - b) * 110) / 1480, 6);
	});

	it('elastic part in proportion to roll stiffness, roll gradient as the textbook', () => {
		const H = 520 - (110 + (40 - 110) * b);
		expect(lt.roll_arm).toBeCloseTo(H, 9);
		const K = (900 + 600) / RAD; // N·m/rad
		const phi = (Ws * H) / 1000 / (K - (Ws * H) / 1000);
		expect(lt.roll_gradient).toBeCloseTo(phi / RAD, 9);
		expect((lt.front.elastic * 1500) / (lt.rear.elastic * 1480)).toBeCloseTo(900 / 600, 9);
		expect(lt.front.unsprung).toBeCloseTo((60 * V.G * 300) / 1500, 9);
	});

	it('moment balance: Σ ΔW · t equals the overturning moment of every mass plus the sprung CG shift in roll', () => {
		const sum = lt.front.total * 1500 + lt.rear.total * 1480; // N·mm
		const phi = lt.roll_gradient * RAD;
		const overturning = Ws * 520 + Ws * lt.roll_arm * phi + 60 * V.G * 300 + 80 * V.G * 310;
		expect(sum).toBeCloseTo(overturning, 3);
	});

	it('braking transfer W · a_x · h / L (Gillespie, ch. 2, quoted from memory)', () => {
		expect(V.longitudinalLoadTransfer(1200, 500, 2500, 0.9)).toBeCloseTo((1200 * V.G * 0.9 * 500) / 2500, 9);
	});
});

describe('the car', () => {
	it('moving the engine 100 mm rearward moves the CG and the weight distribution as statics says', () => {
		const before = carFigures(model(), corners());
		const m = model();
		m.mass_items[1].x -= 100;
		const after = carFigures(m, corners());
		expect(after.mass).toBeCloseTo(before.mass, 9);
		expect(after.cg[0] - before.cg[0]).toBeCloseTo((-110 * 100) / before.mass, 9);
		expect(after.front_share - before.front_share).toBeCloseTo((-110 * 100) / before.mass / before.wheelbase, 9);
		expect(after.cg[2]).toBeCloseTo(before.cg[2], 9);
		// the load-transfer split moves with it: less sprung weight on the front, so less front geometric transfer
		expect(after.lateral_transfer.front.geometric).toBeLessThan(before.lateral_transfer.front.geometric);
	});

	it('track and wheelbase follow from the corners; the front roll centre is the corner contract rc_height', () => {
		const f = carFigures(model(), corners());
		const fl = solveSweep(corners().front_left, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		const rl = solveSweep(corners().rear_left, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		expect(f.axles.front.track).toBeCloseTo(2 * fl.contact_patch[1], 6);
		expect(f.wheelbase).toBeCloseTo(fl.contact_patch[0] - rl.contact_patch[0], 6);
		expect(f.axles.front.rc_height!).toBeCloseTo(fl.rc_height!, 6);
	});

	it('names what is missing', () => {
		expect(() => carFigures(model(), { front_left: corner('single-seater-front-left-pushrod') })).toThrow(CarModelError);
		expect(() => carFigures(model(), { front_left: corner('single-seater-front-left-pushrod') })).toThrow(/^rear\.left: /);
		const m = model();
		m.rear.right = 'measured';
		expect(() => carFigures(m, corners())).toThrow(/^rear\.right: /);
		const bad = carModelSchema.safeParse({ ...model(), mass_items: [{ name: 'Engine', mass: -5, x: 0, y: 0, z: 100 }] });
		expect(bad.success).toBe(false);
		expect(bad.error!.issues[0].path.join('.')).toBe('mass_items.0.mass');
		const gain = carModelSchema.safeParse({ ...model(), front: { ...model().front, steering: { rack_travel_per_turn: 0, rack_left_turn: '-y' } } });
		expect(gain.error!.issues[0].path.join('.')).toBe('front.steering.rack_travel_per_turn');
	});
});

describe('a car with a solid rear axle', () => {
	/** The invented live axle (fixtures) moved to the single-seater's rear axle line, x − 2700. */
	function solidRear() {
		const file = fixture('invented-solid-rear-axle' as never) as unknown as { solid: { points: Record<string, number[]> } };
		const solid = JSON.parse(JSON.stringify(file.solid));
		for (const p of Object.values(solid.points) as number[][]) p[0] -= 2700;
		return solid;
	}

	it('needs no rear corners; the roll centre is the Panhard rod at the centreline; springs roll over their own spacing', () => {
		const m = model();
		m.rear.solid = solidRear();
		const f = carFigures(m, { front_left: corner('single-seater-front-left-pushrod') });
		const p = m.rear.solid!.points;
		// the rod's front-view line through its two ends, at y = 0 (common practice for a Panhard rod, no source)
		const [a, b] = [p['panhard.chassis'], p['panhard.axle']];
		const rc = a[2] + ((0 - a[1]) * (b[2] - a[2])) / (b[1] - a[1]);
		expect(f.axles.rear.rc_height!).toBeCloseTo(rc, 6);
		expect(f.axles.rear.track).toBeCloseTo(p['wheel_left.centre'][1] - p['wheel_right.centre'][1], 3);
		// springs at ±s/2 on the axle: roll moment per radian k·MR²·s²/2 (same construction as K = k t² / 2)
		const s = p['spring_left.axle'][1] - p['spring_right.axle'][1];
		const k = f.axles.rear.wheel_rate_left;
		expect(f.axles.rear.roll_stiffness_springs).toBeCloseTo(((k * s * s) / 2 / 1000) * RAD, 6);
		expect(f.wheelbase).toBeCloseTo(2700, 0);
	});

	it('refuses a solid axle on the front, naming the field', () => {
		const bad = carModelSchema.safeParse({ ...model(), front: { ...model().front, solid: solidRear() } });
		expect(bad.error!.issues[0].path.join('.')).toBe('front.solid');
	});
});

describe('pitch sweep of the whole car', () => {
	// Anti-dive with outboard brakes, the textbook's side-view construction (Milliken & Milliken, Race Car Vehicle
	// Dynamics, ch. 17): 100 · front brake share · (wheelbase / h) · tan θ, tan θ the side-view instant centre's rise
	// over its run from the contact patch. h and the wheelbase are the car's own, worked out here from the mass items.
	const settings = { frontBrakeFraction: 0.6, driveLayout: 'rwd' as const };
	const m = model();
	const c = corners();
	const r = pitchSweep(m, c, settings, { from: -2, to: 2, step: 0.5 });

	it('each axle travels by its distance from the CG times tan(pitch): front in bump, rear in rebound, nose down', () => {
		expect(r.error).toBeNull();
		expect(r.samples.map((s) => s.pitch)).toEqual([-2, -1.5, -1, -0.5, 0, 0.5, 1, 1.5, 2]);
		// the CG's x by moments of the mass items and the unsprung masses at the wheel centres (statics)
		const front = solveSweep(c.front_left, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].wheel_centre;
		const rear = solveSweep(c.rear_left, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0].wheel_centre;
		const items = m.mass_items.map((i) => [i.mass, i.x, i.z]);
		items.push([2 * 14, front[0], front[2]], [2 * 16, rear[0], rear[2]]);
		const mass = items.reduce((s, [w]) => s + w, 0);
		const xcg = items.reduce((s, [w, x]) => s + w * x, 0) / mass;
		// to 0.01 mm: the car places the wheels where its axle solver assembles them at design
		expect(r.pivot_x).toBeCloseTo(xcg, 2);
		const two = r.samples.find((s) => s.pitch === 2)!;
		expect(two.front.travel).toBeCloseTo((front[0] - xcg) * Math.tan(2 * RAD), 2);
		expect(two.rear.travel).toBeCloseTo((rear[0] - xcg) * Math.tan(2 * RAD), 2);
		expect(two.front.travel).toBeGreaterThan(0);
		expect(two.rear.travel).toBeLessThan(0);
	});

	it('anti-dive at every pitch is the textbook formula with the car’s CG height and wheelbase', () => {
		const front = solveSweep(c.front_left, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		const rear = solveSweep(c.rear_left, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		const items = m.mass_items.map((i) => [i.mass, i.z]);
		items.push([2 * 14, front.wheel_centre[2]], [2 * 16, rear.wheel_centre[2]]);
		const h = items.reduce((s, [w, z]) => s + w * z, 0) / items.reduce((s, [w]) => s + w, 0);
		const L = front.wheel_centre[0] - rear.wheel_centre[0];
		let checked = 0;
		for (const s of r.samples) {
			// the front-left corner solved alone at this travel: its side-view instant centre and contact patch
			const alone = solveSweep(c.front_left, { sweep: 'heave', from: s.front.travel, to: s.front.travel, step: 1 }).samples[0];
			if (!alone.svic) continue;
			const [sx, sz] = alone.svic;
			const [cx, , cz] = alone.contact_patch;
			expect(s.front.anti).toBeCloseTo((100 * 0.6 * (L / h) * (sz - cz)) / (cx - sx), 2);
			checked++;
		}
		expect(checked).toBe(r.samples.length);
	});

	it('a pitch range without design is refused naming from', () => {
		const q = pitchSweepQuery.safeParse({ from: '1', to: '3' });
		expect(q.success).toBe(false);
		expect(q.error!.issues[0].path).toEqual(['from']);
	});
});
