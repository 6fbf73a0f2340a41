// Completes a scan's multipart upload from its parts' ETags and starts processing (edit).
import { json } from '@sveltejs/kit';
import { completeScanSchema } from '$lib/schemas/scan';
import { endpoint, parseBody } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { completeScan } from '$lib/server/scans/scans';
import type { RequestEvent } from './$types';

export const POST = endpoint<RequestEvent>(async (event) => {
	const { scan } = await requireScan(event, event.params.scanId, 'edit');
	const body = await parseBody(event, completeScanSchema);
	return json(await completeScan(scan, body.parts), { status: 202 });
});
