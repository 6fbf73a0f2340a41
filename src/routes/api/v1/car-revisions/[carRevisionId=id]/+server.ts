import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { figuresOrInvalid, loadCarRevision } from '$lib/server/cars/model';
import { requireCarRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// One car revision: its model, the corner revisions it pins and the car's figures (CG, corner weights, rates, load transfer).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { carRevision: r } = await requireCarRevision(event, event.params.carRevisionId, 'view');
	const { model, corners } = await loadCarRevision(r);
	return json({ id: r.id, carId: r.carId, number: r.number, label: r.label, note: r.note, createdAt: r.createdAt, model, corners: r.cornerRevisions, figures: figuresOrInvalid(model, corners) });
});
