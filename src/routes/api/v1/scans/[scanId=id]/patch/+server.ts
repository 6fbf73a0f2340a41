// The scan's full-resolution points within a ball around a pick (view), for the fits: float32 x, y, z per point,
// little-endian, in the scan file's coordinates and unit. 404 `no_points` for a scan processed before the points were
// binned (the page then fits on the preview's points).
import { error } from '@sveltejs/kit';
import { endpoint, parseQuery } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { readPatch } from '$lib/server/scans/patch';
import { patchQuerySchema } from '$lib/schemas/scan';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { scan } = await requireScan(event, event.params.scanId, 'view');
	const q = parseQuery(event, patchQuerySchema);
	if (scan.status !== 'ready') error(409, { message: `status: the scan is ${scan.status}; its points come once it is ready`, code: 'conflict', field: 'status' });
	const patch = await readPatch(scan, [q.x, q.y, q.z], q.r);
	if (!patch) error(404, { message: 'This scan was processed before full-resolution points were kept; fits use its preview', code: 'no_points' });
	return new Response(new Uint8Array(patch.points.buffer as ArrayBuffer, patch.points.byteOffset, patch.points.byteLength), {
		headers: {
			'content-type': 'application/octet-stream',
			'content-length': String(patch.points.byteLength),
			'x-lw-points-within': String(patch.within),
			'x-lw-stride': String(patch.stride),
			'cache-control': 'private, max-age=3600'
		}
	});
});
