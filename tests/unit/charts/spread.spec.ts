// The tolerance bands' area path: along the upper edge, back along the lower one, closed.
import { describe, expect, it } from 'vitest';
import { areaPath } from '../../../src/lib/components/charts/chart-data';

const pts = [
	{ x: 0, min: -2, max: 2, p5: -1, p95: 1 },
	{ x: 1, min: -3, max: 3, p5: -2, p95: 2 },
	{ x: 2, min: Number.NaN, max: 4, p5: -3, p95: 3 }
];
const id = (v: number) => v;

describe('areaPath', () => {
	it('runs along the upper edge, back along the lower edge and closes', () => {
		expect(areaPath(pts.slice(0, 2), id, id, (p) => p.p5, (p) => p.p95)).toBe('M0,1L1,2L1,-2L0,-1Z');
	});

	it('leaves out positions without a finite value, and draws nothing for fewer than two', () => {
		expect(areaPath(pts, id, id, (p) => p.min, (p) => p.max)).toBe('M0,2L1,3L1,-3L0,-2Z');
		expect(areaPath(pts.slice(0, 1), id, id, (p) => p.min, (p) => p.max)).toBe('');
	});
});
