// Issue 21, hostile input: a 130,000-row import, point names that are spreadsheet formulas or too many, and what a
// share link reveals. Formula cells are checked against OWASP's CSV-injection guidance
// (https://owasp.org/www-community/attacks/CSV_Injection: no cell may begin with = + - @ tab or carriage return).
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { appendRevision } from '../../src/lib/server/db/queries/corners';
import { Client, closeDb, testDb } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const FORMULAS = ["=cmd|' /C calc'!A0", '+1+1', '@SUM(A1)', '=HYPERLINK("http://evil.example","open")', '-2+3+cmd|\' /C calc\'!A0'];
const engineer = new Client();
let cornerId = '';
let stockId = '';

/** Revisions of the test corner. */
async function revisionCount() {
	return (await (await engineer.fetch(`/api/v1/corners/${cornerId}/revisions`)).json()).revisions.length;
}

/** Cells of a CSV answer as a spreadsheet reads them. */
async function cellsOf(res: Response) {
	expect(res.status).toBe(200);
	return Papa.parse<string[]>((await res.text()).trimEnd(), { delimiter: ',', newline: '\r\n' }).data.flat();
}

/** A cell a spreadsheet would run as a formula (OWASP's list); a plain number is a value. */
const isFormula = (cell: string) => /^[=+\-@\t\r]/.test(cell) && !/^[+-]?\d+(\.\d+)?$/.test(cell);

beforeAll(async () => {
	await engineer.signIn('engineer@linkwright.test');
	const car = await (await engineer.json('/api/v1/cars', 'POST', { name: 'Hostile input car' })).json();
	cornerId = (await (await engineer.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json()).id;
	const first = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'stock', note: 'internal: supplier price 412 EUR', geometry: stock });
	stockId = (await first.json()).id;
});
afterAll(closeDb);

describe('a large CSV import', () => {
	test('130,000 rows (under the 5 MB limit) get a 400 naming the file field, and nothing is saved', async () => {
		const rows = Array.from({ length: 130_000 }, (_, i) => `p${i},${i % 997}.5,${i % 991}.25,${i % 983}.75`).join('\n');
		expect(rows.length).toBeLessThan(5 * 1024 * 1024);
		const before = await revisionCount();
		const body = new FormData();
		body.set('file', new File([rows], 'huge.csv', { type: 'text/csv' }));
		body.set('options', JSON.stringify({ unit: 'mm' }));
		const res = await engineer.fetch(`/api/v1/corners/${cornerId}/import`, { method: 'POST', body });
		expect(res.status).toBe(400);
		const answer = (await res.json()).error;
		expect(answer).toMatchObject({ code: 'too_many_rows', field: 'file' });
		expect(answer.message).toContain('130000 rows');
		expect(await revisionCount()).toBe(before);
	});
});

describe('point names', () => {
	test('a formula as a point name is refused with 400 naming the point, and nothing is saved', async () => {
		const before = await revisionCount();
		for (const name of FORMULAS) {
			const geometry = { ...stock, points: { ...stock.points, [name]: [1, 2, 3] } };
			const res = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'formula', geometry });
			expect(res.status).toBe(400);
			const answer = (await res.json()).error;
			expect(answer.message).toContain('point name');
			expect(answer.field).toContain(name);
		}
		expect(await revisionCount()).toBe(before);
	});

	test('5,000 extra points are refused with 400 naming points', async () => {
		const points = { ...stock.points };
		for (let i = 0; i < 5000; i++) points[`extra.p${i}`] = [i, 1, 1];
		const res = await engineer.json(`/api/v1/corners/${cornerId}/revisions`, 'POST', { label: 'many', geometry: { ...stock, points } });
		expect(res.status).toBe(400);
		const answer = (await res.json()).error;
		expect(answer.message).toContain('at most 64 points');
		expect(answer.field).toBe('geometry.points');
	});

	test('formula names already stored (saved before the limit) come out neutralised in both CSV downloads', async () => {
		const points = { ...stock.points };
		FORMULAS.forEach((name, i) => (points[name] = [-10 - i, 20, 30]));
		const legacy = await appendRevision(testDb(), { cornerId, kind: 'double_wishbone', geometry: { ...stock, points }, label: '=1+1', note: '', parentId: null, authorId: null });
		const share = await (await engineer.json(`/api/v1/revisions/${legacy.id}/shares`, 'POST', {})).json();
		const sheet = await cellsOf(await new Client().fetch(`${new URL(share.url).pathname}/csv`));
		const exported = await cellsOf(await engineer.fetch(`/api/v1/revisions/${legacy.id}/export?format=csv`));
		for (const cells of [sheet, exported]) {
			expect(cells.filter(isFormula)).toEqual([]);
			for (const name of FORMULAS) expect(cells).toContain(`'${name}`);
		}
		// negative coordinates stay numbers
		expect(sheet).toContain('-10.0');
		expect(exported).toContain('-10');
	});
});

describe('what a share link reveals', () => {
	test("the revision's internal note is absent from a default sheet, and present when the engineer ticked it", async () => {
		const plain = await (await engineer.json(`/api/v1/revisions/${stockId}/shares`, 'POST', { note: 'for the welder' })).json();
		const page = await (await new Client().fetch(new URL(plain.url).pathname)).text();
		expect(page).toContain('for the welder');
		expect(page).not.toContain('supplier price 412');
		const open = await (await engineer.json(`/api/v1/revisions/${stockId}/shares`, 'POST', { showRevisionNote: true })).json();
		expect(await (await new Client().fetch(new URL(open.url).pathname)).text()).toContain('supplier price 412');
	});

	test('showRevisionNote that is not a boolean is a 400 naming the field', async () => {
		const res = await engineer.json(`/api/v1/revisions/${stockId}/shares`, 'POST', { showRevisionNote: 'yes please' });
		expect(res.status).toBe(400);
		expect((await res.json()).error.field).toBe('showRevisionNote');
	});
});
