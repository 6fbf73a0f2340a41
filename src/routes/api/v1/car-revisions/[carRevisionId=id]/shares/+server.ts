import { json } from '@sveltejs/kit';
import { createAxleShareInput } from '$lib/schemas/share';
import { endpoint, parseBody } from '$lib/server/api';
import { requireCarRevision, requireUser } from '$lib/server/permissions';
import { createAxleShare, listAxleShares } from '$lib/server/sharing/axle-sheet';
import type { RequestEvent } from './$types';

// A read-only link to one axle of this car revision: { axle, expiresInDays?, note? } → 201 { id, url, axle, expiresAt }.
export const POST = endpoint<RequestEvent>(async (event) => {
	const target = await requireCarRevision(event, event.params.carRevisionId, 'share');
	const user = requireUser(event);
	const input = await parseBody(event, createAxleShareInput);
	return json(await createAxleShare(event, target, user, input), { status: 201 });
});

// The car revision's axle links with creation, expiry, last opening and open count (never the token).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { carRevision } = await requireCarRevision(event, event.params.carRevisionId, 'share');
	return json({ shares: await listAxleShares(carRevision.id) });
});
