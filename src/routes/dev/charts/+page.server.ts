// Dev page for the measure charts: the stock club car front left against the same corner with the rack lowered,
// solved here in heave so the page needs no sign-in or database.
import { error } from '@sveltejs/kit';
import { cornerGeometrySchema, formatIssue } from '$lib/schemas/geometry';
import { solveSweep } from '$lib/server/kinematics';
import stockFile from '../../../../fixtures/club-fwd-front-left.json';
import rackMovedFile from '../../../../fixtures/club-fwd-front-left-rack-moved.json';
import { requireDemoMode } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

const SWEEP = { sweep: 'heave', from: -50, to: 50, step: 1 } as const;

/** Validate a fixture and solve the heave sweep. */
function solve(id: string, file: unknown) {
	const parsed = cornerGeometrySchema.safeParse(file);
	if (!parsed.success) error(500, `fixture ${id}: ${formatIssue(parsed.error)}`);
	const { samples, error: sweepError } = solveSweep(parsed.data, SWEEP);
	return { id, name: parsed.data.name, samples, error: sweepError };
}

export const load: PageServerLoad = () => {
	requireDemoMode();
	return {
	sweep: SWEEP,
	revisions: [solve('stock', stockFile), solve('rack-moved', rackMovedFile)]
	};
};
