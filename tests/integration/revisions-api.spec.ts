import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, DEMO_CAR_ID, closeDb, freshAccount } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const right = JSON.parse(readFileSync('fixtures/club-fwd-front-right.json', 'utf8'));
const engineer = new Client();
const viewer = new Client();
let carId = '';
let cornerId = '';

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Revisions API car' })).json();
	carId = car.id;
	const corner = await engineer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' });
	expect(corner.status).toBe(201);
	cornerId = (await corner.json()).id;
});
afterAll(closeDb);

describe('corners', () => {
	test('a second corner at the same position is refused naming the field', async () => {
		const res = await engineer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position: 'front_left', kind: 'strut' });
		expect(res.status).toBe(400);
		expect((await res.json()).error).toMatchObject({ field: 'position', code: 'conflict' });
	});

	test('an unknown kind is refused naming the field', async () => {
		const res = await engineer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position: 'rear_left', kind: 'trailing_arm' });
		expect(res.status).toBe(400);
		expect((await res.json()).error.field).toBe('kind');
	});

	test('the car lists its corner', async () => {
		const res = await viewer.fetch(`/api/v1/cars/${carId}/corners`);
		expect((await res.json()).corners).toEqual([expect.objectContaining({ id: cornerId, position: 'front_left' })]);
	});

	test('a viewer cannot add a corner', async () => {
		const res = await viewer.json(`/api/v1/cars/${carId}/corners`, 'POST', { position: 'rear_right', kind: 'strut' });
		expect(res.status).toBe(403);
	});
});

describe('revisions', () => {
	test('POST answers 201 with id and number, and GET gives back the same corner file', async () => {
		const res = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock', note: 'as built', geometry: stock });
		expect(res.status).toBe(201);
		const { id, number } = await res.json();
		expect(number).toBe(1);
		const got = await (await viewer.fetch(`/api/v1/revisions/${id}`)).json();
		expect(got).toMatchObject({ id, number: 1, label: 'stock', note: 'as built', kind: 'double_wishbone', cornerId, carId });
		expect(got.geometry.points).toEqual(stock.points);
	});

	test('two saves from the same parent at once both get a revision with distinct numbers', async () => {
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		const parentId = list.revisions[0].id;
		const post = (label: string) => engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label, parentId, geometry: stock });
		const results = await Promise.all([post('a'), post('b'), post('c')]);
		expect(results.map((r) => r.status)).toEqual([201, 201, 201]);
		const numbers = (await Promise.all(results.map((r) => r.json()))).map((b) => b.number).sort();
		expect(new Set(numbers).size).toBe(3);
		const after = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		expect(after.revisions.filter((r: { parentId: string }) => r.parentId === parentId)).toHaveLength(3);
	});

	test('a corner file that fails the schema is a 400 naming the field, and nothing is saved', async () => {
		const before = (await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json()).revisions.length;
		const bad = structuredClone(stock);
		delete bad.points['upper.outer'];
		const res = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { geometry: bad });
		expect(res.status).toBe(400);
		expect((await res.json()).error).toMatchObject({ code: 'invalid', field: 'geometry.points.upper.outer' });
		const after = (await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json()).revisions.length;
		expect(after).toBe(before);
	});

	test('a right-hand corner file is refused on a left corner, naming the wheel centre', async () => {
		const res = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { geometry: right });
		expect(res.status).toBe(400);
		expect((await res.json()).error.field).toBe('geometry.points.wheel.centre');
	});

	test('a viewer cannot save a revision', async () => {
		const res = await viewer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { geometry: stock });
		expect(res.status).toBe(403);
	});

	test('another team gets 404 for the corner and its revisions', async () => {
		const { client } = await freshAccount('rev-outsider');
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		expect((await client.fetch(`/api/v1/corners/${cornerId}/revisions`)).status).toBe(404);
		expect((await client.fetch(`/api/v1/revisions/${list.revisions[0].id}`)).status).toBe(404);
		expect((await client.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { geometry: stock })).status).toBe(404);
		expect((await client.fetch(`/api/v1/cars/${DEMO_CAR_ID}/corners`)).status).toBe(404);
	});

	test('the baseline can be set by an engineer, not by a viewer', async () => {
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		const first = list.revisions.at(-1).id;
		expect((await viewer.json(`/api/v1/corners/${cornerId}/baseline`, 'PUT', { revisionId: first })).status).toBe(403);
		expect((await engineer.json(`/api/v1/corners/${cornerId}/baseline`, 'PUT', { revisionId: first })).status).toBe(200);
		const after = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		expect(after.baselineRevisionId).toBe(first);
		expect(after.revisions.find((r: { id: string }) => r.id === first).isBaseline).toBe(true);
	});
});

