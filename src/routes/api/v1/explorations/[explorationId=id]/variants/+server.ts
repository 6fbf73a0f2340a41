import { json } from '@sveltejs/kit';
import { variantsQuery } from '$lib/schemas/explore';
import { movesOf } from '$lib/server/analysis/explore';
import { endpoint, invalid, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { variantsPage } from '$lib/server/db/queries/explorations';
import { requireExploration } from '$lib/server/permissions';
import type { ExploreSpec } from '$lib/server/studies/explore';
import type { RequestEvent } from './$types';

// One page of an exploration's variants, sorted and filtered in the database, each with its moves.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	const q = parseQuery(event, variantsQuery);
	if ((q.min !== undefined || q.max !== undefined) && !q.filter) invalid('filter', 'name the measure that min/max apply to');
	if (q.min !== undefined && q.max !== undefined && q.min > q.max) invalid('max', 'must be ≥ min');
	const page = await variantsPage(db, exploration.id, {
		sort: q.sort,
		dir: q.dir,
		offset: q.offset,
		limit: q.limit,
		okOnly: q.ok === 'assembles',
		filters: q.filter ? [{ column: q.filter, min: q.min, max: q.max }] : []
	});
	const spec = exploration.spec as unknown as ExploreSpec;
	return json({ total: page.total, offset: q.offset, rows: page.rows.map((r) => ({ ...r, moves: movesOf(spec, r.idx) })) });
});
