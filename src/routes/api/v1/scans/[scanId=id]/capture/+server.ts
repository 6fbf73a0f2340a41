// Saves a new revision of the scan's corner with points captured on the scan, each with its source (edit).
import { json } from '@sveltejs/kit';
import { captureSchema } from '$lib/schemas/scan';
import { endpoint, parseBody } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { captureScan } from '$lib/server/scans/scans';
import type { RequestEvent } from './$types';

export const POST = endpoint<RequestEvent>(async (event) => {
	const { scan, car } = await requireScan(event, event.params.scanId, 'edit');
	const body = await parseBody(event, captureSchema);
	return json(await captureScan(scan, car, event.locals.user!.id, body), { status: 201 });
});
