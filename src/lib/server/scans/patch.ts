// The full-resolution points of a scan near a pick, for the fits: a few byte-range reads of the scan's binned points
// object (src/lib/mesh/tiles.ts) instead of the whole original. The object's header and cell index are kept per
// process for the most recently used scans.
import type { Scan } from '$lib/server/db/schema';
import { pointsWithin, rangesWithin, readTilesHeader, readTilesIndex, TILES_HEADER_BYTES, TILES_PER_SIDE, type TilesIndex } from '$lib/mesh/tiles';
import { invalid } from '$lib/server/api';
import { getObjectRange } from './storage';
import { tilesKeyOf } from './process';

/** Points one patch answers at most; a denser patch is thinned evenly (a fit needs far fewer). */
export const MAX_PATCH_POINTS = 400_000;
/** Range reads in flight at once for one patch. */
const PARALLEL_READS = 6;
const CACHED = 8;
const indexes = new Map<string, TilesIndex>();

async function indexOf(scan: Scan): Promise<TilesIndex | null> {
	const hit = indexes.get(scan.id);
	if (hit) {
		indexes.delete(scan.id);
		indexes.set(scan.id, hit);
		return hit;
	}
	const key = tilesKeyOf(scan);
	const head = await getObjectRange(key, 0, TILES_HEADER_BYTES);
	if (!head) return null;
	const header = readTilesHeader(head);
	const bytes = header.cells > 0 ? await getObjectRange(key, TILES_HEADER_BYTES, TILES_HEADER_BYTES + 8 * header.cells) : new Uint8Array(0);
	if (!bytes) return null;
	const index = readTilesIndex(header, bytes);
	indexes.set(scan.id, index);
	if (indexes.size > CACHED) indexes.delete(indexes.keys().next().value!);
	return index;
}

/** Forgets a deleted scan's index. */
export function forgetPatchIndex(scanId: string) {
	indexes.delete(scanId);
}

export interface Patch {
	/** x, y, z per point, file coordinates and unit */
	points: Float32Array;
	/** points within the ball before any thinning */
	within: number;
	/** every how many points one was kept (1: all) */
	stride: number;
}

/**
 * The scan's points within `radius` of `at` (file coordinates and unit), or null for a scan processed before the
 * points were binned (the page then fits on the preview). Refuses a ball wider than a quarter of the scan.
 */
export async function readPatch(scan: Scan, at: [number, number, number], radius: number): Promise<Patch | null> {
	const index = await indexOf(scan);
	if (!index) return null;
	const widest = (index.cell * TILES_PER_SIDE) / 4;
	if (radius > widest) invalid('r', `must be at most ${widest.toPrecision(3)} (a quarter of the scan's longest side, in the file's unit)`);
	const ranges = rangesWithin(index, at, radius);
	const found: number[] = [];
	const key = tilesKeyOf(scan);
	for (let i = 0; i < ranges.length; i += PARALLEL_READS) {
		const chunks = await Promise.all(ranges.slice(i, i + PARALLEL_READS).map(([a, b]) => getObjectRange(key, a, b)));
		for (const c of chunks) if (c) pointsWithin(c, at, radius, found);
	}
	const within = found.length / 3;
	const stride = Math.max(1, Math.ceil(within / MAX_PATCH_POINTS));
	const kept = Math.ceil(within / stride);
	const points = new Float32Array(3 * kept);
	for (let i = 0, j = 0; i < within; i += stride, j++) {
		points[3 * j] = found[3 * i];
		points[3 * j + 1] = found[3 * i + 1];
		points[3 * j + 2] = found[3 * i + 2];
	}
	return { points, within, stride };
}
