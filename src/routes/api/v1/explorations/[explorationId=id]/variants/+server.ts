import { json } from '@sveltejs/kit';
import { variantsQuery } from '$lib/schemas/explore';
import { movesOf } from '$lib/server/analysis/explore';
import { endpoint, invalid, parseQuery } from '$lib/server/api';
import { db } from '$lib/server/db';
import { variantsPage } from '$lib/server/db/queries/explorations';
import { requireExploration } from '$lib/server/permissions';
import { measuresOf, type ExploreSpec } from '$lib/server/studies/explore';
import type { RequestEvent } from './$types';

// One page of an exploration's variants, sorted and filtered in the database, each with its moves.
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	const q = parseQuery(event, variantsQuery);
	if ((q.min !== undefined || q.max !== undefined) && !q.filter) invalid('filter', 'name the measure that min/max apply to');
	if (q.min !== undefined && q.max !== undefined && q.min > q.max) invalid('max', 'must be ≥ min');
	const spec = exploration.spec as unknown as ExploreSpec;
	const kept = measuresOf(spec);
	if (q.sort !== 'idx' && !kept.includes(q.sort)) invalid('sort', `this exploration did not keep ${q.sort} (it kept ${kept.join(', ')})`);
	if (q.filter && !kept.includes(q.filter)) invalid('filter', `this exploration did not keep ${q.filter} (it kept ${kept.join(', ')})`);
	const page = await variantsPage(db, exploration.id, {
		sort: q.sort,
		dir: q.dir,
		offset: q.offset,
		limit: q.limit,
		ok: q.ok,
		filters: q.filter ? [{ column: q.filter, min: q.min, max: q.max }] : []
	});
	return json({ total: page.total, offset: q.offset, rows: page.rows.map((r) => ({ ...r, moves: movesOf(spec, r.idx) })) });
});
