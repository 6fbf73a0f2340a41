import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, closeDb } from './helpers';

const CORNER = '00000000-0000-4000-8000-0000000000f2';
const engineer = new Client();
const viewer = new Client();

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
});
afterAll(closeDb);

describe('studies', () => {
	test('an engineer saves a study, the same name replaces it, a viewer lists it', async () => {
		const settings = { sweep: 'steer', from: -30, to: 30, step: 2 };
		expect((await engineer.json(`/api/v1/corners/${CORNER}/studies`, 'POST', { name: 'steer ±30', settings })).status).toBe(201);
		expect((await engineer.json(`/api/v1/corners/${CORNER}/studies`, 'POST', { name: 'steer ±30', settings: { ...settings, step: 1 } })).status).toBe(201);
		const list = (await (await viewer.fetch(`/api/v1/corners/${CORNER}/studies`)).json()).studies;
		const mine = list.filter((s: { name: string }) => s.name === 'steer ±30');
		expect(mine).toHaveLength(1);
		expect(mine[0].settings).toMatchObject({ sweep: 'steer', step: 1, rack: 0, overlays: [] });
	});

	test('a step of 0 is refused naming the field; a viewer cannot save', async () => {
		const bad = await engineer.json(`/api/v1/corners/${CORNER}/studies`, 'POST', { name: 'x', settings: { sweep: 'heave', from: 0, to: 1, step: 0 } });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('settings.step');
		const denied = await viewer.json(`/api/v1/corners/${CORNER}/studies`, 'POST', { name: 'x', settings: { sweep: 'heave', from: 0, to: 1, step: 1 } });
		expect(denied.status).toBe(403);
	});
});
