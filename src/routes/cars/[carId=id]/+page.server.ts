import { fail, redirect } from '@sveltejs/kit';
import { cornerInput } from '$lib/schemas/corner';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { cornersOfCar, createCorner } from '$lib/server/db/queries/corners';
import { parseForm } from '$lib/server/forms';
import { can, requireCar } from '$lib/server/permissions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { car, role } = await requireCar(event, event.params.carId, 'view');
	return { car, corners: await cornersOfCar(db, car.id), canEdit: can(role, 'edit') };
};

export const actions: Actions = {
	addCorner: async (event) => {
		const { car } = await requireCar(event, event.params.carId, 'edit');
		const parsed = parseForm(await event.request.formData(), cornerInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors });
		const corner = await createCorner(db, car.id, parsed.data.position, parsed.data.kind);
		if (!corner) return fail(400, { errors: { position: 'This car already has that corner.' } });
		await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'corner.created', subjectType: 'corner', subjectId: corner.id, detail: { position: corner.position } });
		redirect(303, `/corners/${corner.id}`);
	}
};