describe('export and solve', () => {
	test('the exported corner file imports again unchanged', async () => {
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		const id = list.revisions.at(-1).id;
		const exported = await viewer.fetch(`/api/v1/revisions/${id}/export?format=geometry`);
		expect(exported.headers.get('content-disposition')).toMatch(/attachment; filename=".*\.json"/);
		const file = await exported.json();
		const res = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'round trip', geometry: file });
		const again = await (await viewer.fetch(`/api/v1/revisions/${(await res.json()).id}/export?format=geometry`)).json();
		expect(again).toEqual(file);
	});

	test('the CSV export lists every point in mm', async () => {
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		const csv = await (await viewer.fetch(`/api/v1/revisions/${list.revisions.at(-1).id}/export?format=csv`)).text();
		const lines = csv.trim().split(/\r\n/);
		expect(lines[0]).toBe('point,x_mm,y_mm,z_mm');
		expect(lines).toContain(`lower.outer,${stock.points['lower.outer'].join(',')}`);
		expect(lines).toHaveLength(1 + Object.keys(stock.points).length);
	});

	test('GET …/solve answers corner-solve/1 with the default heave sweep', async () => {
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		const body = await (await viewer.fetch(`/api/v1/revisions/${list.revisions.at(-1).id}/solve`)).json();
		expect(body).toMatchObject({ format: 'corner-solve/1', sweep: 'heave', kind: 'double_wishbone' });
		expect(body.samples.map((s: { travel: number }) => s.travel)).toEqual(Array.from({ length: 21 }, (_, i) => -50 + 5 * i));
	});

	test('POST /solve solves an unsaved corner and names a bad sweep field', async () => {
		const ok = await viewer.json('/api/v1/solve', 'POST', { geometry: stock, sweep: 'roll', from: -1, to: 1, step: 1 });
		expect(ok.status).toBe(200);
		const body = await ok.json();
		expect(body.samples.map((s: { roll: number }) => s.roll)).toEqual([-1, 0, 1]);
		const bad = await viewer.json('/api/v1/solve', 'POST', { geometry: stock, sweep: 'heave', step: 0 });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('step');
		expect((await new Client().json('/api/v1/solve', 'POST', { geometry: stock })).status).toBe(401);
	});

	test('fields= and decimals= cut each sample to the asked quantities, rounded; bad ones are refused naming the field', async () => {
		const sweep = { geometry: stock, sweep: 'heave', from: -20, to: 20, step: 10 };
		const full = await (await viewer.json('/api/v1/solve', 'POST', sweep)).json();
		const cut = await (await viewer.json('/api/v1/solve', 'POST', { ...sweep, fields: ['toe', 'fvic'], decimals: 3 })).json();
		expect(cut.format).toBe('corner-solve/1');
		expect(cut.samples).toHaveLength(full.samples.length);
		const round = (v: number) => Math.round(v * 1000) / 1000;
		cut.samples.forEach((s: Record<string, unknown>, i: number) => {
			const f = full.samples[i];
			expect(Object.keys(s)).toEqual(['travel', 'toe', 'fvic']);
			expect(s.toe).toBe(round(f.toe));
			expect(s.fvic).toEqual(f.fvic === null ? null : f.fvic.map(round));
		});
		// the same in a query string, on a saved revision
		const list = await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json();
		const saved = await (await viewer.fetch(`/api/v1/revisions/${list.revisions.at(-1).id}/solve?fields=camber,toe&decimals=2&from=0&to=0`)).json();
		expect(Object.keys(saved.samples[0])).toEqual(['travel', 'camber', 'toe']);
		expect(Math.abs(saved.samples[0].camber * 100 - Math.round(saved.samples[0].camber * 100))).toBeLessThan(1e-9);

		const unknown = await viewer.json('/api/v1/solve', 'POST', { ...sweep, fields: ['toe', 'bump_steer'] });
		expect(unknown.status).toBe(400);
		expect((await unknown.json()).error.field).toBe('fields.1');
		const tooFine = await viewer.json('/api/v1/solve', 'POST', { ...sweep, decimals: 13 });
		expect(tooFine.status).toBe(400);
		expect((await tooFine.json()).error.field).toBe('decimals');
	});

	test('a corner that cannot be assembled returns the solved part and names the link', async () => {
		const cannot = JSON.parse(readFileSync('fixtures/cannot-assemble.json', 'utf8'));
		const res = await viewer.json('/api/v1/solve', 'POST', { geometry: cannot, sweep: 'heave', from: -50, to: 50, step: 5 });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.error).toMatchObject({ sweep: 'heave' });
		expect(typeof body.error.link).toBe('string');
		expect(body.samples.length).toBeGreaterThan(0);
		expect(body.samples.length).toBeLessThan(21);
	});
});

