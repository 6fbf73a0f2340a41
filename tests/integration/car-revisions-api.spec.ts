// Car revisions and axle sweeps through the API, against the real database: saving, reading back, immutability,
// bad input named by field with nothing written, and the axle sweep's mirror symmetry checked by hand.
import { readFileSync } from 'node:fs';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { carRevisions } from '../../src/lib/server/db/schema';
import { Client, DEMO_CAR_ID, closeDb, freshAccount, testDb } from './helpers';

const front = { format: 'corner-geometry/1', ...JSON.parse(readFileSync('fixtures/single-seater-front-left-pushrod.json', 'utf8')) };
const rear = { format: 'corner-geometry/1', ...JSON.parse(readFileSync('fixtures/single-seater-rear-left-five-link.json', 'utf8')) };
const engineer = new Client();
const viewer = new Client();
let carId = '';

/** An invented model: five mass items, springs, a front bar to the lower wishbone, steering. */
function model() {
	return {
		format: 'car-model/1',
		mass_items: [
			{ name: 'Chassis', mass: 175, x: -1250, y: 0, z: 290 },
			{ name: 'Engine', mass: 105, x: -1950, y: 0, z: 250 },
			{ name: 'Driver', mass: 72, x: -1150, y: 0, z: 240 }
		],
		front: {
			unsprung_mass: 14,
			spring_rate: 90,
			tyre_rate: 250,
			right: 'mirror',
			steering: { rack_travel_per_turn: 60, rack_left_turn: '+y' },
			anti_roll_bar: { pivot: [-130, 420, 260], arm_end: [20, 420, 260], link_end: [20, 420, 112], link_on: 'lower', torsional_stiffness: 30 }
		},
		rear: { unsprung_mass: 16, spring_rate: 110, tyre_rate: 260, right: 'mirror' }
	};
}

async function count() {
	const [row] = await testDb()
		.select({ n: sql<number>`count(*)::int` })
		.from(carRevisions)
		.where(eq(carRevisions.carId, carId));
	return row.n;
}

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	carId = (await (await engineer.json('/api/v1/cars', 'POST', { name: 'Car model API car', frontBrakeFraction: 0.6, driveLayout: 'rwd' })).json()).id;
	for (const [position, kind, geometry] of [['front_left', 'double_wishbone', front], ['rear_left', 'multi_link', rear]] as const) {
		const corner = await (await engineer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position, kind })).json();
		const rev = await engineer.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: 'stock', note: '', geometry });
		expect(rev.status).toBe(201);
	}
});
afterAll(closeDb);

describe('car revisions', () => {
	let first = '';
	test('saving answers 201 with the figures; reading gives the same model back', async () => {
		const res = await engineer.json(`/api/v1/cars/${carId}/revisions`, 'POST', { label: 'stock masses', model: model() });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.number).toBe(1);
		expect(Object.keys(body.corners).sort()).toEqual(['front_left', 'rear_left']);
		first = body.id;
		const got = await (await viewer.fetch(`/api/v1/car-revisions/${first}`)).json();
		expect(got.model.mass_items).toEqual(model().mass_items);
		// the figures balance: corner weights add up to the total of the items and four unsprung corners
		const w = got.figures.corner_weights;
		expect(w.fl + w.fr + w.rl + w.rr).toBeCloseTo(175 + 105 + 72 + 2 * 14 + 2 * 16, 6);
		expect(got.figures.axles.front.bar.roll_stiffness).toBeGreaterThan(0);
	});

	test('the engine 100 mm rearward moves the front weight by m·Δx / (M·L), as statics says', async () => {
		const m = model();
		m.mass_items[1].x -= 100;
		const res = await engineer.json(`/api/v1/cars/${carId}/revisions`, 'POST', { label: 'engine back', model: m });
		expect(res.status).toBe(201);
		const after = (await res.json()).figures;
		const before = (await (await viewer.fetch(`/api/v1/car-revisions/${first}`)).json()).figures;
		expect(after.front_share - before.front_share).toBeCloseTo((-105 * 100) / before.mass / before.wheelbase, 9);
		const list = await (await viewer.fetch(`/api/v1/cars/${carId}/revisions`)).json();
		expect(list.revisions.map((r: { number: number }) => r.number)).toEqual([2, 1]);
	});

	test('a viewer cannot save a car revision', async () => {
		const res = await viewer.json(`/api/v1/cars/${carId}/revisions`, 'POST', { model: model() });
		expect(res.status).toBe(403);
	});

	test('a car revision cannot be changed in the database', async () => {
		await expect(testDb().update(carRevisions).set({ label: 'changed' }).where(eq(carRevisions.id, first))).rejects.toThrow();
	});

	const bad: [string, (m: ReturnType<typeof model>) => unknown, string][] = [
		['a negative mass', (m) => ((m.mass_items[0].mass = -5), m), 'model.mass_items.0.mass'],
		['a rack gain of zero', (m) => ((m.front.steering.rack_travel_per_turn = 0), m), 'model.front.steering.rack_travel_per_turn'],
		['a drop link that cannot reach', (m) => ((m.front.anti_roll_bar.link_end = [170, 420, 262]), m), 'front.anti_roll_bar.link_end'],
		['a measured right side the car does not have', (m) => ((m.rear.right = 'measured'), m), 'rear.right'],
		['two mass items of one name', (m) => ((m.mass_items[1].name = 'chassis'), m), 'model.mass_items'],
		['a mass item below the ground', (m) => ((m.mass_items[2].z = -10), m), 'model.mass_items.2.z'],
		['a keep-out box of zero size', (m) => ({ ...m, keep_out: [{ shape: 'box', name: 'Gearbox', min: [-2400, -170, 120], max: [-2400, 170, 330] }] }), 'model.keep_out.0.max.0'],
		['a rim barrel of zero width', (m) => ({ ...m, keep_out: [{ shape: 'rim', name: 'Rim', axle: 'front', barrel_radius: 150, clearance: 8, inboard: 0, outboard: 0 }] }), 'model.keep_out.0.outboard']
	];
	for (const [what, change, field] of bad) {
		test(`${what} is refused naming ${field}, nothing written`, async () => {
			const before = await count();
			const res = await engineer.json(`/api/v1/cars/${carId}/revisions`, 'POST', { model: change(model()) });
			expect(res.status).toBe(400);
			expect((await res.json()).error.field).toBe(field);
			expect(await count()).toBe(before);
		});
	}

	test('a car missing a corner of an axle it analyses is refused naming it', async () => {
		const res = await engineer.json(`/api/v1/cars/${DEMO_CAR_ID}/revisions`, 'POST', { model: model() });
		expect(res.status).toBe(400);
		expect((await res.json()).error).toMatchObject({ field: 'rear.left' });
	});

	test('another team cannot read a car revision (404, as if it did not exist)', async () => {
		const { client } = await freshAccount('car-model-outsider');
		expect((await client.fetch(`/api/v1/car-revisions/${first}`)).status).toBe(404);
	});
});

