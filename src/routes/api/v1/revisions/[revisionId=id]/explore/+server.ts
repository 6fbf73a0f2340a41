import { json } from '@sveltejs/kit';
import { exploreInput } from '$lib/schemas/explore';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { carPackaging, explorationView, startExploration } from '$lib/server/analysis/explore';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Starts a design-space exploration of this revision: checked, stored and queued (engineers and owners).
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision, corner } = await requireRevision(event, event.params.revisionId, 'edit');
	const input = await parseBody(event, exploreInput);
	const geometry = parseWith(cornerGeometrySchema, revision.geometry);
	const row = await startExploration(geometry, { cornerId: corner.id, revisionId: revision.id, userId: event.locals.user!.id }, input, await carPackaging(corner.carId, corner.position));
	return json(await explorationView(row), { status: 201 });
});
