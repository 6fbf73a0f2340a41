// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Units and source axes against their definitions outside this code.

import { describe, expect, it } from 'vitest';
import { importCorner, type ImportPreview, type ImportResult } from '../../../src/lib/server/import/index';
import { MM_PER_UNIT, spanWarning } from '../../../src/lib/server/import/units';
import { bytes, csvOf, STOCK, type P } from './helpers';

const ctx = { kind: 'double_wishbone' as const };

/** The preview of a result (fails the test when the import failed). */
function preview(r: ImportResult): ImportPreview {
	if (!r.ok) throw new Error(`expected success, got ${r.error.message}`);
	return r.preview;
}

/** STOCK with each point passed through f. */
const mapPoints = (f: (p: P) => number[]) => Object.fromEntries(Object.entries(STOCK).map(([n, p]) => [n, f(p)])) as Record<string, P>;

describe('units', () => {
	// International yard and pound agreement (1959): 1 yd = 0.9144 m exactly, so 1 in = 25.4 mm exactly.
	it('1 in = 25.4 mm exactly (international inch, 1959 agreement)', () => {
		expect(MM_PER_UNIT.in).toBe(25.4);
		const inches = mapPoints((p) => p.map((v) => v / 25.4));
		inches['lower.front'] = [0.5, 10, 100];
		const p = preview(importCorner(bytes(csvOf(inches)), { unit: 'in' }, ctx));
		// By hand: 0.5 × 25.4 = 12.7, 10 × 25.4 = 254, 100 × 25.4 = 2540.
		expect(p.points['lower.front'][0]).toBeCloseTo(12.7, 12);
		expect(p.points['lower.front'][1]).toBeCloseTo(254, 12);
		expect(p.points['lower.front'][2]).toBeCloseTo(2540, 11);
		expect(p.points['upper.outer'][0]).toBeCloseTo(-30.6, 12);
	});

	it('cm and m by the SI prefixes (1 cm = 10 mm, 1 m = 1000 mm; SI Brochure, 9th ed.)', () => {
		const cm = preview(importCorner(bytes(csvOf(mapPoints((p) => p.map((v) => v / 10)))), { unit: 'cm' }, ctx));
		const m = preview(importCorner(bytes(csvOf(mapPoints((p) => p.map((v) => v / 1000)))), { unit: 'm' }, ctx));
		for (const [n, want] of Object.entries(STOCK))
			for (let i = 0; i < 3; i++) {
				expect(cm.points[n][i]).toBeCloseTo(want[i], 9);
				expect(m.points[n][i]).toBeCloseTo(want[i], 9);
			}
	});

	it('inches typed as mm: the span warning suggests inches', () => {
		const inches = csvOf(mapPoints((p) => p.map((v) => v / 25.4)));
		const p = preview(importCorner(bytes(inches), { unit: 'mm' }, ctx));
		// The stock corner spans 400 mm in x (lower.front 180 to lower.rear −220), 400 / 25.4 = 15.75 in.
		expect(p.warnings).toEqual([
			'the points span 15.75 mm read as millimetres, too small for one corner; read as centimetres they would span 157.5 mm, as inches 400 mm: check the unit'
		]);
	});

	it('a span over 5000 mm is impossible for one corner', () => {
		expect(spanWarning([[0, 0, 0], [6, 0, 0]], 'm')).toBe(
			'the points span 6000 mm read as metres, too large for one corner; read as inches they would span 152.4 mm: check the unit'
		);
		expect(spanWarning([[0, 0, 0], [60000, 0, 0]], 'cm')).toBe('the points span 600000 mm read as centimetres, too large for one corner: check the unit');
		expect(spanWarning([[0, 0, 0], [400, 0, 0]], 'mm')).toBeNull();
	});
});

describe('axes', () => {
	// SAE J670 (Vehicle Dynamics Terminology): x forward, y to the right, z down.
	// ISO 8855 (Road vehicles — vehicle dynamics): x forward, y to the left, z up.
	it('SAE J670 → ISO 8855: a point forward, left and above the origin', () => {
		// 100 mm forward, 200 mm to the left, 300 mm up: in SAE axes y = −200 (right is +), z = −300 (down is +).
		const sae = mapPoints((p) => [p[0], -p[1], -p[2]]);
		sae['lower.front'] = [100, -200, -300];
		const p = preview(importCorner(bytes(csvOf(sae)), { unit: 'mm', axes: 'sae_j670' }, ctx));
		expect(p.points['lower.front']).toEqual([100, 200, 300]);
		expect(p.points['wheel.centre']).toEqual(STOCK['wheel.centre']);
		expect(p.warnings).toEqual([]);
	});

	it('ISO 8855 → SAE J670 → ISO 8855 round trip is the identity (same map both ways)', () => {
		const once = preview(importCorner(bytes(csvOf(STOCK)), { unit: 'mm', axes: 'sae_j670', alignment: { method: 'none' } }, ctx)).points;
		const twice = preview(importCorner(bytes(csvOf(once as Record<string, P>)), { unit: 'mm', axes: 'sae_j670' }, ctx)).points;
		expect(once['lower.outer']).toEqual([0, -695, -120]);
		expect(twice).toEqual(STOCK);
	});

	it('a signed permutation: a frame with +x to the left, +y rearward, z up', () => {
		// ISO x (forward) = −(source y), ISO y (left) = +(source x), ISO z = +(source z).
		const src = mapPoints((p) => [p[1], -p[0], p[2]]);
		const p = preview(importCorner(bytes(csvOf(src)), { unit: 'mm', axes: { x: '-y', y: '+x', z: '+z' } }, ctx));
		expect(p.points).toEqual(STOCK);
		expect(p.warnings).toEqual([]);
	});

	it('a left-handed axis map is accepted with a warning', () => {
		const src = mapPoints((p) => [p[0], -p[1], p[2]]);
		const p = preview(importCorner(bytes(csvOf(src)), { unit: 'mm', axes: { x: '+x', y: '-y', z: '+z' } }, ctx));
		expect(p.points).toEqual(STOCK);
		expect(p.warnings).toEqual(['the source axes given are left-handed (a mirror image): check the signs of the axis mapping']);
	});
});

describe('plausibility in the import preview (issue 19)', () => {
	it('a tie-rod outer joint typed 180 mm outboard of the wheel centre is warned about by its label; the stock list has no warning', () => {
		expect(preview(importCorner(bytes(csvOf(STOCK)), { unit: 'mm' }, ctx)).warnings).toEqual([]);
		const slip = mapPoints((p) => [...p]);
		slip['steer.outer'] = [slip['steer.outer'][0], slip['wheel.centre'][1] + 180, slip['steer.outer'][2]];
		const w = preview(importCorner(bytes(csvOf(slip)), { unit: 'mm' }, ctx)).warnings;
		expect(w).toEqual([expect.stringMatching(/^Tie rod, outer joint \(steer\.outer\) is 1\d\d mm outboard of the wheel centre plane/)]);
	});
});