describe('axle sweeps', () => {
	test('steer: the mirrored sides turn as mirror images (δ_left(sw) = −δ_right(−sw)), with Ackermann and ratio', async () => {
		const list = await (await viewer.fetch(`/api/v1/cars/${carId}/revisions`)).json();
		const id = list.revisions[0].id;
		const res = await viewer.fetch(`/api/v1/car-revisions/${id}/axles/front?sweep=steer&from=-90&to=90&step=30`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.format).toBe('axle-solve/1');
		const s = body.samples as { steering_wheel: number; delta_left: number; delta_right: number; ackermann: number | null; steering_ratio: number }[];
		expect(s.map((x) => x.steering_wheel)).toEqual([-90, -60, -30, 0, 30, 60, 90]);
		for (const x of s) {
			const m = s.find((o) => o.steering_wheel === -x.steering_wheel)!;
			expect(x.delta_left).toBeCloseTo(-m.delta_right, 9);
			expect(x.steering_ratio).toBeGreaterThan(0);
		}
		// rack_left_turn '+y' and a positive steering wheel: a left turn, the left (inner) wheel steers left
		expect(s.at(-1)!.delta_left).toBeGreaterThan(0);
	});

	test('roll: the roll centre comes from both sides; bad sweep parameters are named', async () => {
		const list = await (await viewer.fetch(`/api/v1/cars/${carId}/revisions`)).json();
		const id = list.revisions[0].id;
		const roll = await (await viewer.fetch(`/api/v1/car-revisions/${id}/axles/rear?sweep=roll&from=-2&to=2&step=1`)).json();
		expect(roll.samples).toHaveLength(5);
		expect(roll.samples[2].rc[0]).toBeCloseTo(0, 6);
		expect(roll.samples[0].rc[0]).toBeCloseTo(-roll.samples[4].rc[0], 6);
		const badStep = await viewer.fetch(`/api/v1/car-revisions/${id}/axles/rear?sweep=roll&step=0`);
		expect(badStep.status).toBe(400);
		expect((await badStep.json()).error.field).toBe('step');
		const noSteer = await viewer.fetch(`/api/v1/car-revisions/${id}/axles/rear?sweep=steer`);
		expect(noSteer.status).toBe(400);
		expect((await noSteer.json()).error.field).toBe('steering');
		expect((await viewer.fetch(`/api/v1/car-revisions/${id}/axles/middle?sweep=roll`)).status).toBe(404);
	});
});

describe('a car with a solid rear axle', () => {
	test('saves without rear corners; its rear roll sweep answers with the rod height at the centreline; steer is refused naming sweep', async () => {
		const car = (await (await engineer.json('/api/v1/cars', 'POST', { name: 'Live axle API car', driveLayout: 'rwd' })).json()).id;
		const corner = await (await engineer.json(`/api/v1/cars/${car}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
		expect((await engineer.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: 'stock', note: '', geometry: front })).status).toBe(201);
		const solid = JSON.parse(readFileSync('fixtures/invented-solid-rear-axle.json', 'utf8')).solid;
		for (const p of Object.values(solid.points) as number[][]) p[0] -= 2700;
		const m = model();
		(m.rear as Record<string, unknown>).solid = solid;
		const res = await engineer.json(`/api/v1/cars/${car}/revisions`, 'POST', { label: 'live axle', model: m });
		expect(res.status).toBe(201);
		const { id } = await res.json();
		const roll = await (await viewer.fetch(`/api/v1/car-revisions/${id}/axles/rear?sweep=roll&from=0&to=0&step=1`)).json();
		const [a, b] = [solid.points['panhard.chassis'], solid.points['panhard.axle']];
		expect(roll.samples[0].rc_height).toBeCloseTo(a[2] + ((0 - a[1]) * (b[2] - a[2])) / (b[1] - a[1]), 6); // common practice
		const steer = await viewer.fetch(`/api/v1/car-revisions/${id}/axles/rear?sweep=steer`);
		expect(steer.status).toBe(400);
		expect((await steer.json()).error.field).toBe('sweep');
	});
});
