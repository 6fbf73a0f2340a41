// The load shared by the fix-search and tolerance-study pages: the corner, its revisions and the one analysed.
import { joinRocker } from '$lib/kinds';
import { error, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { targetsSchema } from '$lib/schemas/targets';
import { db } from '$lib/server/db';
import { revisionOfCorner, revisionsOfCorner } from '$lib/server/db/queries/corners';
import { can, requireCorner } from '$lib/server/permissions';

/** The revision asked for (?revision=, default the newest) with its points, for a member of the corner's team. */
export async function loadAnalysisPage(event: RequestEvent<{ cornerId: string }>) {
	const { corner, car, role } = await requireCorner(event, event.params.cornerId, 'view');
	const list = await revisionsOfCorner(db, corner.id);
	if (list.length === 0) error(404, { message: 'This corner has no revisions yet', code: 'not_found' });
	const asked = event.url.searchParams.get('revision');
	const chosen = asked && z.string().uuid().safeParse(asked).success ? await revisionOfCorner(db, corner.id, asked) : null;
	if (asked && !chosen) error(404, { message: 'Revision not found', code: 'not_found' });
	const revision = chosen ?? list[0];
	const geometry = (chosen ?? (await revisionOfCorner(db, corner.id, list[0].id)))!.geometry as { points: Record<string, [number, number, number]>; rocker?: Record<string, unknown> | null };
	return {
		car: { id: car.id, name: car.name },
		corner,
		revisions: list.map((r) => ({ id: r.id, number: r.number, label: r.label })),
		revision: { id: revision.id, number: revision.number, label: revision.label },
		points: joinRocker(geometry.points, geometry.rocker),
		kind: revision.kind,
		targets: targetsSchema.catch([]).parse(car.targets),
		canEdit: can(role, 'edit')
	};
}
