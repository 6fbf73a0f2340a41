import { loadAnalysisPage } from '$lib/server/analysis/page';
import type { PageServerLoad } from './$types';

// The fix-search page: which revision to fix (?revision=, default the newest); the target defaults to the baseline.
export const load: PageServerLoad = (event) => loadAnalysisPage(event);
