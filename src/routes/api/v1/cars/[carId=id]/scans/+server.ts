// A car's scans: list (view), start an upload (edit): the row, the multipart upload and presigned part URLs.
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { newScanSchema } from '$lib/schemas/scan';
import { endpoint, parseBody, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { scansOfCar } from '$lib/server/db/queries/scans';
import { requireCar } from '$lib/server/permissions';
import { sweepScans } from '$lib/server/scans/process';
import { createScan, scanView } from '$lib/server/scans/scans';
import type { RequestEvent } from './$types';

const listQuery = z.object({ cornerId: z.string().uuid('must be a corner id').optional() });

export const GET = endpoint<RequestEvent>(async (event) => {
	const car = await requireCar(event, event.params.carId, 'view');
	const { cornerId } = parseQuery(event, listQuery);
	await sweepScans();
	return json({ scans: (await scansOfCar(db, car.car.id, cornerId)).map(scanView) });
});

export const POST = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'edit');
	const body = await parseBody(event, newScanSchema);
	return json(await createScan(car, event.locals.user!.id, body), { status: 201 });
});
