// Dev page of the 3-D linkage view: solves fixture corners on the server (no database, no sign-in needed).
import { error } from '@sveltejs/kit';
import { cornerGeometrySchema } from '$lib/schemas/geometry';
import { solveSweep } from '$lib/server/kinematics';
import clubStock from '../../../../fixtures/club-fwd-front-left.json';
import clubRackMoved from '../../../../fixtures/club-fwd-front-left-rack-moved.json';
import roadStrut from '../../../../fixtures/road-strut-front-left.json';
import { requireDemoMode } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

/** The demo corners: the shown revision and an optional ghost to compare with. */
const CORNERS = {
	club: { title: 'Club FWD front left: stock, rack-moved ghosted', shown: clubStock, ghost: clubRackMoved },
	strut: { title: 'Road strut front left', shown: roadStrut, ghost: null }
} as const;

type CornerKey = keyof typeof CORNERS;

/** A fixture solved through heave −50…50 mm by 5 with the point positions. */
function solve(raw: unknown) {
	const corner = cornerGeometrySchema.parse(raw);
	const { samples, error: failure } = solveSweep(corner, { sweep: 'heave', from: -50, to: 50, step: 5, points: true });
	return { kind: corner.kind, loadedRadius: corner.tyre.loaded_radius, samples, failure };
}

export const load: PageServerLoad = ({ url }) => {
	requireDemoMode();
	const key = (url.searchParams.get('corner') ?? 'club') as CornerKey;
	const chosen = CORNERS[key];
	if (!chosen) error(404, 'No such demo corner');
	return {
		key,
		title: chosen.title,
		shown: solve(chosen.shown),
		ghost: chosen.ghost ? solve(chosen.ghost) : null,
		corners: Object.entries(CORNERS).map(([id, c]) => ({ id, title: c.title }))
	};
};
