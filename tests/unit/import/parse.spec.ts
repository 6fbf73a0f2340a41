// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Reading files: byte-order mark and Windows line endings, delimiters, decimal comma, header or
// not, column and name mapping, the side column, the European fixture.

import { describe, expect, it } from 'vitest';
import { importCorner, type ImportPreview, type ImportResult } from '../../../src/lib/server/import/index';
import { guessPointName } from '../../../src/lib/server/import/mapping';
import { bytes, csvOf, fixtureBytes, maxError, STOCK } from './helpers';

const ctx = { kind: 'double_wishbone' as const };

/** The preview of a result (fails the test when the import failed). */
function preview(r: ImportResult): ImportPreview {
	if (!r.ok) throw new Error(`expected success, got ${r.error.message}`);
	return r.preview;
}

describe('reading the file', () => {
	it('a byte-order mark and Windows line endings work (issue 4)', () => {
		const text = '\uFEFF' + csvOf(STOCK).replace(/\n/g, '\r\n');
		const p = preview(importCorner(bytes(text), { unit: 'mm' }, ctx));
		expect(p.columns.headers).toEqual(['name', 'x', 'y', 'z']);
		expect(p.points).toEqual(STOCK);
	});

	it('semicolons, tabs and commas are detected', () => {
		for (const d of [';', '\t', ','] as const) {
			const text = csvOf(STOCK).replace(/,/g, d);
			const p = preview(importCorner(bytes(text), { unit: 'mm' }, ctx));
			expect(p.detected.delimiter).toBe(d);
			expect(p.points).toEqual(STOCK);
		}
	});

	it('a European export: ";" and decimal comma, byte-order mark, CRLF, both sides (fixture)', () => {
		const p = preview(importCorner(fixtureBytes('club-fwd-front-both-sides-eu.csv'), { unit: 'mm', side: 'left' }, ctx));
		expect(p.detected).toEqual({ delimiter: ';', decimalComma: true, header: true });
		expect(p.columns).toMatchObject({ name: 0, side: 1, x: 2, y: 3, z: 4 });
		expect(maxError(p.points, STOCK)).toBeLessThan(1e-9);
	});

	it('a decimal comma given explicitly with tabs', () => {
		const text = 'name\tx\ty\tz\n' + Object.entries(STOCK).map(([n, p]) => [n, ...p.map((v) => String(v).replace('.', ','))].join('\t')).join('\n');
		const p = preview(importCorner(bytes(text), { unit: 'mm', decimal: ',', delimiter: '\t' }, ctx));
		expect(p.points['upper.outer']).toEqual([-30.6, 633.3, 470]);
	});

	it('no header row with columns given by index, comment lines skipped', () => {
		const rows = Object.entries(STOCK).map(([n, p]) => [p[2], p[0], n, p[1]].join(','));
		const text = '# exported points\n' + rows.join('\n');
		const p = preview(importCorner(bytes(text), { unit: 'mm', columns: { name: 2, x: 1, y: 3, z: 0 } }, ctx));
		expect(p.detected.header).toBe(false);
		expect(p.rows).toBe(12);
		expect(p.points).toEqual(STOCK);
	});

	it('header: false reads the first line as a point', () => {
		const text = csvOf(STOCK).split('\n').slice(1).join('\n');
		const p = preview(importCorner(bytes(text), { unit: 'mm', header: false, columns: { name: 0, x: 1, y: 2, z: 3 } }, ctx));
		expect(Object.keys(p.points)).toHaveLength(12);
	});

	it('headers with units and other spellings are guessed', () => {
		const text = csvOf(STOCK, 'Point Name;X (mm);Y (mm);Z (mm)').replace(/,/g, ';');
		const p = preview(importCorner(bytes(text), { unit: 'mm' }, ctx));
		expect(p.columns).toMatchObject({ name: 0, x: 1, y: 2, z: 3 });
	});

	it('a Windows-1252 file (not UTF-8) is read', () => {
		const text = csvOf(STOCK, 'name,x,y,z');
		const withDegree = text + 'note\xb0,1,2,3\n';
		const latin1 = new Uint8Array([...withDegree].map((c) => c.charCodeAt(0)));
		const p = preview(importCorner(latin1, { unit: 'mm' }, ctx));
		expect(p.unmatchedNames).toEqual(['note°']);
	});
});

