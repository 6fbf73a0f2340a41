import { can, requireCar } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { car, role } = await requireCar(event, event.params.carId, 'view');
	return { car, canEdit: can(role, 'edit') };
};
