import { json } from '@sveltejs/kit';
import { carPatch } from '$lib/schemas/car';
import { endpoint, parseBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { updateCar } from '$lib/server/db/queries/cars';
import { requireCar } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'view');
	return json(car);
});

export const PATCH = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'edit');
	const patch = await parseBody(event, carPatch);
	const updated = await updateCar(db, car.id, patch);
	await recordAudit(db, {
		teamId: car.teamId,
		actorId: event.locals.user!.id,
		action: 'car.updated',
		subjectType: 'car',
		subjectId: car.id,
		detail: { fields: Object.keys(patch) }
	});
	return json(updated);
});
