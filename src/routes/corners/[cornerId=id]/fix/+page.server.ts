import { kindSpec } from '$lib/kinds';
import { carModelSchema } from '$lib/schemas/car-model';
import { loadAnalysisPage } from '$lib/server/analysis/page';
import { db } from '$lib/server/db';
import { carRevisionOfCar } from '$lib/server/db/queries/car-revisions';
import type { PageServerLoad } from './$types';

// The fix-search page: which revision to fix (?revision=, default the newest); the target defaults to the baseline.
// Packaging comes from the car's newest car revision: its keep-out volumes that apply to this corner's axle (a rim
// only on its own axle) and the axle's steering system.
export const load: PageServerLoad = async (event) => {
	const base = await loadAnalysisPage(event);
	const axle = base.corner.position.startsWith('front') ? ('front' as const) : ('rear' as const);
	const row = await carRevisionOfCar(db, base.car.id, null);
	const model = row ? carModelSchema.safeParse(row.model) : null;
	const packaging =
		row && model?.success
			? {
					carRevision: { id: row.id, number: row.number, label: row.label },
					keepOut: model.data.keep_out.filter((v) => v.shape !== 'rim' || v.axle === axle),
					steering: model.data[axle].steering ?? null
				}
			: null;
	return { ...base, axle, steers: kindSpec(base.kind).steers, packaging };
};
