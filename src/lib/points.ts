// Plain-language descriptions of the pickup points, for the point table, the diagram and the shop sheet.
// The descriptions themselves live with each kind (src/lib/kinds); this is the view the pages use.
import { CORNER_KINDS, tablePoints, type CornerKind } from './kinds';

export type Kind = CornerKind;
export { CORNER_KINDS };

export interface PointInfo {
	name: string;
	label: string;
	description: string;
	/** where the point sits in the small front-view diagram (0–100 on each axis) */
	diagram: [number, number];
}

/** The point rows of a kind: required points first, then the optional spring ends, then the rocker's when it has one. */
export function pointsOfKind(kind: Kind, rocker = false): PointInfo[] {
	return tablePoints(kind, rocker).map(({ name, label, description, diagram }) => ({ name, label, description, diagram }));
}
