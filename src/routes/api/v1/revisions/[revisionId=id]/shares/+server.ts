import { json } from '@sveltejs/kit';
import { createShareInput } from '$lib/schemas/share';
import { endpoint, parseBody } from '$lib/server/api';
import { requireRevision, requireUser } from '$lib/server/permissions';
import { createShare, listShares } from '$lib/server/sharing/shares';
import type { RequestEvent } from './$types';

// Creates a read-only link to this revision: { expiresInDays?, note?, email? } → 201 { id, url, expiresAt, mail }.
export const POST = endpoint<RequestEvent>(async (event) => {
	const target = await requireRevision(event, event.params.revisionId, 'share');
	const user = requireUser(event);
	const input = await parseBody(event, createShareInput);
	const created = await createShare(event, target, user, input);
	return json(created, { status: 201 });
});

// The revision's links with creation, expiry, last opening and open count (never the token).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { revision } = await requireRevision(event, event.params.revisionId, 'share');
	return json({ shares: await listShares(revision.id) });
});
