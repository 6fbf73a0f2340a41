// Runs the solver for the app: a corner file and sweep settings in, `corner-solve/1` out.
import { error } from '@sveltejs/kit';
import type { CornerGeometry } from '$lib/schemas/geometry';
import type { SweepQuery } from '$lib/schemas/corner';
import { CornerGeometryError, SweepOptionsError, solveSweep } from '$lib/server/kinematics';

/** The solve output of the contract, plus the error that stopped the sweep (null when complete). */
export function solveCorner(geometry: CornerGeometry, options: Pick<SweepQuery, 'sweep' | 'from' | 'to' | 'step'> & Partial<SweepQuery>) {
	try {
		const result = solveSweep(geometry, options);
		return { format: 'corner-solve/1', sweep: options.sweep, kind: geometry.kind, samples: result.samples, error: result.error };
	} catch (e) {
		if (e instanceof CornerGeometryError) error(400, { message: e.message, code: 'invalid', field: `geometry.${e.field}` });
		if (e instanceof SweepOptionsError) error(400, { message: e.message, code: 'invalid', field: e.message.split(':')[0] });
		throw e;
	}
}
