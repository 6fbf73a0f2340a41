import { z } from 'zod';
import { endpoint, parseQuery } from '$lib/server/api';
import { fileName, pointsCsv, pointsDxf } from '$lib/server/corners/present';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

const query = z.object({
	format: z.enum(['geometry', 'csv', 'dxf'], { message: "format must be 'geometry', 'csv' or 'dxf'" }).default('geometry'),
	/** the CSV's length unit (the corner file and the DXF stay in mm, as their formats say) */
	unit: z.enum(['mm', 'in'], { message: "unit must be 'mm' or 'in'" }).default('mm')
});

// Downloads a revision as its corner file (corner-geometry/1, importable unchanged), as CSV, or as DXF points for CAD.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { revision, corner, car } = await requireRevision(event, event.params.revisionId, 'view');
	const { format, unit } = parseQuery(event, query);
	const base = fileName(car.name, corner.position, `r${revision.number}`);
	const geometry = revision.geometry as { kind?: string; points: Record<string, [number, number, number]>; rocker?: object | null };
	const [body, type, ext] =
		format === 'csv'
			? [pointsCsv(geometry, unit), 'text/csv; charset=utf-8', 'csv']
			: format === 'dxf'
				? [pointsDxf(geometry), 'image/vnd.dxf', 'dxf']
				: [JSON.stringify(revision.geometry, null, '\t') + '\n', 'application/json', 'json'];
	return new Response(body, {
		headers: { 'content-type': type, 'content-disposition': `attachment; filename="${base}.${ext}"` }
	});
});
