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
export function pointsCsv(geometry: { kind?: string; points: Record<string, [number, number, number]>; rocker?: object | null }) {
	const all = joinRocker(geometry.points, geometry.rocker) as Record<string, [number, number, number]>;
	const known = geometry.kind && (CORNER_KINDS as readonly string[]).includes(geometry.kind) ? tablePoints(geometry.kind, !!geometry.rocker).map((p) => p.name).filter((n) => all[n]) : [];
	const order = [...known, ...Object.keys(all).filter((n) => !known.includes(n))];
	return toCsv([['point', 'x_mm', 'y_mm', 'z_mm'], ...order.map((name) => [name, ...all[name]])]);
}

/** A file name made of safe characters. */
export function fileName(...parts: (string | number)[]) {
	return parts.join('-').toLowerCase().replace(/[^a-z0-9.-]+/g, '-').replace(/-+/g, '-');
}
