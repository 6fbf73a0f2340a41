import { alignmentReference, rememberedImport } from '$lib/server/corners/import';
import { requireCorner } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const reference = await alignmentReference(corner);
	return {
		car: { id: car.id, name: car.name },
		corner,
		reference: reference
			? { id: reference.id, number: reference.number, label: reference.label, points: (reference.geometry as { points: Record<string, [number, number, number]> }).points, isBaseline: reference.id === corner.baselineRevisionId }
			: null,
		memory: await rememberedImport(car.teamId)
	};
};
