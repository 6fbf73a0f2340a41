// The car model page's new server data, against the real database through the built app: what changed between two
// car revisions (GET /api/v1/car-revisions/{id}/changes, checked against the edits made in the test), and the 3-D
// view's data in the page's load (the rear solid axle at design: its links between the file's own points; the body's
// CG the figures' CG; the steered axle's frames through the steering range).
import { readFileSync } from 'node:fs';
import { unflatten } from 'devalue';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, closeDb, freshAccount } from './helpers';

const front = { format: 'corner-geometry/1', ...JSON.parse(readFileSync('fixtures/single-seater-front-left-pushrod.json', 'utf8')) };
const solidFile = JSON.parse(readFileSync('fixtures/invented-solid-rear-axle.json', 'utf8')).solid;
const engineer = new Client();
let carId = '';
let firstId = '';
let secondId = '';

/** An invented car: a body and an engine, a steered front axle of corners, a solid rear axle 2700 mm behind. */
function model() {
	const solid = structuredClone(solidFile);
	for (const p of Object.values(solid.points) as number[][]) p[0] -= 2700;
	return {
		format: 'car-model/1',
		mass_items: [
			{ name: 'Body', mass: 900, x: -1300, y: 0, z: 450 },
			{ name: 'Engine', mass: 160, x: -300, y: 0, z: 380 },
			{ name: 'Spare wheel', mass: 18, x: -3100, y: 0, z: 300 }
		],
		front: { unsprung_mass: 30, spring_rate: 40, tyre_rate: 220, right: 'mirror', steering: { rack_travel_per_turn: 50, rack_left_turn: '+y' } },
		rear: { unsprung_mass: 55, spring_rate: 30, tyre_rate: 220, right: 'mirror', solid }
	};
}

/** The car model page's load data (SvelteKit's __data.json, devalue-encoded), its last node. */
async function pageData(path: string) {
	const res = await engineer.fetch(`${path.replace(/\?.*$/, '')}/__data.json${path.includes('?') ? path.slice(path.indexOf('?')) : ''}`);
	expect(res.status).toBe(200);
	const body = await res.json();
	const node = body.nodes.at(-1);
	return unflatten(node.data) as Record<string, any>;
}

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	carId = (await (await engineer.json('/api/v1/cars', 'POST', { name: 'Car screens API car', driveLayout: 'rwd' })).json()).id;
	const corner = await (await engineer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
	expect((await engineer.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: 'stock', note: '', geometry: front })).status).toBe(201);
	const first = await engineer.json(`/api/v1/cars/${carId}/revisions`, 'POST', { label: 'stock', model: model() });
	expect(first.status).toBe(201);
	firstId = (await first.json()).id;
	// the second: engine 100 mm back and 5 kg lighter, the spare wheel gone, ballast added, softer rear springs,
	// the Panhard rod's axle end 10 mm up
	const m = model();
	m.mass_items[1].x -= 100;
	m.mass_items[1].mass -= 5;
	m.mass_items.splice(2, 1);
	m.mass_items.push({ name: 'Ballast', mass: 20, x: -1000, y: 150, z: 60 });
	m.rear.spring_rate = 26;
	m.rear.solid.points['panhard.axle'][2] += 10;
	const second = await engineer.json(`/api/v1/cars/${carId}/revisions`, 'POST', { label: 'changed', model: m });
	expect(second.status).toBe(201);
	secondId = (await second.json()).id;
});
afterAll(closeDb);

