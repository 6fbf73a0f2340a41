import { revisionWarnings } from '$lib/server/corners/present';
import { json } from '@sveltejs/kit';
import { revisionInput } from '$lib/schemas/corner';
import { endpoint, parseBody } from '$lib/server/api';
import { saveRevision } from '$lib/server/corners/revisions';
import { db } from '$lib/server/db';
import { revisionsOfCorner } from '$lib/server/db/queries/corners';
import { requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { corner } = await requireCorner(event, event.params.cornerId, 'view');
	const list = await revisionsOfCorner(db, corner.id);
	return json({
		baselineRevisionId: corner.baselineRevisionId,
		revisions: list.map((r) => ({ ...r, isBaseline: r.id === corner.baselineRevisionId }))
	});
});

export const POST = endpoint<RequestEvent>(async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const body = await parseBody(event, revisionInput);
	const { revision, supersededBy } = await saveRevision({
		car,
		corner,
		userId: event.locals.user!.id,
		geometry: body.geometry,
		label: body.label,
		note: body.note,
		parentId: body.parentId,
		source: 'api'
	});
	return json({ id: revision.id, number: revision.number, supersededBy, warnings: revisionWarnings(body.geometry) }, { status: 201 });
});
