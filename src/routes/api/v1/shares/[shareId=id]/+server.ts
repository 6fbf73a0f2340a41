import { error } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireShare, requireUser } from '$lib/server/permissions';
import { revokeShare } from '$lib/server/sharing/shares';
import type { RequestEvent } from './$types';

// Revokes a link at once: 204, or 404 when it is unknown, another team's or already revoked.
export const DELETE = endpoint<RequestEvent>(async (event) => {
	const { share } = await requireShare(event, event.params.shareId, 'share');
	if (!(await revokeShare(share, requireUser(event).id))) error(404, { message: 'Share link already revoked', code: 'not_found' });
	return new Response(null, { status: 204 });
});
