// Length units for display: 1 in = 25.4 mm exactly (the international inch; NIST Special Publication 811,
// appendix B.8). Stored values stay mm; inches are shown and typed, and converted back at full precision.
import { describe, expect, test } from 'vitest';
import { fromUnit, lengthText, toUnit } from '../../src/lib/units';
import { sheetCsv } from '../../src/lib/server/sharing/sheet-csv';
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
});
