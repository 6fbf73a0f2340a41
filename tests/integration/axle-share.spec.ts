// A read-only link to one axle of a car revision (issue 16, item 8): made by an engineer, opened without an account,
// refused once revoked, refused to a viewer; the sheet carries both sides, the right one the left mirrored.
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { shareLinks } from '../../src/lib/server/db/schema';
import { Client, closeDb, testDb } from './helpers';

const CAR_REVISION = '00000000-0000-4000-8000-0000000c0201'; // the demo single-seater's first car revision
const engineer = new Client();
const viewer = new Client();
const reader = new Client();

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
});
afterAll(closeDb);

const count = async () => (await testDb().select({ n: sql<number>`count(*)::int` }).from(shareLinks))[0].n;

describe('axle share links', () => {
	let url = '';
	let id = '';
	test('an engineer makes a link to the front axle: 201 with the link', async () => {
		const res = await engineer.json(`/api/v1/car-revisions/${CAR_REVISION}/shares`, 'POST', { axle: 'front', note: 'Front axle for the jig', expiresInDays: 7 });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.url).toMatch(/\/s\/axle\/[A-Za-z0-9_-]+$/);
		url = new URL(body.url).pathname;
		id = body.id;
		const list = await (await engineer.fetch(`/api/v1/car-revisions/${CAR_REVISION}/shares`)).json();
		expect(list.shares.map((s: { id: string }) => s.id)).toContain(id);
	});

	test('opened without an account: both sides, the right side the left one mirrored (y → −y), no-referrer', async () => {
		const res = await reader.fetch(url);
		expect(res.status).toBe(200);
		expect(res.headers.get('referrer-policy')).toBe('no-referrer');
		const html = await res.text();
		expect(html).toContain('Front axle for the jig');
		expect(html).toContain('data-testid="axle-side-left"');
		expect(html).toContain('data-testid="axle-side-right"');
		const csv = await (await reader.fetch(`${url}/csv`)).text();
		const rows = csv.trim().split(/\r?\n/).map((l) => l.split(','));
		expect(rows[0]).toEqual(['side', 'point', 'description', 'x_mm', 'y_mm', 'z_mm']);
		const at = (side: string, point: string) => rows.find((r) => r[0] === side && r[1] === point)!;
		const left = at('left', 'lower.outer');
		const right = at('right', 'lower.outer');
		expect(right[3]).toBe(left[3]);
		expect(Number(right[4])).toBeCloseTo(-Number(left[4]), 6);
		expect(right[5]).toBe(left[5]);
	});

	test('a bad axle is refused naming it, nothing written; a viewer may not make one', async () => {
		const before = await count();
		const bad = await engineer.json(`/api/v1/car-revisions/${CAR_REVISION}/shares`, 'POST', { axle: 'middle' });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('axle');
		const refused = await viewer.json(`/api/v1/car-revisions/${CAR_REVISION}/shares`, 'POST', { axle: 'front' });
		expect(refused.status).toBe(403);
		expect(await count()).toBe(before);
	});

	test('revoked: the sheet and its CSV answer 404 at once', async () => {
		const res = await engineer.fetch(`/api/v1/shares/${id}`, { method: 'DELETE' });
		expect(res.status).toBe(204);
		expect((await reader.fetch(url)).status).toBe(404);
		expect((await reader.fetch(`${url}/csv`)).status).toBe(404);
		const [row] = await testDb().select().from(shareLinks).where(eq(shareLinks.id, id));
		expect(row.revokedAt).not.toBeNull();
	});
});
