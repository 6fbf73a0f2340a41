// Chart helpers: points from contract samples, nice ticks, read-out values, paths, bands, CSV and formatting.

import { measuresNotApplying } from '../../../src/lib/kinds';
import { describe, expect, it } from 'vitest';
import { buildCsv } from '../../../src/lib/components/charts/chart-csv';
import {
	axisTitle,
	cursorAfterKey,
	extent,
	formatNumber,
	formatValue,
	keepIfSame,
	hasData,
	linePath,
	nearest,
	niceDomain,
	samplesToPoints,
	slugify,
	tickDecimals,
	ticks,
	valueAt,
	withinBand,
	xGrid,
	type Series
} from '../../../src/lib/components/charts/chart-data';
import { MEASURES, measure, measuresFor, SWEEP_AXES } from '../../../src/lib/components/charts/measures';

describe('samplesToPoints', () => {
	it('takes the sweep variable as x and the measure as y, null kept as a gap', () => {
		const samples = [
			{ travel: 5, toe: 0.2, rc_height: null },
			{ travel: -5, toe: -0.1, rc_height: 40 },
			{ travel: 0, toe: 0, rc_height: 50 }
		];
		expect(samplesToPoints(samples, 'travel', 'toe')).toEqual([
			{ x: -5, y: -0.1 },
			{ x: 0, y: 0 },
			{ x: 5, y: 0.2 }
		]);
		expect(samplesToPoints(samples, 'travel', 'rc_height').map((p) => p.y)).toEqual([40, 50, null]);
	});

	it('skips samples without the sweep variable and turns non-finite values into null', () => {
		const samples = [{ roll: 1, camber: Number.NaN }, { travel: 2, camber: 1 }, { roll: 2, camber: Infinity }, { roll: 3 }];
		expect(samplesToPoints(samples, 'roll', 'camber')).toEqual([
			{ x: 1, y: null },
			{ x: 2, y: null },
			{ x: 3, y: null }
		]);
	});
});

describe('nice ticks', () => {
	it('steps are 1, 2 or 5 times a power of ten, nearest the asked count (d3-array tickIncrement thresholds, through d3-scale)', () => {
		const step = (lo: number, hi: number) => {
			const t = ticks(lo, hi, 5);
			return Number((t[1] - t[0]).toPrecision(12));
		};
		expect(step(0, 100)).toBe(20);
		expect(step(0, 1)).toBe(0.2);
		expect(step(0, 0.12)).toBe(0.02);
		expect(step(0, 2.77)).toBe(0.5);
		expect(step(0, 7)).toBe(1);
	});

	it('ticks cover the range on whole steps without floating noise', () => {
		expect(ticks(-50, 50, 5)).toEqual([-40, -20, 0, 20, 40]);
		expect(ticks(-50, 50, 10)).toEqual([-50, -40, -30, -20, -10, 0, 10, 20, 30, 40, 50]);
		expect(ticks(0.1, 0.7, 6)).toEqual([0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7]);
		expect(ticks(3, 3)).toEqual([3]);
	});

	it('the nice domain encloses the data on tick steps', () => {
		expect(niceDomain(-1.398, 1.372, 5)).toEqual([-1.5, 1.5]);
		expect(niceDomain(-3.149, -0.553, 5)).toEqual([-3.5, -0.5]);
		const [lo, hi] = niceDomain(-0.1, -0.1);
		expect(lo).toBeLessThan(-0.1);
		expect(hi).toBeGreaterThan(-0.1);
		expect(niceDomain(0, 0)).toEqual([-1, 1]);
	});

	it('tick decimals follow the step', () => {
		expect(tickDecimals(20)).toBe(0);
		expect(tickDecimals(0.5)).toBe(1);
		expect(tickDecimals(0.025)).toBe(3);
		expect(tickDecimals(2.5)).toBe(1);
	});
});

describe('valueAt (read-out at the cursor)', () => {
	const pts = [
		{ x: -10, y: 1 },
		{ x: 0, y: 2 },
		{ x: 10, y: null },
		{ x: 20, y: 4 }
	];

	it('interpolates linearly between samples and is exact on a sample', () => {
		expect(valueAt(pts, -5)).toBeCloseTo(1.5, 12);
		expect(valueAt(pts, 0)).toBe(2);
		expect(valueAt(pts, 20)).toBe(4);
	});

	it('is null outside the sweep, across a gap and on a null sample', () => {
		expect(valueAt(pts, -10.5)).toBeNull();
		expect(valueAt(pts, 21)).toBeNull();
		expect(valueAt(pts, 5)).toBeNull();
		expect(valueAt(pts, 15)).toBeNull();
		expect(valueAt(pts, 10)).toBeNull();
		expect(valueAt([], 0)).toBeNull();
	});

	it('nearest snaps to the closest grid position', () => {
		const grid = xGrid([
			{ id: 'a', label: 'A', points: [{ x: 0, y: 1 }, { x: 2, y: 1 }] },
			{ id: 'b', label: 'B', points: [{ x: 1, y: 1 }, { x: 2, y: 3 }] }
		]);
		expect(grid).toEqual([0, 1, 2]);
		expect(nearest(grid, 1.4)).toBe(1);
		expect(nearest(grid, 1.6)).toBe(2);
		expect(nearest(grid, -9)).toBe(0);
		expect(nearest([], 1)).toBeNull();
	});
});

