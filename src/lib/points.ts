// Plain-language descriptions of the pickup points, for the point table and the shop sheet.
import { REQUIRED_POINTS } from './schemas/geometry';

export type Kind = keyof typeof REQUIRED_POINTS;

export interface PointInfo {
	name: string;
	label: string;
	description: string;
	/** where the point sits in the small front-view diagram (0–100 on each axis) */
	diagram: [number, number];
}

const INFO: Record<string, Omit<PointInfo, 'name'>> = {
	'lower.front': { label: 'Lower arm, front pivot', description: 'Chassis bush or joint at the front of the lower wishbone or control arm.', diagram: [28, 78] },
	'lower.rear': { label: 'Lower arm, rear pivot', description: 'Chassis bush or joint at the rear of the lower arm; with the front pivot it defines the arm\'s pivot axis.', diagram: [30, 80] },
	'lower.outer': { label: 'Lower ball joint', description: 'Ball joint of the lower arm on the upright (bottom of the steering axis).', diagram: [74, 80] },
	'upper.front': { label: 'Upper arm, front pivot', description: 'Chassis bush or joint at the front of the upper wishbone.', diagram: [36, 34] },
	'upper.rear': { label: 'Upper arm, rear pivot', description: 'Chassis bush or joint at the rear of the upper wishbone.', diagram: [38, 36] },
	'upper.outer': { label: 'Upper ball joint', description: 'Ball joint of the upper arm on the upright (top of the steering axis).', diagram: [68, 32] },
	'strut.top': { label: 'Strut top mount', description: 'Where the strut meets the chassis; the strut axis slides through it (top of the steering axis).', diagram: [60, 8] },
	'strut.lower': { label: 'Strut axis, lower point', description: 'Any second point on the strut axis, fixed to the upright (for example the strut-to-upright clamp).', diagram: [68, 48] },
	'steer.inner': { label: 'Tie rod, inner joint', description: 'Inner joint of the tie rod on the rack (moves with the rack when steering).', diagram: [30, 64] },
	'steer.outer': { label: 'Tie rod, outer joint', description: 'Outer joint of the tie rod on the steering arm of the upright.', diagram: [70, 64] },
	'wheel.centre': { label: 'Wheel centre', description: 'Centre of the wheel on its spin axis, in the wheel\'s centre plane.', diagram: [84, 56] },
	'wheel.axis_inner': { label: 'Spin axis, inner point', description: 'Any point on the wheel\'s spin axis inboard of the centre; with the centre it sets static camber and toe.', diagram: [76, 56] },
	'spring.chassis': { label: 'Spring, chassis end', description: 'Chassis end of the spring or damper.', diagram: [50, 14] },
	'spring.body': { label: 'Spring, moving end', description: 'Lower end of the spring or damper, on the body named by "spring on" (lower arm, upper arm or upright).', diagram: [56, 72] }
};

export const OPTIONAL_POINTS = ['spring.chassis', 'spring.body'] as const;

/** The point rows of a kind: required points first, then the optional spring ends. */
export function pointsOfKind(kind: Kind): PointInfo[] {
	return [...REQUIRED_POINTS[kind], ...OPTIONAL_POINTS].map((name) => ({ name, ...INFO[name] }));
}
