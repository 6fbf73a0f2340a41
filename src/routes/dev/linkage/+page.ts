// Turns the server's contract samples into LinkageView frames (client-safe, no three here).
import type { Frame } from '$lib/components/linkage-scene';
import type { PageLoad } from './$types';

interface PointSample {
	travel?: number;
	points?: Record<string, [number, number, number]>;
	wheel_centre: [number, number, number];
	contact_patch: [number, number, number];
	fvic: [number, number] | null;
	rc_height: number | null;
}

/** One frame per heave sample that carries solved points. */
function framesOf(samples: PointSample[]): Frame[] {
	return samples.flatMap((s) =>
		s.points
			? [{ position: s.travel ?? 0, points: s.points, wheel_centre: s.wheel_centre, contact_patch: s.contact_patch, fvic: s.fvic, rc_height: s.rc_height }]
			: []
	);
}

export const load: PageLoad = ({ data }) => ({
	...data,
	frames: framesOf(data.shown.samples),
	ghostFrames: data.ghost ? framesOf(data.ghost.samples) : null
});
