// CSV import through API v1: the preview, the save with its kept upload, and bad input that stores nothing.
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { uploads } from '../../src/lib/server/db/schema';
import { Client, closeDb, testDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const scan = readFileSync('fixtures/club-fwd-front-left-scan-inches.csv');
const engineer = new Client();
const viewer = new Client();
let cornerId = '';

/** Posts a file and options to the import endpoint. */
function upload(client: Client, body: Uint8Array | string, options: unknown, extra: Record<string, string> = {}, name = 'points.csv') {
	const form = new FormData();
	form.set('file', new File([typeof body === 'string' ? body : new Uint8Array(body)], name, { type: 'text/csv' }));
	form.set('options', JSON.stringify(options));
	for (const [k, v] of Object.entries(extra)) form.set(k, v);
	return client.fetch(`/api/v1/corners/${cornerId}/import`, { method: 'POST', body: form });
}

/** Number of revisions of the test corner. */
async function revisionCount() {
	return (await (await viewer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json()).revisions.length;
}

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	await viewer.signIn('viewer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Import API car' })).json();
	cornerId = (await (await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
	const first = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock', geometry: stock });
	await engineer.json(`/api/v1/corners/${cornerId}/baseline`, 'PUT', { revisionId: (await first.json()).id });
});
afterAll(closeDb);

const SCAN_OPTIONS = {
	unit: 'in',
	names: { SPRING_TOP: 'spring.chassis', SPRING_BOT: 'spring.body' },
	alignment: { method: 'best_fit' }
};

describe('the scanner file in inches', () => {
	test('a dry run previews the points in vehicle axes and saves nothing', async () => {
		const res = await upload(engineer, scan, { ...SCAN_OPTIONS }, { dryRun: 'true' });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.alignment.method).toBe('best_fit');
		expect(preview.alignment.rms).toBeLessThan(0.01);
		expect(preview.unmatchedNames).toEqual(expect.arrayContaining(['TGT_1', 'TGT_2']));
		expect(await revisionCount()).toBe(1);
	});

	test('saved, it matches the stock revision within 0.1 mm and keeps the original file', async () => {
		const res = await upload(engineer, scan, SCAN_OPTIONS, { label: 'scan' }, 'scan-inches.csv');
		expect(res.status).toBe(201);
		const { id, number } = await res.json();
		expect(number).toBe(2);
		const revision = await (await viewer.fetch(`/api/v1/revisions/${id}`)).json();
		for (const [name, p] of Object.entries(stock.points as Record<string, number[]>)) {
			const q = revision.geometry.points[name];
			expect(Math.hypot(q[0] - p[0], q[1] - p[1], q[2] - p[2]), name).toBeLessThan(0.1);
		}
		const [kept] = await testDb().select().from(uploads).where(eq(uploads.revisionId, id));
		expect(kept.filename).toBe('scan-inches.csv');
		expect(Buffer.compare(kept.bytes, scan)).toBe(0);
	});

	test('the team remembers the aliases: the next import needs no names', async () => {
		const res = await upload(engineer, scan, { unit: 'in', alignment: { method: 'best_fit' } }, { dryRun: 'true' });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.sourceNames['spring.chassis']).toBe('SPRING_TOP');
	});
});

describe('bad input stores nothing and names the problem', () => {
	test.each([
		['an empty file', '', { unit: 'mm' }, 'file_empty', 'the file is empty'],
		['no header and no mapping', '1,2,3,4\n5,6,7,8\n', { unit: 'mm', header: false }, 'no_header_no_mapping', 'the file has no header row and no column mapping was given: map the name, x, y and z columns by index'],
		['a non-numeric value', 'point,x,y,z\nlower.front,180,335,abc\n', { unit: 'mm' }, 'not_a_number', 'row 2, column z: "abc" is not a number'],
		['a bad unit option', 'point,x,y,z\n', { unit: 'furlong' }, 'options_invalid', "unit: must be 'mm', 'cm', 'm' or 'in'"]
	])('%s', async (_what, body, options, code, message) => {
		const before = await revisionCount();
		const res = await upload(engineer, body, options);
		expect(res.status).toBe(400);
		expect((await res.json()).error).toMatchObject({ code, message });
		expect(await revisionCount()).toBe(before);
	});

	test('a 10 MB file is refused with a clear message', async () => {
		const big = 'point,x,y,z\n' + 'lower.front,1,2,3\n'.repeat(600_000);
		const res = await upload(engineer, big, { unit: 'mm' });
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/^the file is 10\.\d MB; the limit is 5 MB$/);
	});

	test('a viewer cannot import, not even a dry run', async () => {
		const res = await upload(viewer, scan, SCAN_OPTIONS, { dryRun: 'true' });
		expect(res.status).toBe(403);
	});
});
