import { json } from '@sveltejs/kit';
import { fixSearchInput } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { runFixSearch } from '$lib/server/analysis/run';
import { endpoint, invalid, parseBody, parseWith } from '$lib/server/api';
import { db } from '$lib/server/db';
import { revisionOfCorner } from '$lib/server/db/queries/corners';
import { saveStudyResults } from '$lib/server/db/queries/studies';
import { can, requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Fix search on a revision: read-only for any member; storing the result in a study needs edit rights.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { revision, corner, role } = await requireRevision(event, event.params.revisionId, 'view');
	const input = await parseBody(event, fixSearchInput);
	if (input.study && !can(role, 'edit')) await requireRevision(event, revision.id, 'edit');
	const geometry = parseWith(cornerGeometrySchema, revision.geometry);
	let target = null;
	if (input.target.kind === 'revision') {
		const row = await revisionOfCorner(db, corner.id, input.target.revisionId);
		if (!row) invalid('target.revisionId', 'not a revision of this corner');
		target = parseWith(cornerGeometrySchema, row.geometry);
	}
	const result = runFixSearch(geometry, input, target, corner.position.startsWith('front') ? 'front' : 'rear');
	let studyId: string | null = null;
	if (input.study) {
		const { study, ...settings } = input;
		const row = await saveStudyResults(db, corner.id, event.locals.user!.id, study, { sweep: 'heave', ...settings.travel, rack: 0, overlays: [], fix: { revisionId: revision.id, ...settings } }, { fix: { revisionId: revision.id, at: new Date().toISOString(), ...result } });
		studyId = row.id;
	}
	return json({ revisionId: revision.id, studyId, ...result });
});
