import { json } from '@sveltejs/kit';
import { rideHeightInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { saveRevision } from '$lib/server/corners/revisions';
import { rideHeightChange } from '$lib/server/analysis/ride-height';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// A ride-height change as a new design position: { change (mm, − = lower), save?, label?, note? } → the figures at
// design before and after (and the new corner file); with save, a new revision whose parent is this one (201).
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision, corner, car } = await requireRevision(event, event.params.revisionId, 'view');
	const input = await parseBody(event, rideHeightInput);
	if (input.save) await requireRevision(event, revision.id, 'edit');
	const result = rideHeightChange(parseWith(cornerGeometrySchema, revision.geometry), input.change);
	if (!input.save) return json(result);
	const geometry = parseWith(cornerGeometrySchema, result.geometry);
	const word = input.change < 0 ? `lowered ${-input.change}` : `raised ${input.change}`;
	const { revision: saved, supersededBy } = await saveRevision({
		car,
		corner,
		userId: event.locals.user!.id,
		geometry,
		label: input.label ?? `ride height ${input.change > 0 ? '+' : '−'}${Math.abs(input.change)} mm`,
		note: `Body ${word} mm: every point solved at ${-input.change} mm of wheel travel, then moved with the ground.${input.note ? ` ${input.note}` : ''}`,
		parentId: revision.id,
		source: 'api'
	});
	return json({ ...result, id: saved.id, number: saved.number, supersededBy }, { status: 201 });
});
