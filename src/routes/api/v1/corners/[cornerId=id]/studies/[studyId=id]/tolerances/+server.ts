import { json } from '@sveltejs/kit';
import { adoptedTolerancesInput, type AdoptedTolerances } from '$lib/schemas/analysis';
import { endpoint, invalid, parseBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { revisionOfCorner } from '$lib/server/db/queries/corners';
import { setStudyResult, studyOfCorner } from '$lib/server/db/queries/studies';
import { notFound, requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// The tolerances adopted for the shop sheet: results.tolerances of the study (the shop link reads this shape).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { corner } = await requireCorner(event, event.params.cornerId, 'view');
	const study = await studyOfCorner(db, corner.id, event.params.studyId);
	if (!study) notFound('Study not found');
	return json({ tolerances: (study.results as { tolerances?: AdoptedTolerances } | null)?.tolerances ?? null });
});

export const PUT = endpoint<RequestEvent>(async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const input = await parseBody(event, adoptedTolerancesInput);
	if (!(await revisionOfCorner(db, corner.id, input.revisionId))) invalid('revisionId', 'not a revision of this corner');
	const tolerances: AdoptedTolerances = { revisionId: input.revisionId, points: input.points as AdoptedTolerances['points'], updatedAt: new Date().toISOString() };
	const row = await setStudyResult(db, corner.id, event.params.studyId, 'tolerances', tolerances);
	if (!row) notFound('Study not found');
	await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'study.tolerances_adopted', subjectType: 'study', subjectId: row.id, detail: { revisionId: input.revisionId } });
	return json({ studyId: row.id, tolerances });
});
