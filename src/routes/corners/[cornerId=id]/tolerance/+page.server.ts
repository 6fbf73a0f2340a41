import { loadAnalysisPage } from '$lib/server/analysis/page';
import type { PageServerLoad } from './$types';

// The tolerance-study page of a revision (?revision=, default the newest).
export const load: PageServerLoad = (event) => loadAnalysisPage(event);
