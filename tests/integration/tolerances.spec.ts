// The lookup of adopted tolerances (the contract with the tolerance study: studies.results.tolerances).
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { tolerancesForRevision } from '../../src/lib/server/db/queries/tolerances';
import { studies } from '../../src/lib/server/db/schema';
import { Client, closeDb, testDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const engineer = new Client();
let cornerId = '';
let revisionId = '';
let otherCornerId = '';

/** Inserts a study row with the given results. */
async function study(corner: string, name: string, results: Record<string, unknown> | null) {
	await testDb().insert(studies).values({ cornerId: corner, name, settings: {}, results });
}

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Tolerance lookup car' })).json();
	cornerId = (await (await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
	otherCornerId = (await (await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'rear_left', kind: 'double_wishbone' })).json()).id;
	revisionId = (await (await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock', note: '', geometry: stock })).json()).id;
});
afterAll(closeDb);

describe('tolerancesForRevision', () => {
	test('is null with no study, or only studies without tolerances for this revision', async () => {
		expect(await tolerancesForRevision(testDb(), cornerId, revisionId)).toBeNull();
		await study(cornerId, 'no results', null);
		await study(cornerId, 'sweep only', { curves: [] });
		await study(cornerId, 'another revision', { tolerances: { revisionId: '00000000-0000-4000-8000-000000000000', points: {}, updatedAt: '2026-05-01T00:00:00Z' } });
		expect(await tolerancesForRevision(testDb(), cornerId, revisionId)).toBeNull();
	});

	test('takes the most recent updatedAt as an instant (not as text), skips rows off the contract and other corners', async () => {
		const p = (mm: number) => ({ 'steer.outer': { mm, mode: 'sphere' } });
		// 09:00+02:00 is 07:00Z: earlier than 08:00Z although it sorts later as text.
		await study(cornerId, 'earlier', { tolerances: { revisionId, points: p(1), updatedAt: '2026-04-01T08:00:00Z' } });
		await study(cornerId, 'offset', { tolerances: { revisionId, points: p(2), updatedAt: '2026-04-01T09:00:00+02:00' } });
		await study(cornerId, 'broken', { tolerances: { revisionId, points: { 'steer.outer': { mm: -1, mode: 'cube' } }, updatedAt: '2026-09-01T00:00:00Z' } });
		await study(otherCornerId, 'other corner', { tolerances: { revisionId, points: p(3), updatedAt: '2026-12-01T00:00:00Z' } });
		const found = await tolerancesForRevision(testDb(), cornerId, revisionId);
		expect(found?.points['steer.outer']).toEqual({ mm: 1, mode: 'sphere' });
	});
});
