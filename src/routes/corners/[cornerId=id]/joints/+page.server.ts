import { kindSpec, ROCKER_POINTS, SPRING_POINTS } from '$lib/kinds';
import { error } from '@sveltejs/kit';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { jointAnglesOf } from '$lib/server/analysis/joint-angles';
import { loadAnalysisPage } from '$lib/server/analysis/page';
import { db } from '$lib/server/db';
import { revisionOfCorner } from '$lib/server/db/queries/corners';
import { DEFAULT_LIMIT_DEG } from '$lib/server/kinematics/joint-angles';
import type { PageServerLoad } from './$types';

// Joint angles: which revision (?revision=, default the newest); the corner's saved limits and axes, and the angles
// through the default sweeps under them (the page asks the API again only when the engineer changes a sweep or axis).
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	const labels = Object.fromEntries([...kindSpec(base.kind).points, ...SPRING_POINTS, ...ROCKER_POINTS].map((p) => [p.name, p.label]));
	const revision = await revisionOfCorner(db, base.corner.id, base.revision.id);
	if (!revision) error(404, { message: 'Revision not found', code: 'not_found' });
	const settings = base.corner.jointSettings ?? {};
	const initial = jointAnglesOf(cornerGeometrySchema.parse(revision.geometry), settings, {});
	return { ...base, labels, settings, initial, defaults: DEFAULT_LIMIT_DEG, steers: kindSpec(base.kind).steers };
};
