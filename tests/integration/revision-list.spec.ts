// The revision list at scale (issue 19): GET /api/v1/corners/{id}/revisions pages with limit/offset and searches
// with q (label, note, author, r-number, date), the query run in PostgreSQL; without limit it answers the whole
// list as before paging (backward compatible). 30 revisions are made here through the API, with labels and notes
// chosen so each search has a known answer counted in this test.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, closeDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const engineer = new Client();
const owner = new Client();
const viewer = new Client();
let cornerId = '';
const N = 30;

type Listed = { number: number; label: string; note: string; authorName: string | null; createdAt: string };
const list = async (query = '') => {
	const res = await viewer.fetch(`/api/v1/corners/${cornerId}/revisions${query}`);
	return { status: res.status, body: await res.json() };
};

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await owner.signIn('owner@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: `Revision list car ${Date.now()}` })).json();
	cornerId = (await (await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
	for (let i = 1; i <= N; i++) {
		// every fifth by the owner; labels "spacer 3 mm" on multiples of 3; a note with 100% (LIKE's wildcard) on r7
		const who = i % 5 === 0 ? owner : engineer;
		const label = i % 3 === 0 ? `spacer ${i} mm` : `run ${i}`;
		const note = i === 7 ? 'Toe 100% out of band_' : i === 11 ? 'Bump steer at lock' : '';
		const res = await who.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label, note, geometry: stock });
		expect(res.status).toBe(201);
	}
});
afterAll(closeDb);

describe('the revision list pages and searches', () => {
	test('without limit: the whole list, newest first, as before paging', async () => {
		const { status, body } = await list();
		expect(status).toBe(200);
		expect(body.revisions).toHaveLength(N);
		expect(body.revisions.map((r: Listed) => r.number)).toEqual(Array.from({ length: N }, (_, i) => N - i));
		expect(body.total).toBe(N);
		expect(body.next).toBeNull();
	});

	test('limit and offset walk the list in pages with no gap and no repeat', async () => {
		const seen: number[] = [];
		let offset: number | null = 0;
		while (offset !== null) {
			const { body } = await list(`?limit=7&offset=${offset}`);
			expect(body.total).toBe(N);
			expect(body.revisions.length).toBeLessThanOrEqual(7);
			seen.push(...body.revisions.map((r: Listed) => r.number));
			offset = body.next;
		}
		expect(seen).toEqual(Array.from({ length: N }, (_, i) => N - i));
	});

	test('q matches the label, the note, the author and the r-number; every word must match', async () => {
		// labels "spacer …" on 3, 6, …, 30: ten revisions
		expect((await list('?q=spacer&limit=50')).body.total).toBe(10);
		// a note (case does not matter)
		const bump = (await list('?q=BUMP%20STEER')).body;
		expect(bump.revisions.map((r: Listed) => r.number)).toEqual([11]);
		// the author: the owner saved 5, 10, …, 30
		const ownerName = (await list('?q=spacer')).body.revisions.find((r: Listed) => r.number === 15).authorName as string;
		const byOwner = (await list(`?q=${encodeURIComponent(ownerName)}`)).body;
		expect(byOwner.revisions.map((r: Listed) => r.number)).toEqual([30, 25, 20, 15, 10, 5]);
		// two words: the owner's spacers only (15 and 30)
		const both = (await list(`?q=${encodeURIComponent(`${ownerName} spacer`)}`)).body;
		expect(both.revisions.map((r: Listed) => r.number)).toEqual([30, 15]);
		// the revision number as the page writes it
		expect((await list('?q=r29')).body.revisions.map((r: Listed) => r.number)).toEqual([29]);
	});

	test('q matches the date as 2026-12-03 and as 3 Dec 2026 (UTC)', async () => {
		const created = new Date((await list('?limit=1')).body.revisions[0].createdAt);
		const iso = created.toISOString().slice(0, 10);
		const words = `${created.getUTCDate()} ${created.toLocaleString('en-GB', { month: 'short', timeZone: 'UTC' })} ${created.getUTCFullYear()}`;
		expect((await list(`?q=${iso}`)).body.total).toBe(N);
		expect((await list(`?q=${encodeURIComponent(words)}`)).body.total).toBe(N);
		expect((await list('?q=1999-01-01')).body.total).toBe(0);
	});

	test("LIKE's wildcards in q are taken literally (OWASP: treat input as data)", async () => {
		expect((await list('?q=100%25')).body.revisions.map((r: Listed) => r.number)).toEqual([7]);
		expect((await list('?q=band_')).body.revisions.map((r: Listed) => r.number)).toEqual([7]);
		// "_" alone would match every one-character run if it were a wildcard
		expect((await list('?q=_')).body.revisions.map((r: Listed) => r.number)).toEqual([7]);
		expect((await list('?q=%25')).body.revisions.map((r: Listed) => r.number)).toEqual([7]);
	});

	test('bad paging is refused naming the parameter', async () => {
		for (const [query, field] of [['?limit=0', 'limit'], ['?limit=201', 'limit'], ['?limit=abc', 'limit'], ['?offset=-1', 'offset'], ['?limit=5&offset=2.5', 'offset'], [`?q=${'x'.repeat(201)}`, 'q']]) {
			const { status, body } = await list(query);
			expect(status, query).toBe(400);
			expect(body.error.field, query).toBe(field);
		}
	});
});
