import { fail, redirect } from '@sveltejs/kit';
import { carInput } from '$lib/schemas/car';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { updateCar } from '$lib/server/db/queries/cars';
import { parseForm } from '$lib/server/forms';
import { requireCar } from '$lib/server/permissions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { car } = await requireCar(event, event.params.carId, 'edit');
	return { car };
};

export const actions: Actions = {
	default: async (event) => {
		const { car } = await requireCar(event, event.params.carId, 'edit');
		const parsed = parseForm(await event.request.formData(), carInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors, values: parsed.values });
		await updateCar(db, car.id, parsed.data);
		await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'car.updated', subjectType: 'car', subjectId: car.id });
		redirect(303, `/cars/${car.id}`);
	}
};
