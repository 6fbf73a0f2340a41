import { json } from '@sveltejs/kit';
import { explorationView } from '$lib/server/analysis/explore';
import { endpoint } from '$lib/server/api';
import { requireExploration } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// An exploration's settings and progress (any member of the team).
export const GET = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'view');
	return json(await explorationView(exploration));
});
