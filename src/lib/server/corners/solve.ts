// Runs the solver for the app: a corner file and sweep settings in, `corner-solve/1` out.
import { error } from '@sveltejs/kit';
import type { CornerGeometry } from '$lib/schemas/geometry';
import type { SampleField, SweepQuery } from '$lib/schemas/corner';
import { CornerGeometryError, SWEEP_VAR, SweepOptionsError, solveSweep, type Sample } from '$lib/server/kinematics';

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

/** solveCorner's answer as the API sends it: cut to `fields` and rounded to `decimals` when asked (see shape). */
export function solveForApi(geometry: CornerGeometry, options: Pick<SweepQuery, 'sweep' | 'from' | 'to' | 'step'> & Partial<SweepQuery>) {
	const out = solveCorner(geometry, options);
	if (!options.fields && options.decimals === undefined) return out;
	return { ...out, samples: shape(out.samples, SWEEP_VAR[options.sweep], options.fields, options.decimals) };
}

/**
 * Samples cut to the sweep variable and the asked quantities (all when `fields` is absent; the solved
 * points stay when they were asked for), every number rounded to `decimals` when given. The live preview
 * asks for the charted quantities to six decimals: a third of the bytes to write, send and read.
 */
export function shape(samples: Sample[], sweepKey: 'travel' | 'roll' | 'rack', fields?: readonly SampleField[], decimals?: number): Record<string, unknown>[] {
	const scale = decimals === undefined ? 0 : 10 ** decimals;
	const round = (v: unknown): unknown => {
		if (!scale) return v;
		if (typeof v === 'number') return Math.round(v * scale) / scale;
		if (Array.isArray(v)) return v.map(round);
		if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, round(x)]));
		return v;
	};
	return samples.map((s) => {
		const row = s as unknown as Record<string, unknown>;
		const keys = fields ? [sweepKey, ...fields, ...('points' in row ? ['points', 'spring_length'] : [])] : Object.keys(row);
		const out: Record<string, unknown> = {};
		for (const k of keys) out[k] = round(row[k]);
		return out;
	});
}
