// Frame: ISO 8855 vehicle axes, x forward, y left, z up; y = 0 the centreline; lengths in mm.
// Mirror to the other side and the symmetry report when both sides were measured.

import { describe, expect, it } from 'vitest';
import { importCorner, type ImportPreview, type ImportResult } from '../../../src/lib/server/import/index';
import { bytes, csvOf, fixtureBytes, fixturePoints, STOCK, type P } from './helpers';

const ctx = { kind: 'double_wishbone' as const };

/** The preview of a result (fails the test when the import failed). */
function preview(r: ImportResult): ImportPreview {
	if (!r.ok) throw new Error(`expected success, got ${r.error.message}`);
	return r.preview;
}

/** A two-sided CSV: left rows as given, right rows the mirror image plus per-name offsets (mm). */
function bothSides(offsets: Record<string, P>): string {
	const lines = ['name,side,x,y,z'];
	for (const [n, p] of Object.entries(STOCK)) lines.push([n, 'left', ...p].join(','));
	for (const [n, p] of Object.entries(STOCK)) {
		const o = offsets[n] ?? [0, 0, 0];
		lines.push([n, 'right', p[0] + o[0], -p[1] + o[1], p[2] + o[2]].join(','));
	}
	return lines.join('\n');
}

describe('mirror', () => {
	it('mirror gives the left points with y negated, mirrored by hand here (and so the stock right fixture)', () => {
		const p = preview(importCorner(bytes(csvOf(STOCK)), { unit: 'mm', mirror: true }, { ...ctx, cornerSide: 'right' }));
		const byHand = Object.fromEntries(Object.entries(STOCK).map(([n, [x, y, z]]) => [n, [x, y === 0 ? 0 : -y, z]]));
		expect(p.points).toEqual(byHand);
		expect(p.points).toEqual(fixturePoints('club-fwd-front-right'));
		expect(p.warnings).toEqual([]);
	});

	it('mirror after a datum alignment: the datum frame is the vehicle frame', () => {
		const a = { method: 'datum', points: ['lower.front', 'lower.rear', 'upper.front'], targets: [STOCK['lower.front'], STOCK['lower.rear'], STOCK['upper.front']] };
		const p = preview(importCorner(bytes(csvOf(STOCK)), { unit: 'mm', mirror: true, alignment: a }, ctx));
		expect(p.points['wheel.centre'][1]).toBeCloseTo(-720, 9);
		expect(p.points['lower.rear'][0]).toBeCloseTo(-220, 9);
	});
});

describe('symmetry report', () => {
	it('the European fixture: the right upper front pivot 4 mm rearward is reported', () => {
		const p = preview(importCorner(fixtureBytes('club-fwd-front-both-sides-eu.csv'), { unit: 'mm', side: 'left' }, ctx));
		expect(p.symmetry?.compared).toBe(12);
		expect(p.symmetry?.beyond.map((b) => b.name)).toEqual(['upper.front']);
		expect(p.symmetry?.beyond[0].differenceMm).toBeCloseTo(4, 9);
		expect(p.symmetry?.maxMm).toBeCloseTo(4, 9);
	});

	it('largest first, the threshold applies, a symmetric pair is not listed', () => {
		const text = bothSides({ 'lower.outer': [0, 3, 4], 'steer.inner': [0, 0, 2.5], 'upper.rear': [0.5, 0, 0] });
		const p = preview(importCorner(bytes(text), { unit: 'mm', side: 'left', symmetryThresholdMm: 1 }, ctx));
		// By hand: |(0, 3, 4)| = 5, |(0, 0, 2.5)| = 2.5; 0.5 is under the 1 mm threshold.
		expect(p.symmetry?.beyond.map((b) => [b.name, Number(b.differenceMm.toFixed(9))])).toEqual([
			['lower.outer', 5],
			['steer.inner', 2.5]
		]);
		const loose = preview(importCorner(bytes(text), { unit: 'mm', side: 'left', symmetryThresholdMm: 6 }, ctx));
		expect(loose.symmetry?.beyond).toEqual([]);
	});

	it('both sides through the best fit of the kept side: the bent point is still found', () => {
		const text = bothSides({ 'upper.outer': [2, 0, 0] });
		const p = preview(importCorner(bytes(text), { unit: 'mm', side: 'right', symmetryThresholdMm: 1, alignment: { method: 'best_fit' } }, { ...ctx, currentPoints: fixturePoints('club-fwd-front-right') }));
		expect(p.symmetry?.beyond.map((b) => b.name)).toEqual(['upper.outer']);
		// The fit of the right side onto the (straight) stock right corner absorbs part of the 2 mm.
		expect(p.symmetry?.beyond[0].differenceMm).toBeGreaterThan(1);
		expect(p.symmetry?.beyond[0].differenceMm).toBeLessThan(2);
	});

	it('one side only: no report', () => {
		expect(preview(importCorner(bytes(csvOf(STOCK)), { unit: 'mm' }, ctx)).symmetry).toBeUndefined();
	});
});
