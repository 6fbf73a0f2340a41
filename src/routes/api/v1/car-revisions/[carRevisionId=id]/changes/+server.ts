import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { endpoint, invalid, parseQuery } from '$lib/server/api';
import { changesBetween } from '$lib/server/cars/compare';
import { requireCarRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

const query = z.object({ vs: z.uuid({ error: 'must be the id of another revision of the same car' }).optional() });

// What changed from revision `vs` (default: the one it was saved over) to this one: mass items (Δx, Δy, Δz, Δmass),
// the corner revisions pinned, axle settings. A first revision compared with nothing has no changes (vs null).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { carRevision: now } = await requireCarRevision(event, event.params.carRevisionId, 'view');
	const { vs = now.parentId } = parseQuery(event, query);
	if (!vs) return json({ id: now.id, number: now.number, vs: null, changes: [] });
	const { carRevision: was } = await requireCarRevision(event, vs, 'view');
	if (was.carId !== now.carId) invalid('vs', 'must be a revision of the same car');
	return json({ id: now.id, number: now.number, vs: { id: was.id, number: was.number }, changes: await changesBetween(was, now) });
});
