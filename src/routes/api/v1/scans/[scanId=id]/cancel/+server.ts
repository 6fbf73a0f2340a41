// Cancels a scan's upload: the multipart upload is aborted (its parts dropped) and the row removed (edit).
import { endpoint } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { cancelScan } from '$lib/server/scans/scans';
import type { RequestEvent } from './$types';

export const POST = endpoint<RequestEvent>(async (event) => {
	const { scan } = await requireScan(event, event.params.scanId, 'edit');
	await cancelScan(scan);
	return new Response(null, { status: 204 });
});
