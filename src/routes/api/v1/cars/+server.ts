import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { carInput } from '$lib/schemas/car';
import { endpoint, parseBody, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { createCar, listCars } from '$lib/server/db/queries/cars';
import { requireTeam, requireUser } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

const teamQuery = z.object({ team: z.string().uuid('team must be a team id').optional() });

export const GET = endpoint<RequestEvent>(async (event) => {
	requireUser(event);
	const { team: teamId } = parseQuery(event, teamQuery);
	const team = requireTeam(event, 'view', teamId);
	return json({ team: { id: team.id, name: team.name }, cars: await listCars(db, team.id) });
});

const createBody = carInput.extend({ teamId: z.string().uuid('teamId must be a team id').optional() });

export const POST = endpoint<RequestEvent>(async (event) => {
	const user = requireUser(event);
	const { teamId, ...input } = await parseBody(event, createBody);
	const team = requireTeam(event, 'edit', teamId);
	const car = await createCar(db, team.id, user.id, input);
	await recordAudit(db, { teamId: team.id, actorId: user.id, action: 'car.created', subjectType: 'car', subjectId: car.id });
	return json(car, { status: 201 });
});
