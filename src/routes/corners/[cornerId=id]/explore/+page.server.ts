import { loadAnalysisPage } from '$lib/server/analysis/page';
import { db } from '$lib/server/db';
import { explorationsOfCorner } from '$lib/server/db/queries/explorations';
import type { PageServerLoad } from './$types';

// The design-space exploration page: which revision to explore (?revision=, default the newest) and the corner's
// recent explorations; ?exploration= opens one (its results come from the API).
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	const list = await explorationsOfCorner(db, base.corner.id);
	return { ...base, explorations: list };
};
