import { json } from '@sveltejs/kit';
import { matrixQuery } from '$lib/schemas/explore';
import { endpoint, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { variantSample } from '$lib/server/db/queries/explorations';
import { requireExploration } from '$lib/server/permissions';
import { measuresOf, type ExploreSpec } from '$lib/server/studies/explore';
import type { RequestEvent } from './$types';

// The scatter-plot matrix's data: the chosen measures of an even sample of the variants that assemble.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	const q = parseQuery(event, matrixQuery);
	const measures = measuresOf(exploration.spec as unknown as ExploreSpec);
	const { total, rows } = await variantSample(db, exploration.id, measures, q.sample);
	return json({ measures, total, rows });
});
