// The scan's full-resolution points, binned in a regular grid so that the points near a pick can be read back with a
// few byte-range reads of one object instead of the whole original. Written by the scan worker next to the preview;
// read by GET /api/v1/scans/{id}/patch, whose points the fits use.
//
// Bytes (little-endian), ".lwpt" version 1:
//   0  'LWPT'                      magic
//   4  u32 version (1)
//   8  f64 × 3 origin              the grid's corner (the scan's bounds' minimum, file units)
//  32  f64 cell                    the cells' edge (file units)
//  40  u32 × 3 nx, ny, nz          cells along x, y, z
//  52  u32 cells                   non-empty cells
//  56  u32 points                  points in all
//  60  u32 0                       (padding)
//  64  cells × (u32 cell index, u32 first point)   sorted by cell index; index = (iz · ny + iy) · nx + ix
//  64 + 8 · cells                  points × f32 × 3, grouped by cell in index order
// A cell's points run from its first point to the next cell's first point (the last cell's to `points`).

export const TILES_MAGIC = 0x5450574c; // 'LWPT' read as a little-endian u32
export const TILES_HEADER_BYTES = 64;
/** Cells along the scan's longest side (common practice for a uniform grid: a few tens of points a cell). */
export const TILES_PER_SIDE = 96;

export interface TilesHeader {
	origin: [number, number, number];
	cell: number;
	dims: [number, number, number];
	cells: number;
	points: number;
}

export interface TilesIndex extends TilesHeader {
	/** sorted cell indices of the non-empty cells */
	cellIds: Uint32Array;
	/** each non-empty cell's first point, and `points` at the end (length cells + 1) */
	firstPoint: Uint32Array;
}

/** Bins the points (x, y, z triples) into the grid; the object's bytes. */
export function encodeTiles(positions: Float32Array, perSide = TILES_PER_SIDE): Uint8Array {
	const n = positions.length / 3;
	const min = [Infinity, Infinity, Infinity];
	const max = [-Infinity, -Infinity, -Infinity];
	for (let i = 0; i < n; i++)
		for (let k = 0; k < 3; k++) {
			const v = positions[3 * i + k];
			if (v < min[k]) min[k] = v;
			if (v > max[k]) max[k] = v;
		}
	if (n === 0) for (let k = 0; k < 3; k++) min[k] = max[k] = 0;
	const side = Math.max(max[0] - min[0], max[1] - min[1], max[2] - min[2]);
	const cell = side > 0 ? side / perSide : 1;
	const dims = [0, 1, 2].map((k) => Math.max(1, Math.min(perSide, Math.floor((max[k] - min[k]) / cell) + 1))) as [number, number, number];
	// a counting sort over the dense grid (at most perSide³ cells)
	const total = dims[0] * dims[1] * dims[2];
	const cellOf = new Uint32Array(n);
	const counts = new Uint32Array(total);
	const p = [0, 0, 0];
	for (let i = 0; i < n; i++) {
		p[0] = positions[3 * i];
		p[1] = positions[3 * i + 1];
		p[2] = positions[3 * i + 2];
		const c = cellIndex(p, min, cell, dims);
		cellOf[i] = c;
		counts[c]++;
	}
	let cells = 0;
	for (let c = 0; c < total; c++) if (counts[c] > 0) cells++;
	const bytes = new Uint8Array(TILES_HEADER_BYTES + 8 * cells + 12 * n);
	const view = new DataView(bytes.buffer);
	view.setUint32(0, TILES_MAGIC, true);
	view.setUint32(4, 1, true);
	for (let k = 0; k < 3; k++) view.setFloat64(8 + 8 * k, min[k], true);
	view.setFloat64(32, cell, true);
	for (let k = 0; k < 3; k++) view.setUint32(40 + 4 * k, dims[k], true);
	view.setUint32(52, cells, true);
	view.setUint32(56, n, true);
	// counts become each cell's next free slot
	let run = 0;
	let row = 0;
	for (let c = 0; c < total; c++) {
		const k = counts[c];
		if (k === 0) continue;
		view.setUint32(TILES_HEADER_BYTES + 8 * row, c, true);
		view.setUint32(TILES_HEADER_BYTES + 8 * row + 4, run, true);
		counts[c] = run;
		run += k;
		row++;
	}
	const out = new Float32Array(bytes.buffer, TILES_HEADER_BYTES + 8 * cells, 3 * n);
	for (let i = 0; i < n; i++) {
		const slot = counts[cellOf[i]]++;
		out[3 * slot] = positions[3 * i];
		out[3 * slot + 1] = positions[3 * i + 1];
		out[3 * slot + 2] = positions[3 * i + 2];
	}
	return bytes;
}

