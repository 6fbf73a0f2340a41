import { fail, redirect } from '@sveltejs/kit';
import { carInput } from '$lib/schemas/car';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { createCar } from '$lib/server/db/queries/cars';
import { parseForm } from '$lib/server/forms';
import { requireTeam, requireUser } from '$lib/server/permissions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const team = requireTeam(event, 'edit');
	return { teamName: team.name };
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireUser(event);
		const team = requireTeam(event, 'edit');
		const parsed = parseForm(await event.request.formData(), carInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors, values: parsed.values });
		const car = await createCar(db, team.id, user.id, parsed.data);
		await recordAudit(db, { teamId: team.id, actorId: user.id, action: 'car.created', subjectType: 'car', subjectId: car.id });
		redirect(303, `/cars/${car.id}`);
	}
};
