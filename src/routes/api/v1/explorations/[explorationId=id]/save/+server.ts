import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { saveVariantInput } from '$lib/schemas/explore';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { movesOf } from '$lib/server/analysis/explore';
import { applyMoves } from '$lib/server/analysis/run';
import { endpoint, invalid, parseBody, parseWith } from '$lib/server/api';
import { saveRevision } from '$lib/server/corners/revisions';
import { db } from '$lib/server/db';
import { variantOf } from '$lib/server/db/queries/explorations';
import { requireExploration, requireRevision } from '$lib/server/permissions';
import { movesNote } from '$lib/server/studies/fix-search';
import { AXIS_NAMES } from '$lib/schemas/analysis';
import type { ExploreSpec } from '$lib/server/studies/explore';
import type { RequestEvent } from './$types';

const input = saveVariantInput.extend({ index: z.number({ message: 'must be a whole number' }).int('must be a whole number').min(0, 'must be ≥ 0') });

// Saves one variant as a new revision of the corner, its parent the explored revision, through the one save path.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'edit');
	const body = await parseBody(event, input);
	const variant = await variantOf(db, exploration.id, body.index);
	if (!variant) invalid('index', 'no such variant has been solved in this exploration');
	if (!variant.ok) invalid('index', 'this variant cannot be assembled over the whole travel');
	const { revision, corner, car } = await requireRevision(event, exploration.revisionId, 'edit');
	const moves = movesOf(exploration.spec as unknown as ExploreSpec, body.index);
	const moved = parseWith(cornerGeometrySchema, applyMoves(parseWith(cornerGeometrySchema, revision.geometry), moves));
	const text = movesNote(moves.map((m) => ({ point: m.point, axis: AXIS_NAMES.indexOf(m.axis) as 0 | 1 | 2, move: m.move })), 2);
	const { revision: saved, supersededBy } = await saveRevision({
		car,
		corner,
		userId: event.locals.user!.id,
		geometry: moved,
		label: body.label,
		note: `Design-space exploration, variant ${body.index}: moved ${text}.${body.note.trim() ? `\n\n${body.note.trim()}` : ''}`,
		parentId: revision.id,
		source: 'fix'
	});
	return json({ id: saved.id, number: saved.number, note: saved.note, supersededBy, moves }, { status: 201 });
});
