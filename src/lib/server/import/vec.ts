// Frame: any right-handed Cartesian frame; lengths in mm.
// The import's rigid and reflected maps, on the tuple helpers of $lib/vec (plain numbers; the import is not a hot loop).

import { add, dot, type Vec3 } from '../../vec';

export { add, cross, dist, dot, norm, scale, sub, type Vec3 } from '../../vec';

/** A rigid or reflected map p ↦ R p + t; R row-major 3×3. */
export interface Affine {
	R: [Vec3, Vec3, Vec3];
	t: Vec3;
}

export const IDENTITY: Affine = { R: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], t: [0, 0, 0] };

/** Apply map m to point p (mm). */
export function apply(m: Affine, p: Vec3): Vec3 {
	return add([dot(m.R[0], p), dot(m.R[1], p), dot(m.R[2], p)], m.t);
}

/** The map "first a, then b" (b ∘ a). */
export function compose(b: Affine, a: Affine): Affine {
	const col = (j: number): Vec3 => [a.R[0][j], a.R[1][j], a.R[2][j]];
	const R = b.R.map((row) => [dot(row, col(0)), dot(row, col(1)), dot(row, col(2))]) as Affine['R'];
	return { R, t: apply(b, a.t) };
}
