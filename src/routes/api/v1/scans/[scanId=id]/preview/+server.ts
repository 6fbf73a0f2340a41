// A ready scan's preview (the compact binary form of src/lib/mesh/preview.ts), streamed from the bucket (view).
import { error } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { getObjectStream } from '$lib/server/scans/storage';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { scan } = await requireScan(event, event.params.scanId, 'view');
	if (scan.status !== 'ready' || !scan.previewKey) error(409, { message: `status: the scan is ${scan.status}; its preview comes once it is ready`, code: 'conflict', field: 'status' });
	const object = await getObjectStream(scan.previewKey);
	if (!object) error(404, { message: 'The scan’s preview is missing from object storage', code: 'not_found' });
	return new Response(object.body, {
		headers: { 'content-type': 'application/octet-stream', 'content-length': String(object.size), 'cache-control': 'private, max-age=3600' }
	});
});