describe('what changed between two car revisions', () => {
	test('lists each edit made above, and nothing else', async () => {
		const res = await engineer.fetch(`/api/v1/car-revisions/${secondId}/changes?vs=${firstId}`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.vs.id).toBe(firstId);
		const byKey = new Map(body.changes.map((c: any) => [c.what === 'mass_item' ? `item:${c.name}` : c.what === 'corner' ? `corner:${c.position}` : c.field, c]));
		expect(byKey.get('item:Engine')).toMatchObject({ change: 'changed', dx: -100, dy: 0, dz: 0, dmass: -5 });
		expect(byKey.get('item:Spare wheel')).toMatchObject({ change: 'removed', mass: 18, at: [-3100, 0, 300] });
		expect(byKey.get('item:Ballast')).toMatchObject({ change: 'added', mass: 20, at: [-1000, 150, 60] });
		expect(byKey.get('rear.spring_rate')).toMatchObject({ was: '30', now: '26', delta: -4, unit: 'N/mm' });
		const rod = byKey.get('rear.solid.points.panhard.axle') as any;
		expect(rod.delta).toBeCloseTo(10, 9);
		expect(body.changes).toHaveLength(5);
	});

	test('without vs it compares with the revision it was saved over; a first revision has none', async () => {
		const second = await (await engineer.fetch(`/api/v1/car-revisions/${secondId}/changes`)).json();
		expect(second.vs.id).toBe(firstId);
		const first = await (await engineer.fetch(`/api/v1/car-revisions/${firstId}/changes`)).json();
		expect(first).toMatchObject({ vs: null, changes: [] });
	});

	test('vs of another car, or not an id, is refused naming vs; another team cannot read either', async () => {
		const other = await engineer.fetch(`/api/v1/car-revisions/${secondId}/changes?vs=00000000-0000-4000-8000-0000000c0201`);
		expect(other.status).toBe(400);
		expect((await other.json()).error.field).toBe('vs');
		const bad = await engineer.fetch(`/api/v1/car-revisions/${secondId}/changes?vs=engine`);
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('vs');
		const { client: outsider } = await freshAccount('screens');
		expect((await outsider.fetch(`/api/v1/car-revisions/${secondId}/changes`)).status).toBe(404);
	});
});

describe("the car model page's 3-D data", () => {
	test('the solid rear axle at design is drawn between its own points; the CG is the figures\' CG', async () => {
		const data = await pageData(`/cars/${carId}/model?rev=${firstId}`);
		const { rear, body, front } = data.scene;
		expect(rear.type).toBe('solid');
		expect(rear.label).toBe('solid axle, four links and a Panhard rod');
		const p = model().rear.solid.points as Record<string, number[]>;
		// at design ride height (zero heave) the solved axle sits where the file puts it (solver tolerance 1e-6 mm)
		const link = (a: string, b: string) => rear.links.find((l: number[][]) => Math.hypot(l[0][0] - p[a][0], l[0][1] - p[a][1], l[0][2] - p[a][2]) < 1e-3 && Math.hypot(l[1][0] - p[b][0], l[1][1] - p[b][1], l[1][2] - p[b][2]) < 1e-3);
		for (const l of ['lower_left', 'lower_right', 'upper_left', 'upper_right', 'panhard']) expect(link(`${l}.chassis`, `${l}.axle`), l).toBeTruthy();
		expect(rear.links).toHaveLength(7); // four links, the rod, two springs
		expect(rear.wheels[0].radius).toBe(300);
		expect(body.cg).toEqual(data.figures.cg);
		expect(body.items.map((i: any) => i.name)).toEqual(['Body', 'Engine', 'Spare wheel']);
		// the steered axle through ±180° of steering wheel in 10° steps, every point of both sides
		expect(front.frames).toHaveLength(37);
		expect(front.frames[18].steering_wheel).toBe(0);
		expect(Object.keys(front.frames[0].left.points)).toContain('wheel.axis_inner');
	});

	test("a compared revision brings its axle charts' data and the changes", async () => {
		const data = await pageData(`/cars/${carId}/model?rev=${secondId}&vs=${firstId}`);
		expect(data.compare.id).toBe(firstId);
		expect(data.compare.axles.steer.samples).toHaveLength(37);
		expect(data.compare.axles.roll.rear.length).toBe(25);
		expect(data.compare.changes.some((c: any) => c.name === 'Engine' && c.dx === -100)).toBe(true);
	});
});
