import { kindSpec } from '$lib/kinds';
import { carPackaging } from '$lib/server/analysis/explore';
import { loadAnalysisPage } from '$lib/server/analysis/page';
import { db } from '$lib/server/db';
import { explorationsOfCorner } from '$lib/server/db/queries/explorations';
import type { PageServerLoad } from './$types';

// The design-space exploration page: which revision to explore (?revision=, default the newest) and the corner's
// recent explorations; ?exploration= opens one (its results come from the API).
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	const list = await explorationsOfCorner(db, base.corner.id);
	// the car model's packaging: its keep-out volumes are a constraint of every variant; its steering gives the ratio
	const car = await carPackaging(base.car.id, base.corner.position);
	const packaging = car ? { carRevision: car.carRevision.number, keepOut: car.keepOut.map((v) => v.name), steering: !!car.steering && kindSpec(base.kind).steers } : null;
	return { ...base, explorations: list, packaging };
};
