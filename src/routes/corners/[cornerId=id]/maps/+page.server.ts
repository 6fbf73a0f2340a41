import { kindSpec } from '$lib/kinds';
import { loadAnalysisPage } from '$lib/server/analysis/page';
import type { PageServerLoad } from './$types';

// Combined-motion maps: which revision (?revision=, default the newest).
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	return { ...base, steers: kindSpec(base.kind).steers };
};
