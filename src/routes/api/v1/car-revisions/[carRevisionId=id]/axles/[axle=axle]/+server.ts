import { json } from '@sveltejs/kit';
import { axleSweepQuery } from '$lib/schemas/axle';
import { endpoint, parseQuery } from '$lib/server/api';
import { axleSweep, loadCarRevision } from '$lib/server/cars/model';
import { requireCarRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// axle-solve/1 of one axle of a car revision: ?sweep=heave|roll|steer&from&to&step (steer by steering-wheel degrees), &steering_wheel held in heave/roll.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { carRevision: r, car } = await requireCarRevision(event, event.params.carRevisionId, 'view');
	const options = parseQuery(event, axleSweepQuery);
	const { model, corners } = await loadCarRevision(r);
	return json(axleSweep(car, model, corners, event.params.axle as 'front' | 'rear', options));
});
