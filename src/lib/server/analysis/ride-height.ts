// The app's side of a ride-height change: request → engine, the figures at design before and after, failures → 400.
import { error } from '@sveltejs/kit';
import type { CornerGeometry } from '$lib/schemas/geometry';
import { solveSweep, type Sample } from '$lib/server/kinematics/index';
import { atRideHeight, RideHeightError } from '$lib/server/kinematics/ride-height';

const FIGURES = ['camber', 'toe', 'caster', 'kpi', 'scrub_radius', 'trail', 'rc_height', 'anti_dive', 'anti_squat', 'motion_ratio'] as const;
export type DesignFigures = Record<(typeof FIGURES)[number], number | null> & { wheel_centre_z: number };

/** The figures a ride-height change moves, from a design sample. */
function figuresOf(s: Sample): DesignFigures {
	const out = { wheel_centre_z: s.wheel_centre[2] } as DesignFigures;
	for (const k of FIGURES) out[k] = s[k];
	return out;
}

/** The corner at a new ride height: its figures at design before and after, and the new corner file. */
export function rideHeightChange(geometry: CornerGeometry, change: number) {
	try {
		const before = solveSweep(geometry, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		const { corner } = atRideHeight(geometry, change);
		const after = solveSweep(corner, { sweep: 'heave', from: 0, to: 0, step: 1 }).samples[0];
		if (!before || !after) throw new RideHeightError('the corner cannot be assembled at design');
		return { change, before: figuresOf(before), after: figuresOf(after), geometry: corner };
	} catch (e) {
		if (e instanceof RideHeightError) error(400, { message: `change: ${e.message}`, code: 'invalid', field: 'change' });
		throw e;
	}
}
