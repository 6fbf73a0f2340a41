import { json } from '@sveltejs/kit';
import { cornerInput, POSITION_LABELS } from '$lib/schemas/corner';
import { endpoint, invalid, parseBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { cornersOfCar, createCorner } from '$lib/server/db/queries/corners';
import { requireCar } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'view');
	return json({ corners: await cornersOfCar(db, car.id) });
});

export const POST = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'edit');
	const input = await parseBody(event, cornerInput);
	const corner = await createCorner(db, car.id, input.position, input.kind);
	if (!corner) invalid('position', `this car already has a ${POSITION_LABELS[input.position].toLowerCase()} corner`, 'conflict');
	await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'corner.created', subjectType: 'corner', subjectId: corner.id, detail: { position: corner.position } });
	return json(corner, { status: 201 });
});