describe('counts in the lists', () => {
	test("the car's corner list and the team's car list count what is there", async () => {
		const revs = (await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json()).revisions;
		const [corner] = (await (await viewer.fetch(`/api/v1/cars/${carId}/corners`)).json()).corners;
		expect(corner.revisionCount).toBe(revs.length);
		expect(corner.latestNumber).toBe(revs[0].number);
		const cars = (await (await viewer.fetch('/api/v1/cars')).json()).cars;
		expect(cars.find((c: { id: string }) => c.id === carId).cornerCount).toBe(1);
		expect(cars.find((c: { id: string }) => c.id === DEMO_CAR_ID).cornerCount).toBe(2);
	});
});

describe('plausibility warnings in the API answers (issue 19)', () => {
	test('a slip is saved with its warning named in words; the revision keeps it when read back; the stock file has none', async () => {
		const slip = structuredClone(stock);
		slip.points['steer.outer'][1] = slip.points['wheel.centre'][1] + 180; // a tie-rod joint 180 mm outboard of the wheel
		const saved = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'slip', note: '', geometry: slip });
		expect(saved.status).toBe(201);
		const body = await saved.json();
		expect(body.warnings).toEqual([expect.objectContaining({ rule: 'outside_wheel', points: ['steer.outer'], message: expect.stringContaining('Tie rod, outer joint') })]);
		const read = await (await viewer.fetch(`/api/v1/revisions/${body.id}`)).json();
		expect(read.warnings.map((w: { rule: string }) => w.rule)).toEqual(['outside_wheel']);
		const clean = await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock again', note: '', geometry: stock })).json();
		expect(clean.warnings).toEqual([]);
	});
});

