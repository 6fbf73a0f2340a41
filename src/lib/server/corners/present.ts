// How a revision is shown through API v1 and exported.
import { toCsv } from '$lib/csv';
import { CORNER_KINDS, joinRocker, tablePoints } from '$lib/kinds';
import { plausibility, type PlausibilityWarning } from '$lib/plausibility';
import { CornerSolver } from '$lib/server/kinematics/index';
import type { CornerInput } from '$lib/server/kinematics/corner';
import type { Corner, Revision } from '$lib/server/db/schema';

/** A revision's metadata and its corner file. */
export function revisionJson(revision: Revision, corner: Corner) {
	return {
		id: revision.id,
		cornerId: revision.cornerId,
		carId: corner.carId,
		position: corner.position,
		number: revision.number,
		label: revision.label,
		note: revision.note,
		kind: revision.kind,
		parentId: revision.parentId,
		authorId: revision.authorId,
		createdAt: revision.createdAt,
		isBaseline: corner.baselineRevisionId === revision.id,
		geometry: revision.geometry,
		warnings: revisionWarnings(revision.geometry)
	};
}

/**
 * The plausibility warnings of a stored corner file (src/lib/plausibility.ts), with the spring's direction from the
 * solved design position; a file that cannot be solved gets the checks that need no solve.
 */
export function revisionWarnings(geometry: unknown): PlausibilityWarning[] {
	const g = geometry as CornerInput & { tyre?: { loaded_radius: number } };
	if (!g || typeof g !== 'object' || !g.points) return [];
	let motionRatio: number | null = null;
	try {
		motionRatio = new CornerSolver(g).sweep({ sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0]?.motion_ratio ?? null;
	} catch {
		motionRatio = null;
	}
	return plausibility(g, motionRatio);
}

/**
 * The revision's points as CSV: point, x, y, z in mm, ISO 8855 vehicle axes, in the point table's order (the kind's
 * points, the spring's, the rocker's), then any other point the file carries.
 */
export function pointsCsv(geometry: { kind?: string; points: Record<string, [number, number, number]>; rocker?: object | null }, unit: 'mm' | 'in' = 'mm') {
	// full precision either way: inches are the stored mm ÷ 25.4, columns named for the unit
	const k = unit === 'in' ? 25.4 : 1;
	return toCsv([['point', `x_${unit}`, `y_${unit}`, `z_${unit}`], ...orderedPoints(geometry).map(([name, p]) => [name, ...p.map((v) => v / k)])]);
}

/** The points in the point table's order (the kind's, the spring's, the rocker's), then any other the file carries. */
function orderedPoints(geometry: { kind?: string; points: Record<string, [number, number, number]>; rocker?: object | null }): [string, [number, number, number]][] {
	const all = joinRocker(geometry.points, geometry.rocker) as Record<string, [number, number, number]>;
	const known = geometry.kind && (CORNER_KINDS as readonly string[]).includes(geometry.kind) ? tablePoints(geometry.kind, !!geometry.rocker).map((p) => p.name).filter((n) => all[n]) : [];
	return [...known, ...Object.keys(all).filter((n) => !known.includes(n))].map((n) => [n, all[n]]);
}

/**
 * The revision's points as a DXF drawing for CAD (AutoCAD DXF Reference, Autodesk: an ENTITIES section of POINT
 * entities, group codes 0 type, 8 layer, 10/20/30 x/y/z; TEXT entities, 1 the text, 40 its height), in mm and vehicle
 * axes. Each point on a layer named after its group (LOWER, UPPER, STEER, WHEEL, SPRING, ROCKER, …) with its name
 * beside it on the layer LABELS, so a designer can switch groups on and off.
 */
export function pointsDxf(geometry: { kind?: string; points: Record<string, [number, number, number]>; rocker?: object | null }) {
	const lines: (string | number)[] = [];
	const add = (...pairs: (string | number)[]) => lines.push(...pairs);
	const layerOf = (name: string) => name.split('.')[0].replace(/[^A-Za-z0-9_]/g, '_').toUpperCase();
	const points = orderedPoints(geometry);
	const layers = [...new Set([...points.map(([n]) => layerOf(n)), 'LABELS'])];
	add(0, 'SECTION', 2, 'HEADER', 9, '$INSUNITS', 70, 4, 0, 'ENDSEC'); // 4 = millimetres
	add(0, 'SECTION', 2, 'TABLES', 0, 'TABLE', 2, 'LAYER', 70, layers.length);
	for (const l of layers) add(0, 'LAYER', 2, l, 70, 0, 62, 7, 6, 'CONTINUOUS');
	add(0, 'ENDTAB', 0, 'ENDSEC', 0, 'SECTION', 2, 'ENTITIES');
	for (const [name, [x, y, z]] of points) {
		add(0, 'POINT', 8, layerOf(name), 10, x, 20, y, 30, z);
		add(0, 'TEXT', 8, 'LABELS', 10, x, 20, y, 30, z, 40, 8, 1, name);
	}
	add(0, 'ENDSEC', 0, 'EOF');
	// DXF is pairs of lines: a group code, then its value
	return lines.map((v) => String(v)).join('\r\n') + '\r\n';
}

/** A file name made of safe characters. */
export function fileName(...parts: (string | number)[]) {
	return parts.join('-').toLowerCase().replace(/[^a-z0-9.-]+/g, '-').replace(/-+/g, '-');
}
