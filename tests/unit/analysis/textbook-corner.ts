// Frame: ISO 8855 vehicle axes, x forward, y left, z up; mm.
// An invented double-wishbone corner for the classical zero-bump-steer construction (Milliken & Milliken,
// *Race Car Vehicle Dynamics*, ch. 17): both arms' pivot axes parallel to x, no caster, and the tie-rod
// outer joint on the steering axis in the front view. The construction: in the front view the tie-rod line
// passes through the instant centre of the two arms, and the inner joint lies on the line through the
// projected inner pivots of the two arms.
import type { CornerInput, PointTuple } from '../../../src/lib/server/kinematics/corner';

type YZ = [number, number];

/** Where the lines a0–a1 and b0–b1 (front view, y–z) meet. */
export function meet(a0: YZ, a1: YZ, b0: YZ, b1: YZ): YZ {
	const d1: YZ = [a1[0] - a0[0], a1[1] - a0[1]];
	const d2: YZ = [b1[0] - b0[0], b1[1] - b0[1]];
	const den = d1[0] * d2[1] - d1[1] * d2[0];
	const t = ((b0[0] - a0[0]) * d2[1] - (b0[1] - a0[1]) * d2[0]) / den;
	return [a0[0] + t * d1[0], a0[1] + t * d1[1]];
}

const LOWER_PIVOT: YZ = [300, 150];
const LOWER_OUTER: YZ = [700, 130];
const UPPER_OUTER: YZ = [660, 450];
const TIE_ROD_X = -120;
const TIE_OUTER_Z = 200;

/**
 * Upper-arm inner pivot (front view) of the two layouts: 'parallel' puts the line of the inner pivots parallel
 * to the steering axis in the front view (the layout the construction's second condition is drawn for);
 * 'skewed' tilts that line by about 14° against it.
 */
export const UPPER_PIVOTS = { parallel: [266.25, 420] as YZ, skewed: [400, 420] as YZ };
export type Layout = keyof typeof UPPER_PIVOTS;

/** The tie-rod outer joint: on the steering axis (lower.outer–upper.outer) in the front view, at z = 200 mm. */
export const TIE_OUTER: YZ = [
	LOWER_OUTER[0] + ((TIE_OUTER_Z - LOWER_OUTER[1]) / (UPPER_OUTER[1] - LOWER_OUTER[1])) * (UPPER_OUTER[0] - LOWER_OUTER[0]),
	TIE_OUTER_Z
];

/** The front-view instant centre of the two arms. */
export function instantCentre(layout: Layout): YZ {
	return meet(LOWER_PIVOT, LOWER_OUTER, UPPER_PIVOTS[layout], UPPER_OUTER);
}

/** The construction's tie-rod inner joint (y, z): tie-rod line through the instant centre ∩ line of the inner pivots. */
export function constructedInner(layout: Layout): YZ {
	return meet(TIE_OUTER, instantCentre(layout), LOWER_PIVOT, UPPER_PIVOTS[layout]);
}

/** Distance (mm) of (y, z) from the front-view line through the tie-rod outer joint and the instant centre. */
export function offTieRodLine(layout: Layout, y: number, z: number): number {
	const ic = instantCentre(layout);
	const d: YZ = [ic[0] - TIE_OUTER[0], ic[1] - TIE_OUTER[1]];
	return Math.abs((y - TIE_OUTER[0]) * d[1] - (z - TIE_OUTER[1]) * d[0]) / Math.hypot(d[0], d[1]);
}

/** The corner of `layout` with its tie-rod inner joint moved off the construction by (dy, dz) mm. */
export function textbookCorner(layout: Layout, dy: number, dz: number): CornerInput {
	const at = (x: number, yz: YZ): PointTuple => [x, yz[0], yz[1]];
	const inner = constructedInner(layout);
	return {
		kind: 'double_wishbone',
		name: 'Textbook corner (invented)',
		points: {
			'lower.front': at(150, LOWER_PIVOT),
			'lower.rear': at(-150, LOWER_PIVOT),
			'lower.outer': at(0, LOWER_OUTER),
			'upper.front': at(120, UPPER_PIVOTS[layout]),
			'upper.rear': at(-120, UPPER_PIVOTS[layout]),
			'upper.outer': at(0, UPPER_OUTER),
			'steer.inner': [TIE_ROD_X, inner[0] + dy, inner[1] + dz],
			'steer.outer': at(TIE_ROD_X, TIE_OUTER),
			'wheel.centre': [0, 760, 290],
			'wheel.axis_inner': [0, 660, 290]
		},
		tyre: { loaded_radius: 290 }
	};
}
