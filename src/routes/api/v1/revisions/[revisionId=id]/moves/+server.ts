import { json } from '@sveltejs/kit';
import { movesInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { applyMoves, fixNote } from '$lib/server/analysis/run';
import { endpoint, parseBody, parseWith } from '$lib/server/api';
import { saveRevision } from '$lib/server/corners/revisions';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Saves the revision with some coordinates moved (a fix search's proposal) as a new revision, its parent this one.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision, corner, car } = await requireRevision(event, event.params.revisionId, 'edit');
	const input = await parseBody(event, movesInput);
	const moved = parseWith(cornerGeometrySchema, applyMoves(parseWith(cornerGeometrySchema, revision.geometry), input.moves));
	const { revision: saved, supersededBy } = await saveRevision({
		car,
		corner,
		userId: event.locals.user!.id,
		geometry: moved,
		label: input.label,
		note: fixNote(input.moves, input.note),
		parentId: revision.id,
		source: 'fix'
	});
	return json({ id: saved.id, number: saved.number, note: saved.note, supersededBy }, { status: 201 });
});
