// The current team's audit log (owners only): who did what, when.
import { z } from 'zod';
import { db } from '$lib/server/db';
import { auditOfTeam } from '$lib/server/db/queries/audit';
import { parseWith } from '$lib/server/api';
import { requireTeam } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

const AUDIT_PAGE = 100;
const query = z.object({ before: z.coerce.number().int().positive().optional() });

export const load: PageServerLoad = async (event) => {
	const team = requireTeam(event, 'manage_members');
	const { before } = parseWith(query, Object.fromEntries(event.url.searchParams));
	const events = await auditOfTeam(db, team.id, AUDIT_PAGE + 1, before);
	return { teamName: team.name, events: events.slice(0, AUDIT_PAGE), more: events.length > AUDIT_PAGE ? events[AUDIT_PAGE - 1].id : null };
};