describe('ride height as a new design position (issue 19)', () => {
	test('lowered 20 mm: the figures are the heave sweep’s at +20 mm; saved, a new revision; 0 and 200 mm refused naming change', async () => {
		const first = (await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'for ride height', note: '', geometry: stock })).json()).id;
		const res = await engineer.json(`/api/v1/revisions/${first}/ride-height`, 'POST', { change: -20 });
		expect(res.status).toBe(200);
		const body = await res.json();
		const heave = (await (await engineer.fetch(`/api/v1/revisions/${first}/solve?sweep=heave&from=20&to=20&step=1`)).json()).samples[0];
		for (const k of ['camber', 'toe', 'caster', 'kpi', 'motion_ratio']) expect(body.after[k], k).toBeCloseTo(heave[k], 6);
		for (const [change, message] of [[0, /must not be 0/], [200, /≤ 100 mm/]] as const) {
			const bad = await engineer.json(`/api/v1/revisions/${first}/ride-height`, 'POST', { change });
			expect(bad.status).toBe(400);
			const { error } = await bad.json();
			expect(error.field).toBe('change');
			expect(error.message).toMatch(message);
		}
		const refused = await viewer.json(`/api/v1/revisions/${first}/ride-height`, 'POST', { change: -20, save: true });
		expect(refused.status).toBe(403);
		const saved = await engineer.json(`/api/v1/revisions/${first}/ride-height`, 'POST', { change: -20, save: true });
		expect(saved.status).toBe(201);
		const rev = await (await viewer.fetch(`/api/v1/revisions/${(await saved.json()).id}`)).json();
		expect(rev.label).toBe('ride height −20 mm');
		expect(rev.geometry.points['lower.front'][2]).toBeCloseTo(stock.points['lower.front'][2] - 20, 9);
	});
});

describe('joint angles (issue 19)', () => {
	test('every ball joint and rod end through the sweeps; the engineer’s limits saved on the corner judge every revision', async () => {
		const first = (await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'for joint angles', note: '', geometry: stock })).json()).id;
		const res = await viewer.json(`/api/v1/revisions/${first}/joint-angles`, 'POST', { heave: { from: -40, to: 40, step: 10 } });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.sweeps).toEqual(['heave', 'roll', 'steer']);
		const points = body.joints.map((j: { point: string }) => j.point);
		expect(points).toEqual(expect.arrayContaining(['lower.outer', 'upper.outer', 'steer.inner', 'steer.outer']));
		const upper = body.joints.find((j: { point: string }) => j.point === 'upper.outer');
		expect(upper.sweeps[0].positions).toEqual([-40, -30, -20, -10, 0, 10, 20, 30, 40]);
		expect(upper.limitSet).toBe(false);
		// a viewer may not set limits; an engineer may, by point name
		expect((await viewer.json(`/api/v1/corners/${cornerId}/joint-limits`, 'PUT', { joints: { 'upper.outer': { limit: 1 } } })).status).toBe(403);
		const put = await engineer.json(`/api/v1/corners/${cornerId}/joint-limits`, 'PUT', { joints: { 'upper.outer': { limit: upper.max / 2 }, 'steer.outer': { axis: 'auto' } } });
		expect(put.status).toBe(200);
		// an entry that says nothing (auto, no limit) is not kept
		expect((await put.json()).joints).toEqual({ 'upper.outer': { limit: upper.max / 2 } });
		expect((await (await viewer.fetch(`/api/v1/corners/${cornerId}/joint-limits`)).json()).joints).toEqual({ 'upper.outer': { limit: upper.max / 2 } });
		const judged = (await (await viewer.json(`/api/v1/revisions/${first}/joint-angles`, 'POST', { heave: { from: -40, to: 40, step: 10 } })).json()).joints.find((j: { point: string }) => j.point === 'upper.outer');
		expect(judged).toMatchObject({ limitSet: true, limit: upper.max / 2, pass: false });
		// a setting tried in the request, over the saved one, without saving it
		const tried = (await (await viewer.json(`/api/v1/revisions/${first}/joint-angles`, 'POST', { heave: { from: -40, to: 40, step: 10 }, joints: { 'upper.outer': { limit: 45 } } })).json()).joints.find((j: { point: string }) => j.point === 'upper.outer');
		expect(tried).toMatchObject({ limit: 45, pass: true });
		// bad input names its field
		for (const [path, body, field] of [
			[`/api/v1/revisions/${first}/joint-angles`, { joints: { 'strut.top': { limit: 10 } } }, 'joints.strut.top'],
			[`/api/v1/revisions/${first}/joint-angles`, { heave: { from: 10, to: 40, step: 5 } }, 'heave.from'],
			[`/api/v1/revisions/${first}/joint-angles`, { joints: { 'upper.outer': { limit: 0 } } }, 'joints.upper.outer.limit'],
			[`/api/v1/corners/${cornerId}/joint-limits`, { joints: { 'strut.top': { limit: 10 } } }, 'joints.strut.top']
		] as const) {
			const bad = await engineer.json(path, path.endsWith('joint-limits') ? 'PUT' : 'POST', body);
			expect(bad.status, field).toBe(400);
			expect((await bad.json()).error.field).toBe(field);
		}
	});
});

