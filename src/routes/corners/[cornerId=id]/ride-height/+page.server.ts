import { loadAnalysisPage } from '$lib/server/analysis/page';
import type { PageServerLoad } from './$types';

// Ride height as a new design position: which revision (?revision=, default the newest).
export const load: PageServerLoad = (event) => loadAnalysisPage(event);
