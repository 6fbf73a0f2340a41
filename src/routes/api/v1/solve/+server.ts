import { json } from '@sveltejs/kit';
import { solveBody } from '$lib/schemas/corner';
import { endpoint, parseBody } from '$lib/server/api';
import { solveForApi } from '$lib/server/corners/solve';
import { requireUser } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

// Solves an unsaved corner file (the editor's live preview): body { geometry, sweep, from, to, step, rack? }.
export const POST = endpoint<RequestEvent>(async (event) => {
	requireUser(event);
	const { geometry, options } = await parseBody(event, solveBody);
	return json(solveForApi(geometry, options));
});
