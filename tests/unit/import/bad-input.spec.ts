// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Bad input of issue 4: each case fails with its exact code, message and place; nothing else.

import { describe, expect, it } from 'vitest';
import { importCorner, type ImportResult } from '../../../src/lib/server/import/index';
import { KNOWN_POINTS } from '../../../src/lib/schemas/import';
import { bytes, csvOf, STOCK, without } from './helpers';

const ctx = { kind: 'double_wishbone' as const };
const mm = { unit: 'mm' };

/** The failure of a result (fails the test when the import succeeded). */
function failure(r: ImportResult) {
	expect(r.ok).toBe(false);
	if (r.ok) throw new Error('expected a failure');
	return r.error;
}

describe('bad input (issue 4)', () => {
	it('an empty file', () => {
		expect(failure(importCorner(new Uint8Array(0), mm, ctx))).toEqual({ code: 'file_empty', message: 'the file is empty', field: 'file' });
	});

	it('a file of only a byte-order mark and blank lines is empty too', () => {
		expect(failure(importCorner(bytes('\uFEFF\r\n  \r\n'), mm, ctx)).message).toBe('the file is empty');
	});

	it('130,000 rows (1.7 MB, under the size limit) are refused naming the file, without overflowing the stack (issue 21)', () => {
		const text = 'name,x,y,z\n' + Array.from({ length: 130_000 }, (_, i) => `p${i},1.5,2.5,3.5`).join('\n');
		expect(failure(importCorner(bytes(text), mm, ctx))).toEqual({
			code: 'too_many_rows',
			message: 'the file has 130000 rows; a point list may have at most 2000',
			field: 'file'
		});
	});

	it('a header and no points', () => {
		expect(failure(importCorner(bytes('name,x,y,z\n'), mm, ctx)).message).toBe('the file has a header row but no points');
	});

	it('no header row and no column mapping', () => {
		const text = csvOf(STOCK).split('\n').slice(1).join('\n');
		expect(failure(importCorner(bytes(text), mm, ctx))).toEqual({
			code: 'no_header_no_mapping',
			message: 'the file has no header row and no column mapping was given: map the name, x, y and z columns by index',
			field: 'columns'
		});
	});

	it('a missing z column in the header', () => {
		const text = 'name,x,y\nlower.front,1,2\n';
		expect(failure(importCorner(bytes(text), mm, ctx))).toEqual({
			code: 'column_missing',
			message: 'column z: not found in the header (columns: "name", "x", "y"); map it by name or index',
			field: 'columns.z'
		});
	});

	it('a mapped column name that is not in the header', () => {
		const e = failure(importCorner(bytes(csvOf(STOCK)), { ...mm, columns: { name: 'name', x: 'x', y: 'y', z: 'Z_mm' } }, ctx));
		expect(e.message).toBe('column z: no column "Z_mm" in the header (columns: "name", "x", "y", "z")');
		expect(e.field).toBe('columns.z');
	});

	it('a non-numeric value names its row and column', () => {
		const lines = csvOf(STOCK).split('\n');
		lines[6] = 'steer.inner,-130,358,"12,3,4"'; // file row 7
		expect(failure(importCorner(bytes(lines.join('\n')), mm, ctx))).toEqual({
			code: 'not_a_number',
			message: 'row 7, column z: "12,3,4" is not a number',
			field: 'columns.z',
			row: 7,
			column: 3
		});
	});

	it('a blank value names its row and column', () => {
		const lines = csvOf(STOCK).split('\n');
		lines[2] = 'lower.rear,-220,,133';
		expect(failure(importCorner(bytes(lines.join('\n')), mm, ctx))).toEqual({
			code: 'blank_value',
			message: 'row 3, column y: blank, a number is needed',
			field: 'columns.y',
			row: 3,
			column: 2
		});
	});

	it('a duplicate point name', () => {
		const text = csvOf(STOCK) + 'lower.front,1,2,3\n'; // row 14 repeats row 2
		expect(failure(importCorner(bytes(text), mm, ctx))).toEqual({
			code: 'duplicate_point',
			message: 'row 14: point "lower.front" appears twice (rows 2 and 14)',
			field: 'points.lower.front',
			row: 14
		});
	});

	it('two file names mapped to the same point', () => {
		const text = csvOf(STOCK) + 'LCA_F,1,2,3\n';
		const e = failure(importCorner(bytes(text), { ...mm, names: { LCA_F: 'lower.front' } }, ctx));
		expect(e.message).toBe('row 14: point "lower.front" appears twice (rows 2 and 14) ("lower.front" and "LCA_F" both map to it)');
	});

	it('a required point missing', () => {
		const text = csvOf(without(STOCK, 'upper.outer'));
		expect(failure(importCorner(bytes(text), mm, ctx))).toEqual({
			code: 'point_missing',
			message: 'points.upper.outer: missing from the file',
			field: 'points.upper.outer'
		});
	});

	it('a strut corner needs its strut points', () => {
		const e = failure(importCorner(bytes(csvOf(STOCK)), mm, { kind: 'strut' }));
		expect(e.message).toBe('points.strut.top: missing from the file (also missing: strut.lower)');
	});

	it('a mapped point name we do not know', () => {
		const e = failure(importCorner(bytes(csvOf(STOCK)), { ...mm, names: { LCA_F: 'lower.frnt' } }, ctx));
		expect(e).toEqual({
			code: 'unknown_point',
			message: `names.LCA_F: "lower.frnt" is not a point name (known: ${KNOWN_POINTS.join(', ')})`,
			field: 'names.LCA_F'
		});
	});

	it('a coordinate beyond 5000 mm after conversion', () => {
		// 200 in = 5080 mm (1 in = 25.4 mm): plausible in inches as a number, not as a corner.
		const inches = Object.fromEntries(Object.entries(STOCK).map(([n, p]) => [n, p.map((v) => v / 25.4)])) as typeof STOCK;
		inches['lower.front'] = [200, 335 / 25.4, 127 / 25.4];
		const e = failure(importCorner(bytes(csvOf(inches)), { unit: 'in' }, ctx));
		expect(e).toEqual({
			code: 'out_of_range',
			message: 'points.lower.front: x = 5080.0 mm (row 2) is beyond ±5000 mm: check the unit, axes and alignment',
			field: 'points.lower.front',
			row: 2
		});
	});

	it('metres typed as millimetres are refused by the range', () => {
		const e = failure(importCorner(bytes(csvOf(STOCK)), { unit: 'm' }, ctx));
		expect(e.code).toBe('out_of_range');
		expect(e.message).toBe('points.lower.front: x = 180000.0 mm (row 2) is beyond ±5000 mm: check the unit, axes and alignment');
	});

	it('a 10 MB file', () => {
		const big = new Uint8Array(10 * 1024 * 1024).fill(0x41);
		expect(failure(importCorner(big, mm, ctx))).toEqual({
			code: 'file_too_large',
			message: 'the file is 10.0 MB; the limit is 5 MB',
			field: 'file'
		});
	});

	it('a file just over 5 MB is refused, one at the limit is read', () => {
		const over = failure(importCorner(new Uint8Array(5 * 1024 * 1024 + 1).fill(0x20), mm, ctx));
		expect(over.code).toBe('file_too_large');
		const at = failure(importCorner(new Uint8Array(5 * 1024 * 1024).fill(0x20), mm, ctx));
		expect(at.code).toBe('file_empty');
	});

	it('a binary file (NUL bytes)', () => {
		const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d]);
		expect(failure(importCorner(png, mm, ctx))).toEqual({
			code: 'file_binary',
			message: 'the file is not a text CSV (binary content at byte 8)',
			field: 'file'
		});
	});

	it('a binary file without NUL bytes (control characters)', () => {
		const noise = new Uint8Array(1000).map((_, i) => (i * 37) % 255 + 1);
		expect(failure(importCorner(noise, mm, ctx)).code).toBe('file_binary');
	});

	it('options that fail the schema name the field', () => {
		expect(failure(importCorner(bytes(csvOf(STOCK)), { unit: 'yd' }, ctx))).toEqual({
			code: 'options_invalid',
			message: "unit: must be 'mm', 'cm', 'm' or 'in'",
			field: 'unit'
		});
	});

	it('an axis map using a source axis twice', () => {
		const e = failure(importCorner(bytes(csvOf(STOCK)), { ...mm, axes: { x: '+x', y: '-x', z: '+z' } }, ctx));
		expect(e.code).toBe('options_invalid');
		expect(e.message).toBe('axes: each source axis (x, y, z) must be used exactly once');
	});

	it('a side value that is neither left nor right', () => {
		const text = 'name,side,x,y,z\nlower.front,X,1,2,3\n';
		expect(failure(importCorner(bytes(text), mm, ctx))).toEqual({
			code: 'side_unknown',
			message: 'row 2, column side: "X" is not a side (L, R, left or right)',
			field: 'columns.side',
			row: 2,
			column: 1
		});
	});

	it('both sides in the file and no side chosen', () => {
		const text = 'name,side,x,y,z\nlower.front,L,1,2,3\nlower.front,R,1,-2,3\n';
		expect(failure(importCorner(bytes(text), mm, ctx)).message).toBe(
			'the file has left and right rows: choose which side to import (side: "left" or "right")'
		);
	});

	it('a side chosen that the file does not have', () => {
		const text = 'name,side,x,y,z\nlower.front,L,1,2,3\n';
		expect(failure(importCorner(bytes(text), { ...mm, side: 'right' }, ctx))).toEqual({
			code: 'side_empty',
			message: 'the file has no right rows (it has left rows only)',
			field: 'side'
		});
	});
});
