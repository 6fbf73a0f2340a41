import { json } from '@sveltejs/kit';
import { carRideHeightInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { carRideHeight } from '$lib/server/cars/ride-height';
import { saveRevisionsTogether } from '$lib/server/corners/revisions';
import { db } from '$lib/server/db';
import { cornerForUser } from '$lib/server/db/queries/corners';
import { requireCar } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

const words = (mm: number) => (mm === 0 ? 'unchanged' : mm < 0 ? `lowered ${-mm} mm` : `raised ${mm} mm`);

// Ride height and rake of the car: { front, rear (mm, − = lower), save?, note? } → each corner's figures at design
// before and after and the rake; with save (edit), one new revision per corner, all in one transaction (201).
export const POST = endpoint<RequestEvent>(async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'view');
	const input = await parseBody(event, carRideHeightInput);
	if (input.save) await requireCar(event, car.id, 'edit');
	const result = await carRideHeight(car, input.front, input.rear);
	const answer = { ...result, corners: result.corners.map(({ geometry: _g, ...c }) => c) };
	if (!input.save) return json(answer);
	const userId = event.locals.user!.id;
	const label = `ride height front ${input.front > 0 ? '+' : input.front < 0 ? '−' : '±'}${Math.abs(input.front)}, rear ${input.rear > 0 ? '+' : input.rear < 0 ? '−' : '±'}${Math.abs(input.rear)} mm`;
	const inputs = await Promise.all(
		result.corners
			.filter((c) => c.change !== 0)
			.map(async (c) => ({
				car,
				corner: (await cornerForUser(db, userId, c.corner.id))!.corner,
				userId,
				geometry: parseWith(cornerGeometrySchema, c.geometry),
				label,
				note: `Car ${input.front === input.rear ? words(input.front) : `front ${words(input.front)}, rear ${words(input.rear)}`}: this corner solved at ${-c.change} mm of wheel travel, then moved with the ground.${input.note ? ` ${input.note}` : ''}`,
				parentId: c.revision.id,
				source: 'api' as const
			}))
	);
	const saved = await saveRevisionsTogether(inputs);
	return json({ ...answer, saved: saved.map((s) => ({ cornerId: s.corner.id, position: s.corner.position, id: s.revision.id, number: s.revision.number })) }, { status: 201 });
});