describe('paths and data checks', () => {
	it('draws one move-to per run of values and breaks the line at null', () => {
		const d = linePath(
			[
				{ x: 0, y: 0 },
				{ x: 1, y: 1 },
				{ x: 2, y: null },
				{ x: 3, y: 3 },
				{ x: 4, y: 4 }
			],
			(x) => x * 10,
			(y) => 100 - y * 10
		);
		expect(d).toBe('M0,100L10,90M30,70L40,60');
		expect(linePath([{ x: 0, y: null }], (x) => x, (y) => y)).toBe('');
	});

	it('extent and hasData ignore nulls', () => {
		expect(extent([3, null, -1, 2])).toEqual([-1, 3]);
		expect(extent([null])).toBeNull();
		expect(hasData([{ id: 'a', label: 'A', points: [{ x: 0, y: null }] }])).toBe(false);
		expect(hasData([])).toBe(false);
		expect(hasData([{ id: 'a', label: 'A', points: [{ x: 0, y: 0 }] }])).toBe(true);
	});

	it('withinBand judges only the band range and fails on a gap or on no points', () => {
		const band = { x0: -40, x1: 40, y0: -0.1, y1: 0.1 };
		const inside = [-50, -40, 0, 40, 50].map((x) => ({ x, y: Math.abs(x) > 40 ? 5 : x / 1000 }));
		expect(withinBand(inside, band)).toBe(true);
		expect(withinBand(inside.map((p) => (p.x === 40 ? { x: 40, y: 0.11 } : p)), band)).toBe(false);
		expect(withinBand(inside.map((p) => (p.x === 0 ? { x: 0, y: null } : p)), band)).toBe(false);
		expect(withinBand([{ x: 60, y: 0 }], band)).toBe(false);
	});
});

describe('keepIfSame (unchanged domains and grids keep their identity)', () => {
	it('keeps the earlier array when the values match, takes the new one otherwise', () => {
		const before: [number, number] = [-2, 2];
		expect(keepIfSame(before, [-2, 2])).toBe(before);
		const moved: [number, number] = [-2, 2.5];
		expect(keepIfSame(before, moved)).toBe(moved);
		const longer = [-2, 2, 3];
		expect(keepIfSame<number[]>(before, longer)).toBe(longer);
		const first = [1];
		expect(keepIfSame(undefined, first)).toBe(first);
	});

	it('treats NaN as equal to NaN and −0 as unlike +0 (Object.is)', () => {
		const a = [NaN, 0];
		expect(keepIfSame(a, [NaN, 0])).toBe(a);
		const b = [-0];
		expect(keepIfSame([0], b)).toBe(b);
	});
});

describe('formatting', () => {
	it('uses a true minus, fixed decimals and never prints −0', () => {
		expect(formatNumber(-0.0521, 3)).toBe('\u22120.052');
		expect(formatNumber(-0.0001, 2)).toBe('0.00');
		expect(formatValue(-0.0521, '°', 3)).toBe('\u22120.052°');
		expect(formatValue(12.345, 'mm')).toBe('12.3 mm');
		expect(formatValue(0.70712, '')).toBe('0.707');
		expect(formatValue(25.06, '%')).toBe('25.1%');
		expect(formatValue(null, '°')).toBe('–');
	});

	it('axis titles carry the unit, a ratio shows (–)', () => {
		expect(axisTitle('Toe', '°')).toBe('Toe (°)');
		expect(axisTitle('Motion ratio', '')).toBe('Motion ratio (–)');
	});

	it('slugs are lower-case and hyphenated', () => {
		expect(slugify('Toe')).toBe('toe');
		expect(slugify('Roll-centre height (mm)')).toBe('roll-centre-height-mm');
		expect(slugify('  ')).toBe('chart');
	});
});

