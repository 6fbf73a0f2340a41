import { error } from '@sveltejs/kit';
import { kindSpec } from '$lib/kinds';
import { MAP_DEFAULT_RANGES as R } from '$lib/schemas/analysis';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { loadAnalysisPage } from '$lib/server/analysis/page';
import { db } from '$lib/server/db';
import { revisionOfCorner } from '$lib/server/db/queries/corners';
import { motionMap } from '$lib/server/kinematics/maps';
import type { PageServerLoad } from './$types';

// Combined-motion maps: which revision (?revision=, default the newest), and its first map on the default ranges
// (bump steer at lock where the corner steers, else heave × roll); the page asks the API for the others.
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	const steers = kindSpec(base.kind).steers;
	const revision = await revisionOfCorner(db, base.corner.id, base.revision.id);
	if (!revision) error(404, { message: 'Revision not found', code: 'not_found' });
	const geometry = cornerGeometrySchema.parse(revision.geometry);
	const initial = steers ? motionMap(geometry, 'heave_steer', R.heave, R.steer) : motionMap(geometry, 'heave_roll', R.heave, R.roll);
	return { ...base, steers, initial };
};
