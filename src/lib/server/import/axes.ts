// Frame: converts a source frame's axes to ISO 8855 vehicle axes, x forward, y left, z up (mm).
// SAE J670 vehicle axes are x forward, y right, z down; ISO 8855 x forward, y left, z up.

import type { AxesOption, AxisMap } from '../../schemas/import';
import type { Affine, Vec3 } from './vec';

/** SAE J670 → ISO 8855: x kept, y and z negated (both standards' axis definitions). */
export const SAE_J670: AxisMap = { x: '+x', y: '-y', z: '-z' };
export const ISO_8855: AxisMap = { x: '+x', y: '+y', z: '+z' };

/** The axis map of an axes option. */
export function axisMap(axes: AxesOption): AxisMap {
	if (axes === 'iso8855') return ISO_8855;
	if (axes === 'sae_j670') return SAE_J670;
	return axes;
}

/** Row of the 3×3 matrix for one signed source axis, e.g. '-y' → [0, −1, 0]. */
function row(a: AxisMap['x']): Vec3 {
	const r: Vec3 = [0, 0, 0];
	r['xyz'.indexOf(a[1])] = a[0] === '-' ? -1 : 1;
	return r;
}

/** The linear map source → ISO as an Affine (t = 0); a proper rotation or a reflection. */
export function axesTransform(axes: AxesOption): Affine {
	const m = axisMap(axes);
	return { R: [row(m.x), row(m.y), row(m.z)], t: [0, 0, 0] };
}

/** A source point (mm) in ISO 8855 axes. */
export function toIso(p: Vec3, axes: AxesOption): Vec3 {
	const m = axisMap(axes);
	const pick = (a: AxisMap['x']) => (a[0] === '-' ? -1 : 1) * p['xyz'.indexOf(a[1])];
	return [pick(m.x), pick(m.y), pick(m.z)];
}

/** True when the source axes are left-handed (the map has determinant −1), which deserves a warning. */
export function isReflection(axes: AxesOption): boolean {
	const [a, b, c] = axesTransform(axes).R;
	const det = a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);
	return det < 0;
}
