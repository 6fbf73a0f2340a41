// Frame: ISO 8855 vehicle axes, x forward, y left, z up; z = 0 ground at design ride height; lengths in mm.
// A ride-height change as a new design position: the body lowered by N mm (change −N) puts every wheel N mm into
// bump against the chassis; the corner is solved there (rack held at straight ahead) and every point, chassis and
// moving alike, is shifted by the change in z so that z = 0 is the ground again. The new design position's figures
// are then those of the old corner's heave sweep at travel −change.

import { CornerSolver, type Sample } from './index';
import type { CornerInput, PointTuple } from './corner';

export class RideHeightError extends Error {}

/**
 * The corner file at a new ride height (change in mm, − = lower), its points under their corner-file names (a
 * rocker's back in its block), and the solved sample of the old corner at that travel.
 */
export function atRideHeight<T extends CornerInput>(corner: T, change: number): { corner: T; sample: Sample } {
	const travel = -change;
	const solver = new CornerSolver(corner);
	const { samples, error } = solver.sweep({ sweep: 'heave', from: Math.min(0, travel), to: Math.max(0, travel), step: Math.max(Math.abs(travel), 1e-9), points: true });
	const sample = samples.find((s) => Math.abs((s.travel ?? 0) - travel) < 1e-9);
	if (error || !sample?.points) throw new RideHeightError(`the corner cannot be assembled at ${travel > 0 ? '+' : ''}${travel} mm of wheel travel${error ? ` (the ${error.link} cannot reach)` : ''}`);
	const shift = (p: PointTuple): PointTuple => [p[0], p[1], p[2] + change];
	const points: Record<string, PointTuple> = {};
	const rocker: Record<string, unknown> | null = corner.rocker ? { ...(corner.rocker as unknown as Record<string, unknown>) } : null;
	for (const [name, p] of Object.entries(sample.points)) {
		if (name.startsWith('rocker.') && rocker) rocker[name.slice(7)] = shift(p);
		else if (name in corner.points) points[name] = shift(p);
	}
	// a point the solve does not carry (none today) keeps its place relative to the chassis
	for (const [name, p] of Object.entries(corner.points)) if (!points[name]) points[name] = shift(p);
	return { corner: { ...corner, points, ...(rocker ? { rocker } : {}) }, sample };
}

/**
 * The body's pitch (degrees, + = nose down) when the front corners change ride height by `front` and the rear by
 * `rear` (mm, − = lower), over the wheelbase (mm): atan((rear − front) / wheelbase).
 */
export function rakeAngle(front: number, rear: number, wheelbase: number): number {
	return (Math.atan((rear - front) / wheelbase) * 180) / Math.PI;
}

/** The wheelbase from the wheel centres' x (mean front − mean rear), or null without both axles or when not positive. */
export function wheelbaseOf(front: readonly (readonly number[])[], rear: readonly (readonly number[])[]): number | null {
	if (!front.length || !rear.length) return null;
	const meanX = (c: readonly (readonly number[])[]) => c.reduce((a, p) => a + p[0], 0) / c.length;
	const wb = meanX(front) - meanX(rear);
	return wb > 0 ? wb : null;
}
