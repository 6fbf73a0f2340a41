import { can, requireCar } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

// Ride height and rake of the whole car.
export const load: PageServerLoad = async (event) => {
	const { car, role } = await requireCar(event, event.params.carId, 'view');
	return { car: { id: car.id, name: car.name, wheelbaseMm: car.wheelbaseMm }, canEdit: can(role, 'edit') };
};