describe('combined-motion maps (issue 19)', () => {
	test('wheel travel × rack travel and body heave × roll; ranges named when wrong', async () => {
		const first = (await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'for maps', note: '', geometry: stock })).json()).id;
		const res = await viewer.json(`/api/v1/revisions/${first}/map`, 'POST', { kind: 'heave_steer', heave: { from: -40, to: 40, step: 10 }, steer: { from: -20, to: 20, step: 10 } });
		expect(res.status).toBe(200);
		const map = await res.json();
		expect(map.x).toEqual([-40, -30, -20, -10, 0, 10, 20, 30, 40]);
		expect(map.y).toEqual([-20, -10, 0, 10, 20]);
		// at no rack travel, the heave sweep's toe (the solve endpoint)
		const heave = (await (await viewer.fetch(`/api/v1/revisions/${first}/solve?sweep=heave&from=-40&to=40&step=10`)).json()).samples;
		expect(map.values.toe[2]).toEqual(heave.map((s: { toe: number }) => s.toe));
		const roll = await viewer.json(`/api/v1/revisions/${first}/map`, 'POST', { kind: 'heave_roll', heave: { from: -20, to: 20, step: 10 }, roll: { from: -2, to: 2, step: 1 } });
		expect(roll.status).toBe(200);
		expect((await roll.json()).values.camber_ground).toHaveLength(5);
		for (const [body, field] of [
			[{ kind: 'heave_steer', heave: { from: -40, to: 40, step: 1 }, steer: { from: -20, to: 20, step: 10 } }, 'heave.step'],
			[{ kind: 'heave_roll', heave: { from: -20, to: 20, step: 10 }, roll: { from: -20, to: 2, step: 1 } }, 'roll.from'],
			[{ kind: 'sideways' }, 'kind']
		] as const) {
			const bad = await viewer.json(`/api/v1/revisions/${first}/map`, 'POST', body);
			expect(bad.status, field).toBe(400);
			expect((await bad.json()).error.field).toBe(field);
		}
	});
});

