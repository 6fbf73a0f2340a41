// Aligns a scan to vehicle axes (three datum picks or a best fit onto the corner's revision) and sets its unit (edit).
import { json } from '@sveltejs/kit';
import { alignmentSchema } from '$lib/schemas/scan';
import { endpoint, parseBody } from '$lib/server/api';
import { requireScan } from '$lib/server/permissions';
import { alignScan } from '$lib/server/scans/scans';
import type { RequestEvent } from './$types';

export const PUT = endpoint<RequestEvent>(async (event) => {
	const { scan } = await requireScan(event, event.params.scanId, 'edit');
	const body = await parseBody(event, alignmentSchema);
	return json(await alignScan(scan, body));
});
