import { json } from '@sveltejs/kit';
import { studyInput } from '$lib/schemas/study';
import { endpoint, parseBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { saveStudy, studiesOfCorner } from '$lib/server/db/queries/studies';
import { requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { corner } = await requireCorner(event, event.params.cornerId, 'view');
	return json({ studies: await studiesOfCorner(db, corner.id) });
});

// Saves the workspace settings under a name (the same name replaces them).
export const POST = endpoint<RequestEvent>(async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const { name, settings } = await parseBody(event, studyInput);
	const study = await saveStudy(db, corner.id, event.locals.user!.id, name, settings);
	await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'study.saved', subjectType: 'study', subjectId: study.id, detail: { name } });
	return json(study, { status: 201 });
});
