import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { targetsSchema } from '$lib/schemas/targets';
import { defaultPositions, positionsTextIn, positionsToText } from '$lib/schemas/compare';
import { compareRevisions } from '$lib/server/corners/compare';
import { db } from '$lib/server/db';
import { revisionOfCorner, revisionsOfCorner } from '$lib/server/db/queries/corners';
import { requireCorner } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

const uuid = z.string().uuid();

export const load: PageServerLoad = async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'view');
	const list = await revisionsOfCorner(db, corner.id);
	if (list.length === 0) error(404, { message: 'This corner has no revisions to compare yet', code: 'not_found' });
	const pick = (param: string, fallback: string) => {
		const v = event.url.searchParams.get(param);
		return v && uuid.safeParse(v).success ? v : fallback;
	};
	const aId = pick('a', corner.baselineRevisionId ?? list[list.length - 1].id);
	const bId = pick('b', list[0].id);
	const [a, b] = await Promise.all([revisionOfCorner(db, corner.id, aId), revisionOfCorner(db, corner.id, bId)]);
	if (!a || !b) error(404, { message: 'Revision not found', code: 'not_found' });
	const ga = cornerGeometrySchema.parse(a.geometry);
	const gb = cornerGeometrySchema.parse(b.geometry);
	const targets = targetsSchema.catch([]).parse(car.targets);
	// Chosen travel positions (?at=-50,-25,0,25,50), typed in the user's length unit (?at=-2,-1,0,1,2 in inches);
	// a bad list is named on the page and the defaults are used. The solve gets mm.
	const unit = event.locals.user?.lengthUnit ?? 'mm';
	const atText = event.url.searchParams.get('at');
	const parsed = atText === null ? null : positionsTextIn(unit).safeParse(atText);
	const positions = parsed?.success ? parsed.data : defaultPositions(unit);
	const positionsProblem = parsed && !parsed.success ? parsed.error.issues[0].message : null;
	return {
		car: { id: car.id, name: car.name },
		corner,
		revisions: list.map((r) => ({ id: r.id, number: r.number, label: r.label })),
		a: { id: a.id, number: a.number, label: a.label },
		b: { id: b.id, number: b.number, label: b.label },
		atText: atText ?? positionsToText(defaultPositions(unit), unit),
		positionsProblem,
		result: compareRevisions(ga, gb, targets, positions, unit)
	};
};
