// Length units for display: 1 in = 25.4 mm exactly (the international inch; NIST Special Publication 811,
// appendix B.8). Stored values stay mm; inches are shown and typed, and converted back at full precision.
import { describe, expect, test } from 'vitest';
import { editValue, figureText, fromUnit, lengthText, shownUnit, toUnit, travelHeading, typedLength } from '../../src/lib/units';
import { positionsTextIn, positionsToText, defaultPositions } from '../../src/lib/schemas/compare';
import { describeTarget } from '../../src/lib/schemas/targets';
import { axleSheetCsv, sheetCsv } from '../../src/lib/server/sharing/sheet-csv';
import { pointsCsv } from '../../src/lib/server/corners/present';
import { parseCell } from '../../src/routes/corners/[cornerId=id]/point-rows';

describe('lengths in inches', () => {
	test('25.4 mm is one inch, both ways, and mm stay as they are', () => {
		expect(toUnit(25.4, 'in')).toBe(1);
		expect(fromUnit(12.5, 'in')).toBe(317.5);
		expect(toUnit(123.4, 'mm')).toBe(123.4);
		// 0.1 mm on a sheet is 0.001 in: two more decimals, never "-0.000"
		expect(lengthText(-50.8, 'in', 1)).toBe('-2.000');
		expect(lengthText(-0.0001, 'in', 1)).toBe('0.000');
		expect(lengthText(312.44, 'mm', 1)).toBe('312.4');
	});

	test('figures and travel headings: lengths follow the unit, degrees and ratios do not', () => {
		expect(figureText(25.4, 'mm', 1, 'in')).toBe('1.000');
		expect(figureText(-1.23456, '°', 3, 'in')).toBe('-1.235');
		expect(figureText(-0.0001, '', 3, 'mm')).toBe('0.000');
		expect(travelHeading(25.4, 'in')).toBe('+1');
		expect(travelHeading(-12.7, 'in')).toBe('-0.5');
		expect(travelHeading(-25, 'mm')).toBe('-25');
	});

	test('a value typed in inches is stored in mm; the range check is in mm and says so in inches', () => {
		expect(parseCell('10', 25.4)).toEqual({ value: 254, error: null });
		expect(parseCell('10,5', 25.4).value).toBeCloseTo(266.7, 12);
		// 5000 mm is 196.85 in: 197 in is out, 196 in is in
		expect(parseCell('197', 25.4).error).toMatch(/5000 mm \(196\.9 in\)/);
		expect(parseCell('196', 25.4).error).toBeNull();
	});

	test('the share sheet CSV in inches: columns named _in, values at 0.001 in', () => {
		const csv = sheetCsv([{ name: 'steer.inner', label: 'Tie rod, inner joint', xyz: [25.4, -50.8, 127], delta: { dx: -2.54, dy: 0, dz: 0, d: 2.54 }, tolerance: { mm: 0.254, mode: 'axis' } }], true, 'in');
		const [head, row] = csv.trim().split(/\r?\n/);
		expect(head).toBe('point,description,x_in,y_in,z_in,dx_in,dy_in,dz_in,tolerance_in,tolerance_mode');
		expect(row).toBe('steer.inner,"Tie rod, inner joint",1.000,-2.000,5.000,-0.100,0.000,0.000,0.0100,axis');
	});

	test('the revision CSV in inches keeps full precision', () => {
		const csv = pointsCsv({ kind: 'double_wishbone', points: { 'lower.front': [254, 25.4, 1] } }, 'in');
		expect(csv.trim().split(/\r?\n/)).toEqual(['point,x_in,y_in,z_in', `lower.front,10,1,${1 / 25.4}`]);
	});

	test('an input in inches: shown to a micro-inch, typed back in mm; blank is no value', () => {
		// 300 mm = 11.811024 in (to 1e-6 in); mm inputs show the stored number untouched
		expect(editValue(300, 'in')).toBe(11.811024);
		expect(editValue(299.97, 'mm')).toBe(299.97);
		expect(typedLength('12', 'in')).toBeCloseTo(304.8, 12);
		expect(typedLength('11,5', 'in')).toBeCloseTo(292.1, 12);
		expect(typedLength(' ', 'in')).toBeNull();
		expect(typedLength('abc', 'in')).toBeNaN();
		expect(shownUnit('mm', 'in')).toBe('in');
		expect(shownUnit('°', 'in')).toBe('°');
	});

	test('compare positions typed in inches are mm for the solve, rounded to 0.001 in; the limit is named in both', () => {
		expect(positionsTextIn('in').parse('1, -2, 0')).toEqual([-50.8, 0, 25.4]);
		expect(positionsTextIn('in').safeParse('8').error?.issues[0].message).toBe('at: 8 in is beyond ±7.87 in (200 mm) of travel');
		expect(positionsTextIn('mm').parse('25, -50')).toEqual([-50, 25]);
		expect(positionsToText(defaultPositions('in'), 'in')).toBe('-2, -1, 0, 1, 2');
	});

	test('a target in words in inches: the band and the travel in inches, the stored target still mm', () => {
		const t = { measure: 'rc_height', basis: 'change', min: -12.7, max: 12.7, from: -50.8, to: 50.8 } as const;
		expect(describeTarget(t as never, 'in')).toBe('Roll-centre height change within ±0.500 in over -2…2 in');
		expect(describeTarget(t as never)).toBe('Roll-centre height change within ±12.7mm over -50.8…50.8 mm');
	});

	test('the axle sheet CSV in inches: columns named _in, values at 0.001 in; mm as before', () => {
		const rows = [{ side: 'left', name: 'lower.front', label: 'Lower arm, front pivot', xyz: [254, -25.4, 0.00001] }];
		expect(axleSheetCsv(rows as never, 'in').trim().split(/\r?\n/)).toEqual(['side,point,description,x_in,y_in,z_in', 'left,lower.front,"Lower arm, front pivot",10.000,-1.000,0.000']);
		expect(axleSheetCsv(rows as never).trim().split(/\r?\n/)[1]).toBe('left,lower.front,"Lower arm, front pivot",254.0,-25.4,0.0');
	});
});