describe('ride height and rake of the whole car (issue 19)', () => {
	test('front −15, rear −5: each corner as its own ride-height change, the rake over the wheelbase, saved all at once', async () => {
		const car = (await (await engineer.json('/api/v1/cars', 'POST', { name: 'Rake car', wheelbaseMm: 2500 })).json()).id;
		const fl = (await (await engineer.json(`/api/v1/cars/${car}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
		const fr = (await (await engineer.json(`/api/v1/cars/${car}/corners`, 'POST', { position: 'front_right', kind: 'double_wishbone' })).json()).id;
		const rl = (await (await engineer.json(`/api/v1/cars/${car}/corners`, 'POST', { position: 'rear_left', kind: 'double_wishbone' })).json()).id;
		// the rear-left corner: the front-left's points moved 2500 mm back (an invented layout for the test)
		const back = structuredClone(stock);
		for (const p of Object.values(back.points) as number[][]) p[0] -= 2500;
		delete back.vehicle;
		const revs: Record<string, string> = {};
		for (const [id, g] of [[fl, stock], [fr, right], [rl, back]] as const) {
			const made = await engineer.json(`/api/v1/corners/${id}/revisions`, 'POST', { label: 'stock', note: '', geometry: g });
			expect(made.status).toBe(201);
			revs[id] = (await made.json()).id;
		}
		const res = await viewer.json(`/api/v1/cars/${car}/ride-height`, 'POST', { front: -15, rear: -5 });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.corners.map((c: { corner: { id: string } }) => c.corner.id).sort(), JSON.stringify(body).slice(0, 400)).toEqual([fl, fr, rl].sort());
		// nose down by atan(10 / 2500)
		expect(body.noseDown).toBeCloseTo((Math.atan(10 / 2500) * 180) / Math.PI, 9);
		expect(body.wheelbaseFrom).toBe('car');
		for (const [id, change] of [[fl, -15], [fr, -15], [rl, -5]] as const) {
			const c = body.corners.find((x: { corner: { id: string } }) => x.corner.id === id);
			const single = await (await viewer.json(`/api/v1/revisions/${revs[id]}/ride-height`, 'POST', { change })).json();
			expect(c.change).toBe(change);
			expect(c.after).toEqual(single.after);
		}
		// a viewer may not save; an engineer saves one revision per corner together
		expect((await viewer.json(`/api/v1/cars/${car}/ride-height`, 'POST', { front: -15, rear: -5, save: true })).status).toBe(403);
		const saved = await engineer.json(`/api/v1/cars/${car}/ride-height`, 'POST', { front: -15, rear: -5, save: true });
		expect(saved.status).toBe(201);
		const { saved: list } = await saved.json();
		expect(list.map((s: { cornerId: string }) => s.cornerId).sort()).toEqual([fl, fr, rl].sort());
		const rev = await (await viewer.fetch(`/api/v1/revisions/${list.find((s: { cornerId: string }) => s.cornerId === rl).id}`)).json();
		expect(rev.label).toBe('ride height front −15, rear −5 mm');
		expect(rev.geometry.points['lower.front'][2]).toBeCloseTo(back.points['lower.front'][2] - 5, 9);
		// both 0, or beyond 100 mm: named
		for (const [payload, field] of [[{ front: 0, rear: 0 }, 'front'], [{ front: -10, rear: -150 }, 'rear']] as const) {
			const bad = await engineer.json(`/api/v1/cars/${car}/ride-height`, 'POST', payload);
			expect(bad.status).toBe(400);
			expect((await bad.json()).error.field).toBe(field);
		}
	});

	test('a change one corner cannot reach saves nothing on any corner', async () => {
		const car = (await (await engineer.json('/api/v1/cars', 'POST', { name: 'Too high car' })).json()).id;
		const fl = (await (await engineer.json(`/api/v1/cars/${car}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
		const fr = (await (await engineer.json(`/api/v1/cars/${car}/corners`, 'POST', { position: 'front_right', kind: 'double_wishbone' })).json()).id;
		// the left upper arm shortened to about 45 mm: it cannot reach 100 mm of rebound
		const short = structuredClone(stock);
		short.points['upper.front'][1] = 590;
		short.points['upper.rear'][1] = 590;
		expect((await engineer.json(`/api/v1/corners/${fl}/revisions`, 'POST', { label: 'short arm', note: '', geometry: short })).status).toBe(201);
		expect((await engineer.json(`/api/v1/corners/${fr}/revisions`, 'POST', { label: 'stock', note: '', geometry: right })).status).toBe(201);
		const bad = await engineer.json(`/api/v1/cars/${car}/ride-height`, 'POST', { front: 100, rear: 0, save: true });
		expect(bad.status).toBe(400);
		const { error } = await bad.json();
		expect(error.field).toBe('front');
		expect(error.message).toMatch(/front left/);
		for (const id of [fl, fr]) {
			const revs = await (await engineer.fetch(`/api/v1/corners/${id}/revisions`)).json();
			expect((revs.revisions ?? revs).length).toBe(1);
		}
	});
});
