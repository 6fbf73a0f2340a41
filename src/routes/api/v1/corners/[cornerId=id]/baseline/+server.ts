import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { endpoint, invalid, parseBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { revisionOfCorner, setBaseline } from '$lib/server/db/queries/corners';
import { requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

const body = z.object({ revisionId: z.string().uuid('revisionId must be a revision id').nullable() });

// Marks one revision of the corner as its baseline (or clears it with null).
export const PUT = endpoint<RequestEvent>(async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const { revisionId } = await parseBody(event, body);
	if (revisionId && !(await revisionOfCorner(db, corner.id, revisionId))) invalid('revisionId', 'not a revision of this corner');
	await setBaseline(db, corner.id, revisionId);
	await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'corner.baseline_set', subjectType: 'corner', subjectId: corner.id, detail: { revisionId } });
	return json({ baselineRevisionId: revisionId });
});
