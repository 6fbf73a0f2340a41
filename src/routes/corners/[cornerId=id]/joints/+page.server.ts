import { kindSpec, ROCKER_POINTS, SPRING_POINTS } from '$lib/kinds';
import { loadAnalysisPage } from '$lib/server/analysis/page';
import { DEFAULT_LIMIT_DEG } from '$lib/server/kinematics/joint-angles';
import type { PageServerLoad } from './$types';

// Joint angles: which revision (?revision=, default the newest); the corner's saved limits and axes.
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	const labels = Object.fromEntries([...kindSpec(base.kind).points, ...SPRING_POINTS, ...ROCKER_POINTS].map((p) => [p.name, p.label]));
	return { ...base, labels, settings: base.corner.jointSettings ?? {}, defaults: DEFAULT_LIMIT_DEG, steers: kindSpec(base.kind).steers };
};
