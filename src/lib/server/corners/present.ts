// How a revision is shown through API v1 and exported.
import { toCsv } from '$lib/csv';
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
		geometry: revision.geometry
	};
}

/** The revision's points as CSV: point, x, y, z in mm, ISO 8855 vehicle axes. */
export function pointsCsv(geometry: { points: Record<string, [number, number, number]> }) {
	return toCsv([['point', 'x_mm', 'y_mm', 'z_mm'], ...Object.entries(geometry.points).map(([name, [x, y, z]]) => [name, x, y, z])]);
}

/** A file name made of safe characters. */
export function fileName(...parts: (string | number)[]) {
	return parts.join('-').toLowerCase().replace(/[^a-z0-9.-]+/g, '-').replace(/-+/g, '-');
}
