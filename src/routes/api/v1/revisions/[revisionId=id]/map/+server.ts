import { error, json } from '@sveltejs/kit';
import { kindSpec } from '$lib/kinds';
import { motionMapInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { motionMap } from '$lib/server/kinematics/maps';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Combined motions as a map: { kind: 'heave_steer', heave, steer } or { kind: 'heave_roll', heave, roll, rack? } →
// toe, camber and camber to the ground (degrees) per wheel travel (x) and rack travel or body roll (y); null where the
// corner cannot be assembled.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision } = await requireRevision(event, event.params.revisionId, 'view');
	const input = await parseBody(event, motionMapInput);
	const geometry = parseWith(cornerGeometrySchema, revision.geometry);
	if (input.kind === 'heave_steer') {
		if (!kindSpec(geometry.kind).steers) error(400, { message: 'kind: this corner does not steer; map heave × roll instead', code: 'invalid', field: 'kind' });
		return json(motionMap(geometry, 'heave_steer', input.heave, input.steer));
	}
	return json(motionMap(geometry, 'heave_roll', input.heave, input.roll, input.rack));
});
