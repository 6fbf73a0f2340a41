import { db } from '$lib/server/db';
import { listCars } from '$lib/server/db/queries/cars';
import { can, requireTeam, requireUser } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	if (!event.locals.team) return { cars: [], canEdit: false };
	const team = requireTeam(event, 'view');
	return { cars: await listCars(db, team.id), canEdit: can(team.role, 'edit') };
};