describe('buildCsv', () => {
	const series: Series[] = [
		{ id: 'stock', label: 'Stock', points: [{ x: -1, y: -0.05 }, { x: 0, y: -0.0499999999 }, { x: 1, y: null }] },
		{ id: 'rack', label: 'Rack "lowered", 20 mm', points: [{ x: 0, y: 0.5 }, { x: 1, y: 1.25 }, { x: 2, y: -0 }] }
	];

	it('names units in the header (ASCII) and quotes fields with commas or quotes', () => {
		const csv = buildCsv({ xLabel: 'Wheel travel, + bump', xUnit: 'mm', yLabel: 'Toe', yUnit: '°', series });
		const lines = csv.split('\r\n');
		expect(lines[0]).toBe('"Wheel travel, + bump (mm)",Stock: Toe (deg),"Rack ""lowered"", 20 mm: Toe (deg)"');
		expect(csv.endsWith('\r\n')).toBe(true);
	});

	it('writes one row per sweep position with empty cells where a series has no value', () => {
		const lines = buildCsv({ xLabel: 'Travel', xUnit: 'mm', yLabel: 'Toe', yUnit: '°', series }).trimEnd().split('\r\n');
		expect(lines.slice(1)).toEqual(['-1,-0.05,', '0,-0.05,0.5', '1,,1.25', '2,,0']);
	});

	it('a ratio column says (-)', () => {
		const csv = buildCsv({ xLabel: 'Roll', xUnit: '°', yLabel: 'Motion ratio', yUnit: '', series: [] });
		expect(csv).toBe('Roll (deg)\r\n');
		expect(csv.includes('Motion ratio')).toBe(false);
		expect(buildCsv({ xLabel: 'Roll', xUnit: '°', yLabel: 'Motion ratio', yUnit: '', series: series.slice(0, 1) }).split('\r\n')[0]).toBe(
			'Roll (deg),Stock: Motion ratio (-)'
		);
	});
});

describe('measures', () => {
	it('lists the eleven chartable contract fields once each, with units', () => {
		const keys = MEASURES.map((m) => m.key);
		expect(new Set(keys).size).toBe(keys.length);
		expect(keys).toEqual(['camber', 'toe', 'caster', 'kpi', 'scrub_radius', 'trail', 'half_track_change', 'rc_height', 'motion_ratio', 'rocker_angle', 'camber_ground']);
		expect(measure('toe')).toMatchObject({ unit: '°', sign: '+ = toe-in' });
		expect(measure('kpi').label).toBe('Kingpin inclination');
		expect(measure('motion_ratio').unit).toBe('');
	});

	it('a corner without a steering axis charts no caster, KPI, scrub or trail; the rocker angle only with a rocker', () => {
		const semi = measuresFor('heave', measuresNotApplying('semi_trailing', { 'spring.chassis': [0, 0, 0], 'spring.body': [0, 0, 0] })).map((m) => m.key);
		for (const k of ['caster', 'kpi', 'scrub_radius', 'trail'] as const) expect(semi).not.toContain(k);
		expect(semi).toContain('camber');
		expect(measuresFor('heave').map((m) => m.key)).not.toContain('rocker_angle');
		expect(measuresFor('heave', measuresNotApplying('double_wishbone', { 'rocker.pivot_a': [0, 0, 0], 'spring.chassis': [0, 0, 0] })).map((m) => m.key)).toContain('rocker_angle');
		expect(measuresFor('heave', measuresNotApplying('double_wishbone', {})).map((m) => m.key)).not.toContain('motion_ratio');
	});

	it('roll-centre height is heave only, camber to ground roll only (contract)', () => {
		expect(measuresFor('heave').map((m) => m.key)).toContain('rc_height');
		expect(measuresFor('roll').map((m) => m.key)).not.toContain('rc_height');
		expect(measuresFor('roll').map((m) => m.key)).toContain('camber_ground');
		expect(measuresFor('steer').map((m) => m.key)).not.toContain('camber_ground');
		expect(SWEEP_AXES.heave).toEqual({ key: 'travel', label: 'Wheel travel, + bump', unit: 'mm' });
	});
});

describe('cursorAfterKey (keys of the WAI-ARIA Authoring Practices slider pattern: arrows one step, Page keys a larger step, Home/End the ends)', () => {
	const grid = Array.from({ length: 21 }, (_, i) => i * 5 - 50);
	it('arrows step one sample, Page keys ten, clamped at the ends', () => {
		expect(cursorAfterKey(grid, 0, 'ArrowRight')).toBe(5);
		expect(cursorAfterKey(grid, 0, 'ArrowDown')).toBe(-5);
		expect(cursorAfterKey(grid, 0, 'PageUp')).toBe(50);
		expect(cursorAfterKey(grid, -40, 'PageDown')).toBe(-50);
		expect(cursorAfterKey(grid, 50, 'ArrowUp')).toBe(50);
	});
	it('Home and End go to the ends, Escape hides the cursor, other keys are not taken', () => {
		expect(cursorAfterKey(grid, 10, 'Home')).toBe(-50);
		expect(cursorAfterKey(grid, 10, 'End')).toBe(50);
		expect(cursorAfterKey(grid, 10, 'Escape')).toBeNull();
		expect(cursorAfterKey(grid, 10, 'a')).toBeUndefined();
		expect(cursorAfterKey([], 10, 'Home')).toBeUndefined();
	});
	it('with no cursor yet the first arrow starts from the first sample', () => {
		expect(cursorAfterKey(grid, null, 'ArrowRight')).toBe(-45);
	});
});
