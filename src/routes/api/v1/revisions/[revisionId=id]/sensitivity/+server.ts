import { json } from '@sveltejs/kit';
import { sensitivityInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { runSensitivity } from '$lib/server/analysis/run';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Derivatives of toe and camber change, roll-centre height, caster and KPI with respect to every linkage coordinate.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision } = await requireRevision(event, event.params.revisionId, 'view');
	const { travel } = await parseBody(event, sensitivityInput);
	return json({ revisionId: revision.id, ...runSensitivity(parseWith(cornerGeometrySchema, revision.geometry), travel) });
});
