import { json } from '@sveltejs/kit';
import { sweepQuery } from '$lib/schemas/corner';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { endpoint, parseQuery, parseWith } from '$lib/server/api';
import { solveForApi } from '$lib/server/corners/solve';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// corner-solve/1 of a saved revision: ?sweep=heave&from=-50&to=50&step=5 (defaults as the solve command's).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { revision } = await requireRevision(event, event.params.revisionId, 'view');
	const options = parseQuery(event, sweepQuery);
	const geometry = parseWith(cornerGeometrySchema, revision.geometry);
	return json(solveForApi(geometry, options));
});
