// The binned full-resolution points (src/lib/mesh/tiles.ts) against a brute-force search (derived here): every
// point within the ball, and only those, read back through the byte ranges the index names.
import { describe, expect, test } from 'vitest';
import { encodeTiles, pointsWithin, rangesWithin, readTilesHeader, readTilesIndex, TILES_HEADER_BYTES } from '../../../src/lib/mesh/tiles';

/** A seeded generator (Park–Miller minimal standard, 1988) so the cloud is the same every run. */
function lcg(seed: number) {
	let s = seed;
	return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

function cloud(n: number, seed: number, extent: number[]) {
	const rand = lcg(seed);
	const out = new Float32Array(3 * n);
	for (let i = 0; i < 3 * n; i++) out[i] = (rand() - 0.3) * extent[i % 3];
	return out;
}

/** The points of the ball by brute force, as sorted 'x,y,z' strings. */
function brute(points: Float32Array, at: number[], r: number) {
	const out: string[] = [];
	for (let i = 0; i < points.length; i += 3) {
		const d = [points[i] - at[0], points[i + 1] - at[1], points[i + 2] - at[2]];
		if (d[0] * d[0] + d[1] * d[1] + d[2] * d[2] <= r * r) out.push(`${points[i]},${points[i + 1]},${points[i + 2]}`);
	}
	return out.sort();
}

/** The ball read back as the patch endpoint does: header, index, then only the named byte ranges. */
function readBack(bytes: Uint8Array, at: number[], r: number, mergeGap?: number) {
	const header = readTilesHeader(bytes.subarray(0, TILES_HEADER_BYTES));
	const index = readTilesIndex(header, bytes.subarray(TILES_HEADER_BYTES, TILES_HEADER_BYTES + 8 * header.cells));
	const found: number[] = [];
	const ranges = rangesWithin(index, at, r, mergeGap);
	for (const [a, b] of ranges) pointsWithin(bytes.subarray(a, b), at, r, found);
	const out: string[] = [];
	for (let i = 0; i < found.length; i += 3) out.push(`${found[i]},${found[i + 1]},${found[i + 2]}`);
	return { points: out.sort(), ranges, header };
}

describe('binned points', () => {
	const points = cloud(20_000, 7, [1800, 900, 600]);
	const bytes = encodeTiles(points);

	test('the header names the grid and every point is stored once', () => {
		const h = readTilesHeader(bytes);
		expect(h.points).toBe(20_000);
		expect(bytes.length).toBe(TILES_HEADER_BYTES + 8 * h.cells + 12 * 20_000);
		// the longest side (x, 1800) in 96 cells
		expect(h.dims[0]).toBeLessThanOrEqual(96);
		expect(h.cell * 96).toBeCloseTo(Math.max(...[0, 1, 2].map((k) => spread(points, k))), 0);
		const everything = readBack(bytes, [500, 200, 100], 1e4);
		expect(everything.points).toEqual(brute(points, [500, 200, 100], 1e4));
	});

	test.each([
		[[100, 100, 50], 15],
		[[-200, 0, 0], 80],
		[[1200, 600, 400], 40],
		[[-540, -270, -180], 30], // the grid's corner
		[[5000, 0, 0], 20] // outside: nothing
	])('a ball at %j of radius %d reads back exactly the brute-force set', (at, r) => {
		const got = readBack(bytes, at, r);
		expect(got.points).toEqual(brute(points, at, r));
		// and without merging neighbouring reads (each run of cells its own range)
		expect(readBack(bytes, at, r, 0).points).toEqual(got.points);
	});

	test('a small ball touches a small part of the object', () => {
		const got = readBack(bytes, [100, 100, 50], 15, 0);
		const read = got.ranges.reduce((sum, [a, b]) => sum + b - a, 0);
		expect(read).toBeLessThan(bytes.length / 50);
	});

	test('bytes that are not binned points are refused', () => {
		expect(() => readTilesHeader(new Uint8Array(64))).toThrow(/LWPT/);
		expect(() => readTilesHeader(new Uint8Array(10))).toThrow(/shorter/);
	});

	test('no points: an empty grid', () => {
		const empty = encodeTiles(new Float32Array(0));
		expect(readTilesHeader(empty)).toMatchObject({ points: 0, cells: 0 });
		expect(readBack(empty, [0, 0, 0], 5).points).toEqual([]);
	});
});

function spread(points: Float32Array, k: number) {
	let lo = Infinity, hi = -Infinity;
	for (let i = k; i < points.length; i += 3) {
		lo = Math.min(lo, points[i]);
		hi = Math.max(hi, points[i]);
	}
	return hi - lo;
}