function cellIndex(p: ArrayLike<number>, origin: ArrayLike<number>, cell: number, dims: ArrayLike<number>): number {
	const i = [0, 1, 2].map((k) => Math.min(dims[k] - 1, Math.max(0, Math.floor((p[k] - origin[k]) / cell))));
	return (i[2] * dims[1] + i[1]) * dims[0] + i[0];
}

/** Reads the fixed header (the first 64 bytes); throws on bytes that are not a version-1 tiles object. */
export function readTilesHeader(bytes: Uint8Array): TilesHeader {
	if (bytes.length < TILES_HEADER_BYTES) throw new Error('the points object is shorter than its header');
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	if (view.getUint32(0, true) !== TILES_MAGIC || view.getUint32(4, true) !== 1) throw new Error('the points object is not version-1 LWPT');
	return {
		origin: [view.getFloat64(8, true), view.getFloat64(16, true), view.getFloat64(24, true)],
		cell: view.getFloat64(32, true),
		dims: [view.getUint32(40, true), view.getUint32(44, true), view.getUint32(48, true)],
		cells: view.getUint32(52, true),
		points: view.getUint32(56, true)
	};
}

/** The index of the non-empty cells, from the header and the index's bytes (8 per cell). */
export function readTilesIndex(header: TilesHeader, indexBytes: Uint8Array): TilesIndex {
	const view = new DataView(indexBytes.buffer, indexBytes.byteOffset, indexBytes.byteLength);
	const cellIds = new Uint32Array(header.cells);
	const firstPoint = new Uint32Array(header.cells + 1);
	for (let i = 0; i < header.cells; i++) {
		cellIds[i] = view.getUint32(8 * i, true);
		firstPoint[i] = view.getUint32(8 * i + 4, true);
	}
	firstPoint[header.cells] = header.points;
	return { ...header, cellIds, firstPoint };
}

/** Byte offset of the points section. */
export const pointsOffset = (h: TilesHeader) => TILES_HEADER_BYTES + 8 * h.cells;

/**
 * The byte ranges (start inclusive, end exclusive) holding every point of the cells that meet the ball of `radius`
 * around `at`: runs of cells along x are contiguous; runs closer than `mergeGap` bytes are read as one.
 */
export function rangesWithin(index: TilesIndex, at: ArrayLike<number>, radius: number, mergeGap = 256 * 1024): [number, number][] {
	const { origin, cell, dims } = index;
	const lo = [0, 1, 2].map((k) => Math.max(0, Math.floor((at[k] - radius - origin[k]) / cell)));
	const hi = [0, 1, 2].map((k) => Math.min(dims[k] - 1, Math.floor((at[k] + radius - origin[k]) / cell)));
	const base = pointsOffset(index);
	const runs: [number, number][] = [];
	for (let iz = lo[2]; iz <= hi[2]; iz++)
		for (let iy = lo[1]; iy <= hi[1]; iy++) {
			const row = (iz * dims[1] + iy) * dims[0];
			const a = lowerBound(index.cellIds, row + lo[0]);
			const b = lowerBound(index.cellIds, row + hi[0] + 1);
			if (a < b) runs.push([base + 12 * index.firstPoint[a], base + 12 * index.firstPoint[b]]);
		}
	runs.sort((p, q) => p[0] - q[0]);
	const merged: [number, number][] = [];
	for (const r of runs) {
		const last = merged[merged.length - 1];
		if (last && r[0] - last[1] <= mergeGap) last[1] = Math.max(last[1], r[1]);
		else merged.push([r[0], r[1]]);
	}
	return merged;
}

function lowerBound(sorted: Uint32Array, value: number): number {
	let lo = 0;
	let hi = sorted.length;
	while (lo < hi) {
		const mid = (lo + hi) >> 1;
		if (sorted[mid] < value) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

/** The points of `chunks` (raw f32 triples) within `radius` of `at`, appended to `out` (a plain array of numbers). */
export function pointsWithin(chunk: Uint8Array, at: ArrayLike<number>, radius: number, out: number[]): void {
	const view = new DataView(chunk.buffer, chunk.byteOffset, chunk.byteLength);
	const r2 = radius * radius;
	for (let o = 0; o + 12 <= chunk.length; o += 12) {
		const x = view.getFloat32(o, true), y = view.getFloat32(o + 4, true), z = view.getFloat32(o + 8, true);
		const dx = x - at[0], dy = y - at[1], dz = z - at[2];
		if (dx * dx + dy * dy + dz * dz <= r2) out.push(x, y, z);
	}
}
