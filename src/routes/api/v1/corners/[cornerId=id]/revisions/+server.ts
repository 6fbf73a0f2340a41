import { revisionWarnings } from '$lib/server/corners/present';
import { json } from '@sveltejs/kit';
import { REVISION_PAGE_MAX, revisionInput, revisionListQuery } from '$lib/schemas/corner';
import { endpoint, parseBody, parseQuery } from '$lib/server/api';
import { saveRevision } from '$lib/server/corners/revisions';
import { db } from '$lib/server/db';
import { revisionPage, revisionsOfCorner } from '$lib/server/db/queries/corners';
import { requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { corner } = await requireCorner(event, event.params.cornerId, 'view');
	const query = parseQuery(event, revisionListQuery);
	// Without limit (and q) the whole list, as before paging; with limit one page and where the next starts.
	const { rows, total } =
		query.limit === undefined && !query.q && query.offset === 0
			? await revisionsOfCorner(db, corner.id).then((rows) => ({ rows, total: rows.length }))
			: await revisionPage(db, corner.id, { q: query.q, limit: query.limit ?? REVISION_PAGE_MAX, offset: query.offset });
	const next = query.offset + rows.length < total ? query.offset + rows.length : null;
	return json({
		baselineRevisionId: corner.baselineRevisionId,
		total,
		offset: query.offset,
		next,
		revisions: rows.map((r) => ({ ...r, isBaseline: r.id === corner.baselineRevisionId }))
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
