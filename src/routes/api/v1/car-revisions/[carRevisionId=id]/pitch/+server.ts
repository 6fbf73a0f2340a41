import { json } from '@sveltejs/kit';
import { pitchSweepQuery } from '$lib/schemas/axle';
import { endpoint, parseQuery } from '$lib/server/api';
import { carPitchSweep, loadCarRevision } from '$lib/server/cars/model';
import { requireCarRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// A pitch sweep of the whole car revision (both axles): ?from&to&step in degrees of body pitch, + = nose down.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { carRevision: r, car } = await requireCarRevision(event, event.params.carRevisionId, 'view');
	const grid = parseQuery(event, pitchSweepQuery);
	const { model, corners } = await loadCarRevision(r);
	return json(carPitchSweep(car, model, corners, grid));
});
