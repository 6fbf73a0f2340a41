import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { revisionJson } from '$lib/server/corners/present';
import { requireRevision } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

export const GET = endpoint<RequestEvent>(async (event) => {
	const { revision, corner } = await requireRevision(event, event.params.revisionId, 'view');
	return json(revisionJson(revision, corner));
});
