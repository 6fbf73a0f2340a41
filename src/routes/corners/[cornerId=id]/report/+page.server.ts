import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { kindSpec, ROCKER_POINTS, SPRING_POINTS } from '$lib/kinds';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { targetsSchema } from '$lib/schemas/targets';
import { cornerReport } from '$lib/server/corners/report';
import { db } from '$lib/server/db';
import { revisionOfCorner, revisionsOfCorner } from '$lib/server/db/queries/corners';
import { requireCorner } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

const uuid = z.string().uuid();

// The study report: ?b= the revision reported (default the newest), ?a= the one it is set against (default the
// baseline, else the first; the same as b for a report of one revision alone).
export const load: PageServerLoad = async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'view');
	const list = await revisionsOfCorner(db, corner.id);
	if (list.length === 0) error(404, { message: 'This corner has no revisions to report yet', code: 'not_found' });
	const pick = (param: string, fallback: string) => {
		const v = event.url.searchParams.get(param);
		return v && uuid.safeParse(v).success ? v : fallback;
	};
	const bId = pick('b', list[0].id);
	const aId = pick('a', corner.baselineRevisionId ?? list[list.length - 1].id);
	const [a, b] = await Promise.all([revisionOfCorner(db, corner.id, aId), revisionOfCorner(db, corner.id, bId)]);
	if (!a || !b) error(404, { message: 'Revision not found', code: 'not_found' });
	const targets = targetsSchema.catch([]).parse(car.targets);
	const labels = Object.fromEntries([...kindSpec(b.kind).points, ...SPRING_POINTS, ...ROCKER_POINTS].map((p) => [p.name, p.label]));
	const meta = (r: typeof a) => ({ id: r.id, number: r.number, label: r.label, note: r.note, createdAt: r.createdAt, author: list.find((x) => x.id === r.id)?.authorName ?? null });
	return {
		car: { id: car.id, name: car.name },
		corner,
		kindLabel: kindSpec(b.kind).label,
		revisions: list.map((r) => ({ id: r.id, number: r.number, label: r.label })),
		a: meta(a),
		b: meta(b),
		alone: a.id === b.id,
		labels,
		targets,
		report: cornerReport(cornerGeometrySchema.parse(a.geometry), cornerGeometrySchema.parse(b.geometry), targets, corner.jointSettings ?? {}, event.locals.user?.lengthUnit ?? 'mm')
	};
};
