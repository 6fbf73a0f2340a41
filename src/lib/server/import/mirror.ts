// Frame: ISO 8855 vehicle axes, x forward, y left, z up; y = 0 the centreline; lengths in mm.
// Mirror across the centreline (y → −y) and the left/right symmetry report.

import { dist, sub, type Affine, type Vec3 } from './vec';

/** The reflection y → −y as a map. */
export const MIRROR_Y: Affine = { R: [[1, 0, 0], [0, -1, 0], [0, 0, 1]], t: [0, 0, 0] };

/** A point mirrored to the other side (mm). */
export function mirrorPoint(p: Vec3): Vec3 {
	return [p[0], -p[1], p[2]];
}

/** One point measured on both sides: |left − mirrored right| and its components (mm). */
export interface SymmetryPair {
	name: string;
	differenceMm: number;
	deltaMm: Vec3;
}

/** Symmetry report: pairs compared, the threshold, and the pairs beyond it, largest first. */
export interface SymmetryReport {
	thresholdMm: number;
	compared: number;
	maxMm: number;
	beyond: SymmetryPair[];
}

/** Compare left points with mirrored right points of the same names (vehicle frame, mm); threshold in mm. */
export function symmetryReport(left: Record<string, Vec3>, right: Record<string, Vec3>, thresholdMm: number): SymmetryReport {
	const pairs: SymmetryPair[] = Object.keys(left)
		.filter((n) => right[n])
		.map((name) => {
			const m = mirrorPoint(right[name]);
			return { name, differenceMm: dist(left[name], m), deltaMm: sub(left[name], m) };
		})
		.sort((a, b) => b.differenceMm - a.differenceMm);
	return {
		thresholdMm,
		compared: pairs.length,
		maxMm: pairs.length ? pairs[0].differenceMm : 0,
		beyond: pairs.filter((p) => p.differenceMm > thresholdMm)
	};
}
