import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashToken, newToken } from '../../src/lib/server/auth/tokens';
import { createApiToken } from '../../src/lib/server/db/queries/users';
import { Client, DEMO_CAR_ID, DEMO_TEAM_ID, baseUrl, closeDb, freshAccount, testDb } from './helpers';

const viewer = new Client();
const engineer = new Client();

beforeAll(async () => {
	await viewer.signIn('viewer@linkwright.test');
	await engineer.signIn('engineer@linkwright.test');
});
afterAll(closeDb);

describe('anonymous calls', () => {
	test.each([
		['GET', '/api/v1/cars'],
		['POST', '/api/v1/cars'],
		['GET', `/api/v1/cars/${DEMO_CAR_ID}`],
		['PATCH', `/api/v1/cars/${DEMO_CAR_ID}`]
	])('%s %s answers 401 with a JSON error', async (method, path) => {
		const res = await new Client().json(path, method, method === 'GET' ? undefined : { name: 'x' });
		expect(res.status).toBe(401);
		expect(await res.json()).toMatchObject({ error: { code: 'unauthenticated' } });
	});
});

describe('roles', () => {
	test('a viewer gets 403 creating a car', async () => {
		const res = await viewer.json('/api/v1/cars', 'POST', { name: 'Viewer car' });
		expect(res.status).toBe(403);
		expect(await res.json()).toMatchObject({ error: { code: 'forbidden' } });
	});

	test('a viewer gets 403 changing a car', async () => {
		const res = await viewer.json(`/api/v1/cars/${DEMO_CAR_ID}`, 'PATCH', { notes: 'changed' });
		expect(res.status).toBe(403);
	});

	test('an engineer creates a car (201), reads it back and changes one field', async () => {
		const res = await engineer.json('/api/v1/cars', 'POST', { name: 'Test hillclimb car', wheelbaseMm: 2310, driveLayout: 'rwd' });
		expect(res.status).toBe(201);
		const car = await res.json();
		expect(car).toMatchObject({ name: 'Test hillclimb car', wheelbaseMm: 2310, teamId: DEMO_TEAM_ID });
		const patched = await engineer.json(`/api/v1/cars/${car.id}`, 'PATCH', { cgHeightMm: 380 });
		expect(patched.status).toBe(200);
		expect(await patched.json()).toMatchObject({ name: 'Test hillclimb car', wheelbaseMm: 2310, cgHeightMm: 380 });
		const list = await (await viewer.fetch('/api/v1/cars')).json();
		expect(list.cars.map((c: { id: string }) => c.id)).toContain(car.id);
	});
});

describe('bad input', () => {
	test('a missing name is refused with 400 naming the field', async () => {
		const res = await engineer.json('/api/v1/cars', 'POST', { series: 'no name' });
		expect(res.status).toBe(400);
		expect(await res.json()).toMatchObject({ error: { code: 'invalid', field: 'name', message: 'name: Name is required' } });
	});

	test('a brake fraction above 1 is refused naming the field, and nothing is saved', async () => {
		const before = (await (await engineer.fetch('/api/v1/cars')).json()).cars.length;
		const res = await engineer.json('/api/v1/cars', 'POST', { name: 'Bad', frontBrakeFraction: 1.4 });
		expect(res.status).toBe(400);
		expect((await res.json()).error.field).toBe('frontBrakeFraction');
		const after = (await (await engineer.fetch('/api/v1/cars')).json()).cars.length;
		expect(after).toBe(before);
	});

	test('a body that is not JSON is refused with 400', async () => {
		const res = await engineer.fetch('/api/v1/cars', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{' });
		expect(res.status).toBe(400);
	});
});

describe('another team', () => {
	test("gets 404 for the demo team's car, the same as for a car that does not exist", async () => {
		const { client } = await freshAccount('api-outsider');
		const other = await client.fetch(`/api/v1/cars/${DEMO_CAR_ID}`);
		const missing = await client.fetch('/api/v1/cars/00000000-0000-4000-8000-000000000bad');
		expect(other.status).toBe(404);
		expect(missing.status).toBe(404);
		expect(await other.json()).toEqual(await missing.json());
	});

	test("gets 404 asking for the demo team's car list by team id", async () => {
		const { client } = await freshAccount('api-outsider2');
		const res = await client.fetch(`/api/v1/cars?team=${DEMO_TEAM_ID}`);
		expect(res.status).toBe(404);
	});

	test('cannot patch the demo car', async () => {
		const { client } = await freshAccount('api-outsider3');
		const res = await client.json(`/api/v1/cars/${DEMO_CAR_ID}`, 'PATCH', { notes: 'mine now' });
		expect(res.status).toBe(404);
	});
});

describe('API tokens', () => {
	test('a bearer token acts as its account; a wrong one is anonymous', async () => {
		const { user } = await freshAccount('token');
		const token = newToken('lw_');
		await createApiToken(testDb(), user.id, 'test', hashToken(token));
		const ok = await fetch(`${baseUrl()}/api/v1/cars`, { headers: { authorization: `Bearer ${token}` } });
		expect(ok.status).toBe(200);
		const bad = await fetch(`${baseUrl()}/api/v1/cars`, { headers: { authorization: `Bearer ${token}x` } });
		expect(bad.status).toBe(401);
	});
});
