import { json } from '@sveltejs/kit';
import { jointAnglesInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { jointAnglesOf } from '$lib/server/analysis/joint-angles';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Joint misalignment through heave, roll and steer: { heave?, roll?, steer? (ranges), sweeps?, joints? (settings tried
// over the corner's saved ones) } → per ball joint and rod end its angle per sweep position, largest, limit, pass.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision, corner } = await requireRevision(event, event.params.revisionId, 'view');
	const input = await parseBody(event, jointAnglesInput);
	return json(jointAnglesOf(parseWith(cornerGeometrySchema, revision.geometry), corner.jointSettings ?? {}, input));
});
