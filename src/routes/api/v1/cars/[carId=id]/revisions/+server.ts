import { json } from '@sveltejs/kit';
import { carRevisionInput } from '$lib/schemas/car-model';
import { endpoint, parseBody } from '$lib/server/api';
import { saveCarRevision } from '$lib/server/cars/model';
import { db } from '$lib/server/db';
import { carRevisionOfCar, carRevisionsOfCar } from '$lib/server/db/queries/car-revisions';
import { requireCar } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// A car's revisions (newest first) and saving a new one: { label, note, model: car-model/1, corners?: { position: revisionId } }.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'view');
	return json({ revisions: await carRevisionsOfCar(db, car.id) });
});

export const POST = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'edit');
	const body = await parseBody(event, carRevisionInput);
	const parent = await carRevisionOfCar(db, car.id, null);
	const { revision, figures } = await saveCarRevision(car, event.locals.user!.id, body, parent?.id ?? null);
	return json({ id: revision.id, number: revision.number, corners: revision.cornerRevisions, figures }, { status: 201 });
});