describe('names and sides', () => {
	it('team aliases, then this import\'s names, map file names; unknown names are listed', () => {
		const renamed: Record<string, [number, number, number]> = {};
		for (const [n, p] of Object.entries(STOCK)) renamed[n === 'lower.front' ? 'P1' : n === 'lower.rear' ? 'P2' : n] = p;
		renamed['EXTRA'] = [1, 2, 3];
		const p = preview(
			importCorner(bytes(csvOf(renamed)), { unit: 'mm', names: { P2: 'lower.rear' } }, { ...ctx, aliases: { p1: 'lower.front', P2: 'upper.front' } })
		);
		expect(p.sourceNames['lower.front']).toBe('P1');
		expect(p.sourceNames['lower.rear']).toBe('P2');
		expect(p.points).toEqual(STOCK);
		expect(p.unmatchedNames).toEqual(['EXTRA']);
	});

	it('common spellings are guessed', () => {
		expect(guessPointName('LOWER_FRONT')).toBe('lower.front');
		expect(guessPointName('Front lower')).toBe('lower.front');
		expect(guessPointName('UCA BJ')).toBe('upper.outer');
		expect(guessPointName('tie rod inner')).toBe('steer.inner');
		expect(guessPointName('Wheel Center')).toBe('wheel.centre');
		expect(guessPointName('wheel axis inner')).toBe('wheel.axis_inner');
		expect(guessPointName('strut top mount')).toBe('strut.top');
		expect(guessPointName('damper chassis')).toBe('spring.chassis');
		expect(guessPointName('TGT_1')).toBeNull();
	});

	it('the side column keeps the chosen side', () => {
		const p = preview(importCorner(fixtureBytes('club-fwd-front-both-sides-eu.csv'), { unit: 'mm', side: 'right' }, ctx));
		expect(p.points['wheel.centre']).toEqual([0, -720, 289.901]);
		expect(p.points['upper.front']).toEqual([86, -425, 450]);
	});

	it('a right corner whose wheel lands on the left gets a warning', () => {
		const p = preview(importCorner(bytes(csvOf(STOCK)), { unit: 'mm' }, { ...ctx, cornerSide: 'right' }));
		expect(p.warnings).toEqual(['wheel.centre lands on the left side (y = 720.0 mm) but the corner is a right corner: mirror it?']);
	});
});

describe("the trade's names of the general model's kinds (the kinds' aliases)", () => {
	it('five-link links, toe link, trailing arm pivots, pushrod, pullrod, rocker and bell crank', () => {
		expect(guessPointName('Lower front link inner')).toBe('lower_front.inner');
		expect(guessPointName('UPPER_REAR_LINK_OUTER')).toBe('upper_rear.outer');
		expect(guessPointName('toe link outer')).toBe('steer.outer');
		expect(guessPointName('Trailing arm pivot front')).toBe('arm.front');
		expect(guessPointName('trailing-arm-pivot-inner')).toBe('arm.rear');
		expect(guessPointName('Pushrod outer')).toBe('rocker.rod_outer');
		expect(guessPointName('pullrod rocker')).toBe('rocker.rod_end');
		expect(guessPointName('Bell crank pivot front')).toBe('rocker.pivot_a');
		expect(guessPointName('rocker damper')).toBe('rocker.spring_end');
		expect(guessPointName('lower_front.inner')).toBe('lower_front.inner');
		expect(guessPointName('FRONT')).toBeNull();
		// both spring ends or neither: a scanner's SPRING_TOP / SPRING_BOT pair maps as a pair
		expect(guessPointName('SPRING_TOP')).toBe('spring.chassis');
		expect(guessPointName('SPRING_BOT')).toBe('spring.body');
	});
});
