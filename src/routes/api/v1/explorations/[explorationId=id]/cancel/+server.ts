import { json } from '@sveltejs/kit';
import { explorationView } from '$lib/server/analysis/explore';
import { endpoint } from '$lib/server/api';
import { db } from '$lib/server/db';
import { cancelExploration } from '$lib/server/db/queries/explorations';
import { requireExploration } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Cancels a running exploration: chunks not yet taken are skipped by the workers; what is stored stays.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { exploration } = await requireExploration(event, event.params.explorationId, 'edit');
	await cancelExploration(db, exploration.id);
	const { exploration: now } = await requireExploration(event, exploration.id, 'edit');
	return json(await explorationView(now));
});
