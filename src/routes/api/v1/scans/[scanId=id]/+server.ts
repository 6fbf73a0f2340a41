// One scan: read it (view), delete it with its objects in the bucket (edit).
import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { sweepScans } from '$lib/server/scans/process';
import { removeScan, scanView } from '$lib/server/scans/scans';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	await sweepScans();
	const { scan } = await requireScan(event, event.params.scanId, 'view');
	return json(scanView(scan));
});

export const DELETE = endpoint<RequestEvent>(async (event) => {
	const { scan, car } = await requireScan(event, event.params.scanId, 'edit');
	await removeScan(scan, car, event.locals.user!.id);
	return new Response(null, { status: 204 });
});
