// The app's one CSV writer: formula cells neutralised as OWASP's CSV-injection guidance says
// (https://owasp.org/www-community/attacks/CSV_Injection: cells beginning with = + - @ tab or carriage return
// get a leading single quote and are quoted), numbers left as numbers.
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import { toCsv } from '../../src/lib/csv';
import { buildCsv } from '../../src/lib/components/charts/chart-csv';
import { sheetCsv } from '../../src/lib/server/sharing/sheet-csv';
import { pointsCsv } from '../../src/lib/server/corners/present';

const PAYLOADS = ["=cmd|' /C calc'!A0", '+1+1', '-2+3', '@SUM(A1)', '=HYPERLINK("http://x.example","x")', '\t=1+1', '\r=1+1'];

/** The cells of a CSV text as a spreadsheet would read them (papaparse's reader). */
function cells(text: string): string[][] {
	return Papa.parse<string[]>(text.trimEnd(), { delimiter: ',', newline: '\r\n' }).data;
}

/** True when a cell would start a formula per OWASP's list. */
const formula = (cell: string) => /^[=+\-@\t\r]/.test(cell) && !/^[+-]?\d+(\.\d+)?$/.test(cell);

describe('toCsv (OWASP CSV injection)', () => {
	test('every payload OWASP lists comes out as text starting with a quote mark, its content kept', () => {
		const read = cells(toCsv(PAYLOADS.map((p) => [p, 1])));
		expect(read.map((r) => r[0])).toEqual(PAYLOADS.map((p) => `'${p}`));
		expect(read.flat().filter(formula)).toEqual([]);
	});

	test('numbers, negative ones included, stay numbers; ordinary text is unchanged', () => {
		expect(toCsv([['lower.front', '-145.0', -0.5, '+3', '1e-7', 'a - b']])).toBe('lower.front,-145.0,-0.5,+3,1e-7,a - b\r\n');
		expect(toCsv([['-1+1', '--1', '-1e']])).toBe(`"'-1+1","'--1","'-1e"\r\n`);
	});

	test('each CSV the app writes neutralises a formula name: share sheet, revision export, chart download', () => {
		const name = PAYLOADS[0];
		const sheet = sheetCsv([{ name, label: '@label', xyz: [-1, 2, 3], delta: null, tolerance: null }], false);
		const exported = pointsCsv({ points: { [name]: [-1, 2, 3] } });
		const chart = buildCsv({ xLabel: 'Travel', xUnit: 'mm', yLabel: 'Toe', yUnit: '°', series: [{ id: 'a', label: '=1+1', points: [{ x: -1, y: -0.5 }] }] });
		for (const text of [sheet, exported, chart]) expect(cells(text).flat().filter(formula)).toEqual([]);
		expect(cells(exported)[1]).toEqual([`'${name}`, '-1', '2', '3']);
		expect(cells(chart)[1]).toEqual(['-1', '-0.5']);
	});
});

describe('the revision export CSV in the point table’s order', () => {
	test('a pushrod corner: the kind’s points, the spring’s, then the rocker’s, whatever the file’s key order', async () => {
		const { readFileSync } = await import('node:fs');
		const corner = JSON.parse(readFileSync('fixtures/single-seater-front-left-pushrod.json', 'utf8'));
		// the file's keys reversed: the export must not follow them
		corner.points = Object.fromEntries(Object.entries(corner.points).reverse());
		const names = cells(pointsCsv(corner)).slice(1).map((r) => r[0]);
		const { tablePoints } = await import('../../src/lib/kinds');
		expect(names).toEqual(tablePoints('double_wishbone', true).map((p) => p.name).filter((n) => names.includes(n)));
		expect(names).toContain('rocker.rod_end');
		expect(names[0]).toBe('lower.front');
	});
});

describe('measure words', () => {
	test('a change of half-track is "Half-track change", not "… change change"; toe becomes "Toe change"', async () => {
		const { changeLabel } = await import('../../src/lib/schemas/targets');
		expect(changeLabel('half_track_change')).toBe('Half-track change');
		expect(changeLabel('toe')).toBe('Toe change');
	});
});

describe('the revision export as DXF for CAD', () => {
	test('read back by a well-known DXF package (dxf-parser): every point at its coordinates, on its group’s layer, with its name', async () => {
		const { readFileSync } = await import('node:fs');
		const { default: DxfParser } = await import('dxf-parser');
		const { pointsDxf } = await import('../../src/lib/server/corners/present');
		const corner = JSON.parse(readFileSync('fixtures/single-seater-front-left-pushrod.json', 'utf8'));
		const dxf = new DxfParser().parseSync(pointsDxf(corner))!;
		const points = dxf.entities.filter((e) => e.type === 'POINT') as unknown as { layer: string; position: { x: number; y: number; z: number } }[];
		const texts = dxf.entities.filter((e) => e.type === 'TEXT') as unknown as { text: string; startPoint: { x: number; y: number; z: number } }[];
		const all = { ...corner.points, ...Object.fromEntries(Object.entries(corner.rocker).filter(([k]) => k !== 'rod_on').map(([k, v]) => [`rocker.${k}`, v])) } as Record<string, number[]>;
		expect(points.length).toBe(Object.keys(all).length);
		for (const [i, t] of texts.entries()) {
			const p = all[t.text];
			expect(p, t.text).toBeDefined();
			expect([points[i].position.x, points[i].position.y, points[i].position.z]).toEqual(p);
			expect(points[i].layer).toBe(t.text.split('.')[0].toUpperCase());
		}
		expect(Object.keys(dxf.tables.layer.layers)).toContain('LABELS');
	});
});
